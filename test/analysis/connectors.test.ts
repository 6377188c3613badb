import { describe, expect, it } from 'vitest';
import {
  assemble,
  cholesky,
  choleskySolve,
  lowestEigenpairs,
  rigidBodyModes,
  roundBar,
  type Beam,
  type FeModel,
  type PointMass,
  type RigidGroup,
} from '../../src/analysis/index.js';

/** Aluminium 6061 (ASM handbook values, reference-values.md): E 68.9 GPa, ν 0.33, ρ 2.70 g/cm³. */
const AL = { e: 68.9, nu: 0.33, rho: 2.7 };

/** A straight line of beam elements along x from 0 to L, plus optional extra nodes. */
function beamLine(lengthMm: number, elements: number, section = roundBar(5, AL.e, AL.nu, AL.rho), extra: number[][] = []): { xyz: Float64Array; beams: Beam[]; tip: number } {
  const pts: number[][] = Array.from({ length: elements + 1 }, (_, i) => [(lengthMm * i) / elements, 0, 0]);
  const xyz = Float64Array.from([...pts, ...extra].flat());
  const beams: Beam[] = Array.from({ length: elements }, (_, i) => ({ nodes: [i, i + 1] as const, section }));
  return { xyz, beams, tip: elements };
}

function model(xyz: Float64Array, beams: Beam[], fixedNodes: number[], pointMasses: PointMass[] = [], rigid: RigidGroup[] = []): FeModel {
  const fixed = new Uint8Array(xyz.length * 2);
  for (const n of fixedNodes) fixed.fill(1, 6 * n, 6 * n + 6);
  return { xyz, triangles: new Uint32Array(0), laminates: [], triangleLaminate: new Uint16Array(0), pointMasses, fixed, beams, rigid };
}

const hz = (values: number[]) => values.map((v) => Math.sqrt(v) / (2 * Math.PI));

describe('beam elements against closed forms', () => {
  const d = 5;
  const s = roundBar(d, AL.e, AL.nu, AL.rho);
  const waveHz = (lambda: number, L: number) => ((lambda * lambda) / (2 * Math.PI * L * L)) * Math.sqrt((s.youngMpa * s.i1Mm4) / (s.densityTPerMm3 * s.areaMm2));

  it('cantilever round bar: λ1 1.875104, λ2 4.694091 (Blevins, Formulas for Natural Frequency and Mode Shape, table 8-1) within 0.5 %', () => {
    const L = 150;
    const { xyz, beams } = beamLine(L, 12);
    const a = assemble(model(xyz, beams, [0]));
    const f = hz(lowestEigenpairs(a.k, a.m, 6).values);
    // Two bending planes give each bending frequency twice (a round bar).
    expect(Math.abs(f[0] / waveHz(1.875104069, L) - 1)).toBeLessThan(0.005);
    expect(Math.abs(f[1] / waveHz(1.875104069, L) - 1)).toBeLessThan(0.005);
    expect(Math.abs(f[2] / waveHz(4.694091133, L) - 1)).toBeLessThan(0.005);
  });

  it('free–free round bar: λ1 4.730041 (Blevins table 8-1) within 0.5 %, six rigid-body modes deflated', () => {
    const L = 150;
    const { xyz, beams } = beamLine(L, 12);
    const m = model(xyz, beams, []);
    const a = assemble(m);
    const r = lowestEigenpairs(a.k, a.m, 2, { deflate: rigidBodyModes(m, a) });
    expect(r.deflated).toBe(6);
    for (const f of hz(r.values)) expect(Math.abs(f / waveHz(4.730040745, L) - 1)).toBeLessThan(0.005);
  });

  it('clamped–free shaft in torsion and rod in tension: f = (2n − 1)/(4L)·√(G/ρ), √(E/ρ) (Blevins tables 8-16, 8-17) within 0.5 %', () => {
    const L = 100;
    const { xyz, beams } = beamLine(L, 20);
    const a = assemble(model(xyz, beams, [0]));
    const f = hz(lowestEigenpairs(a.k, a.m, 12).values);
    const torsion = Math.sqrt(s.shearMpa / s.densityTPerMm3) / (4 * L);
    const axial = Math.sqrt(s.youngMpa / s.densityTPerMm3) / (4 * L);
    expect(f.some((x) => Math.abs(x / torsion - 1) < 0.005)).toBe(true);
    expect(f.some((x) => Math.abs(x / axial - 1) < 0.005)).toBe(true);
  });

  it('a short stubby cantilever under a tip load: δ = PL³/3EI + PL/κGA, κ = 6(1+ν)/(7+6ν) (Timoshenko beam; Cowper 1966), to 1e-9', () => {
    const [L, P] = [20, 10];
    const { xyz, beams, tip } = beamLine(L, 1);
    const a = assemble(model(xyz, beams, [0]));
    const f = new Float64Array(a.k.n);
    f[a.eq[6 * tip + 2]] = P;
    const u = choleskySolve(cholesky(a.k), f);
    const expected = (P * L ** 3) / (3 * s.youngMpa * s.i1Mm4) + (P * L) / (((6 * (1 + AL.nu)) / (7 + 6 * AL.nu)) * s.shearMpa * s.areaMm2);
    expect(Math.abs(u[a.eq[6 * tip + 2]] / expected - 1)).toBeLessThan(1e-9);
  });
});

describe('rigid bodies (master–slave elimination) and rotary inertia', () => {
  it('a light cantilever carrying a rigid body offset beyond its tip matches the two-DOF closed form (flexibility of the tip, mass of the body)', () => {
    // Beam nearly massless so only the body counts; tip flexibility of a cantilever (Timoshenko & Gere):
    // [w, θ] = [[L³/3EI, L²/2EI], [L²/2EI, L/EI]] [F, M] (+ shear term PL/κGA on w).
    const [L, e, massT, jCg] = [60, 15, 30e-6, 30e-6 * 50];
    const light = { ...roundBar(4, AL.e, AL.nu, AL.rho), densityTPerMm3: 1e-18 };
    const { xyz, beams, tip } = beamLine(L, 6, light, [[L + e, 0, 0]]);
    const body = tip + 1;
    const m = model(xyz, beams, [0], [{ node: body, massT, inertiaTMm2: [jCg, jCg, jCg, 0, 0, 0] }], [{ master: body, slaves: [tip] }]);
    const a = assemble(m);
    const ours = hz(lowestEigenpairs(a.k, a.m, 1).values)[0];
    const EI = light.youngMpa * light.i1Mm4;
    const shear = L / (light.shearFactor * light.shearMpa * light.areaMm2);
    const flex = [L ** 3 / (3 * EI) + shear, L ** 2 / (2 * EI), L ** 2 / (2 * EI), L / EI];
    const det = flex[0] * flex[3] - flex[1] * flex[2];
    const k = [flex[3] / det, -flex[1] / det, -flex[2] / det, flex[0] / det];
    // Mass of the body about the tip in (w, θ): w_body = w + eθ.
    const mm = [massT, massT * e, massT * e, jCg + massT * e * e];
    // det(K − λM) = 0: a λ² + b λ + c = 0.
    const qa = mm[0] * mm[3] - mm[1] * mm[2];
    const qb = -(k[0] * mm[3] + k[3] * mm[0] - k[1] * mm[2] - k[2] * mm[1]);
    const qc = k[0] * k[3] - k[1] * k[2];
    const lambda1 = (-qb - Math.sqrt(qb * qb - 4 * qa * qc)) / (2 * qa);
    expect(Math.abs(ours / (Math.sqrt(lambda1) / (2 * Math.PI)) - 1)).toBeLessThan(1e-6);
  });

  it('rigid bodies joined through a shared node act as one; a free model keeps six rigid-body modes', () => {
    const { xyz, beams } = beamLine(100, 4, roundBar(5, AL.e, AL.nu, AL.rho), [[50, 20, 0], [50, 20, 10]]);
    const groups: RigidGroup[] = [
      { master: 5, slaves: [2] },
      { master: 6, slaves: [5] },
    ];
    const m = model(xyz, beams, [], [{ node: 6, massT: 5e-6 }], groups);
    const a = assemble(m);
    expect(a.masterOf[2]).toBe(5);
    expect(a.masterOf[6]).toBe(5);
    const r = lowestEigenpairs(a.k, a.m, 3, { deflate: rigidBodyModes(m, a) });
    expect(r.deflated).toBe(6);
    expect(Math.sqrt(r.values[0]) / (2 * Math.PI)).toBeGreaterThan(10);
  });

  it('a node that follows a rigid body cannot also be held (clear error)', () => {
    const { xyz, beams } = beamLine(50, 2);
    expect(() => assemble(model(xyz, beams, [1], [], [{ master: 0, slaves: [1] }]))).toThrow(/follows a rigid body/);
  });
});

describe('springs (soft mounts)', () => {
  it('a mass on a spring from a held node: f = √(k/m) / 2π (single-DOF oscillator; Thomson, Theory of Vibration, ch. 2), to 1e-9', () => {
    const [k, massT] = [12.5, 26e-6];
    const xyz = Float64Array.of(0, 0, 0, 0, 0, 0);
    const m: FeModel = { ...model(xyz, [], [0], [{ node: 1, massT, inertiaTMm2: [1e-6, 1e-6, 1e-6, 0, 0, 0] }]), springs: [{ nodes: [0, 1], stiffnessNPerMm: [k, 2 * k, 3 * k] }] };
    // Node 1's rotations carry inertia but no stiffness: hold them.
    m.fixed.fill(1, 9, 12);
    const a = assemble(m);
    const f = hz(lowestEigenpairs(a.k, a.m, 3).values);
    const expected = [1, 2, 3].map((c) => Math.sqrt((c * k) / massT) / (2 * Math.PI));
    f.forEach((x, i) => expect(Math.abs(x / expected[i] - 1)).toBeLessThan(1e-9));
  });
});

