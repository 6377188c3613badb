import { describe, expect, it } from 'vitest';
import { laminate, modulusAlong, reducedStiffness, rotateStiffness } from '../../src/analysis/index.js';
import { WOVEN } from './helpers.js';

const deg = (d: number) => (d * Math.PI) / 180;
const gpa = (mpa: number) => mpa / 1000;

describe('classical laminate theory', () => {
  // Kaw, Mechanics of Composite Materials 2nd ed., graphite/epoxy E1 181, E2 10.3, G12 7.17 GPa, ν12 0.28
  // (reference-values.md: Q11 181.8, Q12 2.897, Q22 10.35, Q66 7.17 GPa).
  const kaw = { e1Gpa: 181, e2Gpa: 10.3, g12Gpa: 7.17, nu12: 0.28 };

  it('reduced stiffness Q matches Kaw', () => {
    const q = reducedStiffness(kaw);
    expect(gpa(q[0])).toBeCloseTo(181.8, 1);
    expect(gpa(q[1])).toBeCloseTo(2.897, 2);
    expect(gpa(q[4])).toBeCloseTo(10.35, 2);
    expect(gpa(q[8])).toBeCloseTo(7.17, 3);
  });

  it('Q̄ at 60° matches Kaw Example 2.7 (reference-values.md, recomputed)', () => {
    const qb = rotateStiffness(reducedStiffness(kaw), deg(60));
    const rel = (got: number, want: number) => Math.abs(gpa(got) - want) / want;
    expect(rel(qb[0], 23.65)).toBeLessThan(0.002);
    expect(rel(qb[1], 32.46)).toBeLessThan(0.002);
    expect(rel(qb[2], 20.05)).toBeLessThan(0.002);
    expect(rel(qb[4], 109.4)).toBeLessThan(0.002);
    expect(rel(qb[5], 54.19)).toBeLessThan(0.002);
    expect(rel(qb[8], 36.74)).toBeLessThan(0.002);
    // Ex(60°) 12.42 GPa (Kaw; reference-values.md)
    expect(gpa(modulusAlong(reducedStiffness(kaw), deg(60)))).toBeCloseTo(12.42, 1);
  });

  it('woven 0/90 modulus falls to 17.72 GPa at 45° (reference-values.md [CALC] from the 1/Ex(θ) formula)', () => {
    const q = reducedStiffness({ e1Gpa: 70, e2Gpa: 70, g12Gpa: 5, nu12: 0.1 });
    expect(gpa(modulusAlong(q, 0))).toBeCloseTo(70, 6);
    expect(gpa(modulusAlong(q, deg(15)))).toBeCloseTo(40.3, 1);
    expect(gpa(modulusAlong(q, deg(30)))).toBeCloseTo(21.8, 1);
    expect(gpa(modulusAlong(q, deg(45)))).toBeCloseTo(17.72, 2);
  });

  it('a part whose weave is turned 45° sees the sheet as rotated: D11 of the turned plate equals D at 45° of the straight one', () => {
    const straight = laminate(WOVEN, 3, 0);
    const turned = laminate(WOVEN, 3, deg(45));
    expect(turned.d[0]).toBeCloseTo(rotateStiffness(straight.d, deg(45))[0], 6);
    // Never isotropic: the turned plate is much stiffer in shear than the straight one.
    expect(turned.d[8]).toBeGreaterThan(3 * straight.d[8]);
    // D = Q̄ t³/12 (classical laminate theory, symmetric laminate)
    expect(straight.d[0]).toBeCloseTo((straight.qBar[0] * 27) / 12, 6);
  });

  it('rejects impossible material constants with a clear message', () => {
    expect(() => reducedStiffness({ e1Gpa: 0, e2Gpa: 65, g12Gpa: 4, nu12: 0.07 })).toThrow(/positive/);
    expect(() => laminate(WOVEN, 0, 0)).toThrow(/thickness must be positive/);
  });
});
