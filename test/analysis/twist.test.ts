import { describe, expect, it } from 'vitest';
import { rootLoadedBodyTwist } from '../../src/analysis/statics.js';
import { circle, roundedRect, type MotorSite, type Part } from '../../src/geometry/index.js';

/** A plain strip with one "arm-root" bolt hole near each corner, arms pointing sideways. */
function strip(lengthMm: number, widthMm: number, t: number, boltX: number, boltY: number): { part: Part; sites: MotorSite[] } {
  const hole = (x: number, y: number) => ({ loop: circle([x, y], 1.7, false), kind: 'hole' as const, purpose: 'arm-root-bolt' as const, centerMm: [x, y] as const, diameterMm: 3.4 });
  const part: Part = {
    name: 'strip',
    role: 'bottom',
    quantity: 1,
    thicknessMm: t,
    material: { name: 'woven', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 },
    weaveRad: 0,
    outline: roundedRect([0, 0], lengthMm, widthMm, 0),
    features: [hole(boltX, boltY), hole(boltX, -boltY), hole(-boltX, boltY), hole(-boltX, -boltY)],
    members: [],
    placements: [],
    sourcePath: 'test',
  };
  const site = (front: boolean, left: boolean): MotorSite => ({
    id: `${front ? 'front' : 'rear'}-${left ? 'left' : 'right'}`,
    front,
    left,
    motorMm: [front ? boltX : -boltX, left ? boltY + 60 : -boltY - 60],
    armDirRad: left ? Math.PI / 2 : -Math.PI / 2,
    armLineOriginMm: [front ? boltX : -boltX, 0],
    motorAlongMm: boltY + 60,
  });
  return { part, sites: [site(true, false), site(true, true), site(false, true), site(false, false)] };
}

describe('bottom-plate twist under opposite thrusts', () => {
  it('a long strip twisted by one bolt force per corner follows Saint-Venant torsion θ = T L / (G k b t³)', () => {
    // Torsion of a thin rectangle (Timoshenko & Goodier; Roark): J = k b t³ with
    // k = 1/3 − 0.21 (t/b)(1 − (t/b)⁴/12) (reference-values.md). With one bolt per arm the bolt takes
    // the thrust F alone; the pairs ±F at y = ±15 make a torque T = F · 30 mm, the same over the
    // 140 mm between the pairs. G = G12 = 4 GPa along the weave.
    const F = 10;
    const { part, sites } = strip(160, 40, 2.5, 70, 15);
    const r = rootLoadedBodyTwist(part, sites, F, 1.5);
    const b = 40;
    const t = 2.5;
    const k = 1 / 3 - 0.21 * (t / b) * (1 - (t / b) ** 4 / 12);
    const T = F * 30;
    const thetaDeg = ((T * 140) / (4000 * k * b * t ** 3)) * (180 / Math.PI);
    // sign: front-left up and front-right down rolls the front to the right; the rear the other way
    expect(Math.abs(r.twistDeg)).toBeGreaterThan(0);
    // point loads at bolt holes and free ends add local flexibility: within 10 %
    console.log(`strip twist: framewright ${r.twistDeg.toFixed(3)}°, Saint-Venant ${thetaDeg.toFixed(3)}°`);
    expect(Math.abs(Math.abs(r.twistDeg) - thetaDeg) / thetaDeg).toBeLessThan(0.1);
  });

  it('is linear in the thrust and changes sign with it (a linear static solve; roll read through atan)', () => {
    const { part, sites } = strip(160, 40, 2.5, 70, 15);
    const a = rootLoadedBodyTwist(part, sites, 1, 2);
    const b = rootLoadedBodyTwist(part, sites, -2, 2);
    expect(b.twistDeg / a.twistDeg).toBeCloseTo(-2, 4);
  });
});
