import { describe, expect, it } from 'vitest';
import { ISO_4762_M3X8 } from '../helpers/screws.js';
import {
  addBodies,
  centreOfMass,
  cylinderBody,
  cylinderOfMass,
  hardwareList,
  hexPrismBody,
  inertiaAboutCentre,
  loopMoments,
  massBalance,
  pitchDiameterMm,
  placeBody,
  plateMassBody,
  poseOf,
  spacerBody,
  sumMoments,
  FRAME_AXES,
} from '../../src/assembly/index.js';
import { circle, partMassG, roundedRect, type Part } from '../../src/geometry/index.js';
import { DEMO_FILES, demoDesign, designWith } from '../helpers/demo.js';
import { validateDesign } from '../../src/params/index.js';
import { buildFrame } from '../../src/geometry/index.js';
import { buildAssembly } from '../../src/assembly/index.js';

const material = { name: 'test', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.6 };

function plate(outline: Part['outline'], holes: Part['outline'][], t: number): Part {
  return { name: 'p', role: 'imported', quantity: 1, thicknessMm: t, material, weaveRad: 0, outline, features: holes.map((loop) => ({ loop, kind: 'hole', purpose: 'lightening' })), members: [], placements: [], sourcePath: 'test' };
}

describe('area moments by Green’s theorem against closed forms', () => {
  it('a disc of radius 10 at (3, −4): A = πr², centroid, ∫x² = πr⁴/4 + A cx²', () => {
    const m = loopMoments(circle([3, -4], 10));
    const A = Math.PI * 100;
    expect(m.a).toBeCloseTo(A, 9);
    expect(m.sx / m.a).toBeCloseTo(3, 9);
    expect(m.sy / m.a).toBeCloseTo(-4, 9);
    expect(m.sxx).toBeCloseTo((Math.PI * 1e4) / 4 + A * 9, 6);
    expect(m.syy).toBeCloseTo((Math.PI * 1e4) / 4 + A * 16, 6);
    expect(m.sxy).toBeCloseTo(A * 3 * -4, 6);
  });

  it('a rounded rectangle 60 × 40, r 6: A = bh − (4 − π) r²; a clockwise hole subtracts', () => {
    const outer = loopMoments(roundedRect([0, 0], 60, 40, 6));
    expect(outer.a).toBeCloseTo(60 * 40 - (4 - Math.PI) * 36, 9);
    // Second moment of the sharp rectangle bh³/12 less the four corner pieces, each (1 − π/4) r²
    // at the corner-piece centroid distance; checked here by symmetry: ∫xy = 0, first moments 0.
    expect(outer.sx).toBeCloseTo(0, 9);
    expect(outer.sxy).toBeCloseTo(0, 6);
    const hole = loopMoments(circle([10, 0], 5, false));
    const both = sumMoments([outer, hole]);
    expect(both.a).toBeCloseTo(outer.a - Math.PI * 25, 9);
    expect(both.sx / both.a).toBeCloseTo((0 - Math.PI * 25 * 10) / both.a, 9);
  });
});

describe('masses and centres of gravity of simple assemblies, by hand', () => {
  it('a 100 × 50 × 2 mm plate at z 10 and a 20 g motor cylinder (Ø28 × 20) at (40, 0) on it', () => {
    // Plate: 100 × 50 × 2 mm × 1.6 g/cm³ = 16 g, centre (0, 0, 11). Motor: 20 g, centre (40, 0, 22).
    // CG = (20·40 / 36, 0, (16·11 + 20·22) / 36) = (22.2222, 0, 17.1111).
    const p = plate(roundedRect([0, 0], 100, 50, 0), [], 2);
    const body = plateMassBody(p, poseOf({ rotateRad: 0, translateMm: [0, 0], mirrorY: false, zMm: 10 }));
    expect(body.massG).toBeCloseTo(16, 9);
    const motor = placeBody(cylinderOfMass(28, 20, 20), [40, 0, 12], FRAME_AXES);
    const all = addBodies([body, motor]);
    expect(all.massG).toBeCloseTo(36, 9);
    const cg = centreOfMass(all);
    expect(cg[0]).toBeCloseTo(800 / 36, 9);
    expect(cg[1]).toBeCloseTo(0, 9);
    expect(cg[2]).toBeCloseTo((16 * 11 + 20 * 22) / 36, 9);
    // Inertia about the CG, by hand: plate Izz = m(a² + b²)/12 + m d², motor Izz = m r²/2 + m d².
    const I = inertiaAboutCentre(all);
    const dPlate = 800 / 36;
    const dMotor = 40 - 800 / 36;
    const izz = (16 * (100 ** 2 + 50 ** 2)) / 12 + 16 * dPlate ** 2 + (20 * 14 ** 2) / 2 + 20 * dMotor ** 2;
    expect(I[8]).toBeCloseTo(izz, 6);
    // Ixx: plate m(b² + t²)/12 + m dz², motor m(3r² + h²)/12 + m dz².
    const zc = (16 * 11 + 20 * 22) / 36;
    const ixx = (16 * (50 ** 2 + 2 ** 2)) / 12 + 16 * (11 - zc) ** 2 + (20 * (3 * 14 ** 2 + 20 ** 2)) / 12 + 20 * (22 - zc) ** 2;
    expect(I[0]).toBeCloseTo(ixx, 6);
    // Ixz = −Σ m dx dz (products of inertia have the minus sign in the tensor).
    const ixz = -(16 * (0 - dPlate) * (11 - zc) + 20 * dMotor * (22 - zc));
    expect(I[2]).toBeCloseTo(ixz, 6);
  });

  it('a plate turned 30° and mirrored keeps its mass; its centre follows the placement', () => {
    const p = plate(roundedRect([20, 5], 30, 10, 2), [circle([25, 5], 2, false)], 3);
    const placed = plateMassBody(p, poseOf({ rotateRad: Math.PI / 6, translateMm: [7, -3], mirrorY: true, zMm: -5 }));
    expect(placed.massG).toBeCloseTo(partMassG(p), 9);
    const own = loopMoments(p.outline);
    const hole = loopMoments(p.features[0].loop);
    const cx = (own.sx + hole.sx) / (own.a + hole.a);
    const cy = (own.sy + hole.sy) / (own.a + hole.a);
    // Mirror y, turn 30°, move: the centroid goes where the placement sends a point.
    const c = Math.cos(Math.PI / 6);
    const s = Math.sin(Math.PI / 6);
    const cg = centreOfMass(placed);
    expect(cg[0]).toBeCloseTo(c * cx + s * cy + 7, 9);
    expect(cg[1]).toBeCloseTo(s * cx - c * cy - 3, 9);
    expect(cg[2]).toBeCloseTo(-5 + 1.5, 9);
  });

  it('a 25 mm M3 hex standoff, 5 mm across flats, 7075 (2.81 g/cm³), tapped through 2.5 mm: 1.1761 g', () => {
    // (√3/2 · 5² − π · 1.25²) · 25 mm³ · 2.81e-3 g/mm³ = (21.6506 − 4.9087) · 25 · 2.81e-3 = 1.17613 g.
    const m = spacerBody({ shape: 'hex', acrossFlatsMm: 5, lengthMm: 25, densityGPerCm3: 2.81, screw: 'M3' }).massG;
    expect(m).toBeCloseTo(((Math.sqrt(3) / 2) * 25 - Math.PI * 1.25 ** 2) * 25 * 2.81e-3, 9);
    expect(m).toBeCloseTo(1.1761, 4);
    // Second moment of a regular hexagon about a centroidal axis: 5√3 a⁴ / 16 with side a = s/√3.
    const hex = hexPrismBody(5, 1, 1);
    const a = 5 / Math.sqrt(3);
    expect(hex.secondGMm2[0]).toBeCloseTo((5 * Math.sqrt(3) * a ** 4) / 16, 9);
  });
});

describe('mass and balance of the demo designs', () => {
  for (const file of DEMO_FILES) {
    it(`${file}: frame mass is Σ part mass × quantity, motors and components add their stated masses, CG on the centre line`, () => {
      const d = demoDesign(file);
      const frame = buildFrame(d);
      const a = buildAssembly(d, frame);
      const mb = massBalance(a);
      // partMassG integrates the area by the exact closed form (Green's theorem terms), our
      // moments by quadrature: two routes to the same area.
      expect(mb.massG.frame).toBeCloseTo(frame.parts.reduce((s, p) => s + partMassG(p) * p.quantity, 0), 6);
      expect(mb.massG.motors).toBeCloseTo(4 * d.motorMassG, 9);
      expect(mb.massG.components + mb.massG.battery).toBeCloseTo(d.components.reduce((s, c) => s + c.massG, 0), 9);
      expect(mb.massG.allUp).toBeCloseTo(mb.massG.frame + mb.massG.hardware + mb.massG.motors + mb.massG.components + mb.massG.battery, 9);
      // Every demo is mirror-symmetric about x–z, so the CG lies on y = 0 and the thrust centre at the origin.
      expect(mb.cgMm[1]).toBeCloseTo(0, 6);
      expect(mb.thrustCentreMm[0]).toBeCloseTo(0, 9);
      expect(mb.cgOffsetMm).toBeCloseTo(Math.abs(mb.cgMm[0] - mb.thrustCentreMm[0]), 6);
      // The inertia tensor is symmetric and positive definite (its diagonal obeys the triangle inequality).
      const I = mb.inertiaGMm2;
      expect(I[1]).toBeCloseTo(I[3], 6);
      expect(I[0] + I[4]).toBeGreaterThanOrEqual(I[8]);
      // Hardware: every screw, nut and standoff of the hardware list is in the hardware mass.
      expect(hardwareList(a, d).items.length).toBeGreaterThan(0);
      expect(mb.massG.hardware).toBeGreaterThan(0);
    });
  }
});

describe('fastener mass per joint (BoltedJoint.hardwareMass)', () => {
  it('a Tessel 5 motor screw, ISO 4762 M3 × 8 of 7.9 g/cm³, by hand: 0.8542 g with its centre 0.8437 mm above the head', () => {
    const d = demoDesign('tessel-5.yaml');
    const a = buildAssembly(d, buildFrame(d));
    const j = a.joints.find((x) => x.id === 'motor front-right 1')!;
    expect([j.headStandard, j.screw, j.screwLengthMm, j.nut]).toEqual(['ISO 4762', 'M3', 8, null]);
    // Weighed by hand from ISO 4762 and ISO 724 (test/helpers/screws.ts).
    const { head, socket, shank, massG } = ISO_4762_M3X8;
    expect(j.hardwareMass.massG).toBeCloseTo(massG, 3);
    expect(massG).toBeCloseTo(0.8542, 4);
    // Centre along the axis from the head's bearing face: head at −1.5, socket at −2.25, shank at +4.
    const along = (head * -1.5 - socket * -2.25 + shank * 4) / (head - socket + shank);
    const c = centreOfMass(j.hardwareMass);
    expect(c[0]).toBeCloseTo(j.headAtMm[0], 9);
    expect(c[1]).toBeCloseTo(j.headAtMm[1], 9);
    expect(c[2] - j.headAtMm[2]).toBeCloseTo(along, 3);
  });

  for (const file of DEMO_FILES) {
    it(`${file}: the joints' fasteners and the standoffs and spacers make up the hardware mass`, () => {
      const d = demoDesign(file);
      const a = buildAssembly(d, buildFrame(d));
      const spacers = [...a.standoffs, ...a.cameraSpacers].reduce((s, so) => s + so.massG, 0);
      expect(a.joints.reduce((s, j) => s + j.hardwareMass.massG, 0) + spacers).toBeCloseTo(massBalance(a).massG.hardware, 9);
      for (const j of a.joints) expect(j.hardwareMass.massG, j.id).toBeGreaterThan(0);
    });
  }

  it('a male–female standoff has no screw to weigh: its joint weighs its nut and washer (hex prism less the pitch-diameter bore, ISO 7089 annulus)', () => {
    const d = validateDesign(designWith('tessel-5.yaml', { body: { standoffs: { ends: 'male-female' } }, assembly: { washers: true } }));
    const a = buildAssembly(d, buildFrame(d));
    const studs = a.joints.filter((j) => j.stud);
    expect(studs).toHaveLength(4);
    const rho = d.assembly.screwDensityGPerCm3 / 1000;
    for (const j of studs) {
      const nut = hexPrismBody(j.nut!.acrossFlatsMm, j.nut!.heightMm, rho, pitchDiameterMm(j.screw)).massG;
      const washer = cylinderBody(j.washer!.outerMm, j.washer!.thicknessMm, rho, j.washer!.innerMm).massG;
      expect(j.hardwareMass.massG).toBeCloseTo(nut + washer, 9);
    }
  });
});

describe('washers (assembly.washers)', () => {
  it('an ISO 7089 M3 washer under every nut: 12 on Tessel 5, each π/4 (7² − 3.2²) × 0.5 mm × 7.9 g/cm³ = 0.120246 g', () => {
    const plain = demoDesign('tessel-5.yaml');
    const withWashers = validateDesign(designWith('tessel-5.yaml', { assembly: { washers: true } }));
    const a0 = buildAssembly(plain, buildFrame(plain));
    const a1 = buildAssembly(withWashers, buildFrame(withWashers));
    const washers = hardwareList(a1, withWashers).items.filter((i) => i.item === 'plain washer');
    expect(washers.map((w) => [w.use, w.count, w.standard])).toEqual([['arm root clamp', 8, 'ISO 7089'], ['stack mount', 4, 'ISO 7089']]);
    // Screw lengths do not change here (14.5 → 16 and 19.5 → 20 mm), so the hardware differs by the washers alone.
    const one = (Math.PI / 4) * (7 ** 2 - 3.2 ** 2) * 0.5 * 7.9e-3;
    expect(one).toBeCloseTo(0.120246, 6);
    expect(massBalance(a1).massG.hardware - massBalance(a0).massG.hardware).toBeCloseTo(12 * one, 9);
    // The nut sits on the washer: 0.5 mm further from the plates.
    const j0 = a0.joints.find((j) => j.id === 'arm-root 1')!;
    const j1 = a1.joints.find((j) => j.id === 'arm-root 1')!;
    expect(j1.nutAtMm![2] - j0.nutAtMm![2]).toBeCloseTo(0.5, 12);
  });
});
