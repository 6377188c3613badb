import { describe, expect, it } from 'vitest';
import { armTipDeflection, bodyTwist, laminate, modulusAlong, plateModel, solveStatic, withFixed, type PlateModel } from '../../src/analysis/index.js';
import { fixtureFrame, platePart, rectangle } from './helpers.js';

const NO_POISSON = { name: 'woven-nu0', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0, densityGPerCm3: 1.57 };
const nodesAt = (pm: PlateModel, x: number) => Array.from({ length: pm.mesh.xy.length / 2 }, (_, i) => i).filter((i) => Math.abs(pm.mesh.xy[2 * i] - x) < 1e-9);

describe('static stiffness', () => {
  it('cantilever strip under a tip load: δ = FL³/3EI + FL/κGA (Timoshenko beam; Gere & Timoshenko) within 1 %', () => {
    const [L, b, t, F] = [100, 10, 4, 10];
    const part = platePart(rectangle(L, b), t, NO_POISSON);
    const pm0 = plateModel(part, 2);
    const pm = withFixed(pm0, nodesAt(pm0, 0), [0, 1, 2, 3, 4, 5]);
    const u = solveStatic(pm, [{ nodes: nodesAt(pm0, L), forceN: F }]);
    const tip = nodesAt(pm0, L).reduce((s, n) => s + u[6 * n + 2], 0) / nodesAt(pm0, L).length;
    const lam = laminate(NO_POISSON, t, 0);
    const e = modulusAlong(lam.qBar, 0);
    const bendingPart = (F * L ** 3) / (3 * e * ((b * t ** 3) / 12));
    const shearPart = (F * L) / ((5 / 6) * NO_POISSON.g12Gpa * 1000 * b * t);
    expect(Math.abs(tip / (bendingPart + shearPart) - 1)).toBeLessThan(0.01);
    // Shear is not negligible for woven carbon (E/G ≈ 16): about 0.8 % of the deflection even at L/t = 25.
    expect(shearPart / bendingPart).toBeGreaterThan(0.005);
  });


  it('body twist: doubles with the thrust, and the asymmetric layout twists more', () => {
    const sym = fixtureFrame('symmetric-unibody.yaml');
    const asym = fixtureFrame('asymmetric-unibody.yaml');
    const plate = (f: typeof sym) => f.parts.find((p) => p.role === 'bottom')!;
    const t5 = bodyTwist(plate(sym), sym.sites, 5).twistDeg;
    const t10 = bodyTwist(plate(sym), sym.sites, 10).twistDeg;
    expect(t10 / t5).toBeCloseTo(2, 2); // linear model; the angle itself is an arctangent
    expect(t10).toBeGreaterThan(0);
    expect(bodyTwist(plate(asym), asym.sites, 10).twistDeg).toBeGreaterThan(t10);
  });

  it('a part without root or motor bolt holes cannot give an arm-tip deflection (clear error)', () => {
    expect(() => armTipDeflection(platePart(rectangle(50, 10), 3), 10)).toThrow(/arm-root and motor bolt holes/);
  });
});
