import { describe, expect, it } from 'vitest';
import type { Material } from '../../src/geometry/part.js';
import { compliance, engineeringConstants, exAt, heywoodKtn, lekhnitskiiKt, rotatedCompliance } from '../../src/checks/laminate.js';
import { WOVEN_70 } from './parts.js';

const deg = (d: number): number => (d * Math.PI) / 180;

/** Kaw, Mechanics of Composite Materials 2nd ed., graphite/epoxy (reference-values.md). */
const KAW_GR_EP: Material = { name: 'graphite/epoxy', e1Gpa: 181, e2Gpa: 10.3, g12Gpa: 7.17, nu12: 0.28, densityGPerCm3: 1.6 };

describe('classical laminate theory', () => {
  it('woven 0/90 Ex(θ): the [CALC] check values of reference-values.md', () => {
    // reference-values.md, woven E1 = E2 70, G12 5 GPa, ν12 0.10: 70.0, 40.3, 21.8, 17.72 GPa.
    expect(exAt(WOVEN_70, 0)).toBeCloseTo(70.0, 6);
    expect(exAt(WOVEN_70, deg(15))).toBeCloseTo(40.3, 1);
    expect(exAt(WOVEN_70, deg(30))).toBeCloseTo(21.8, 1);
    expect(exAt(WOVEN_70, deg(45))).toBeCloseTo(17.72, 2);
    const c45 = engineeringConstants(WOVEN_70, deg(45));
    expect(c45.nuxy).toBeCloseTo(0.772, 3);
    expect(c45.gxyGpa).toBeCloseTo(31.8, 1);
    // A balanced weave repeats every 90°.
    expect(exAt(WOVEN_70, deg(120))).toBeCloseTo(exAt(WOVEN_70, deg(30)), 9);
  });

  it("Kaw's graphite/epoxy: compliances and Ex(60°) 12.42 GPa", () => {
    // Kaw ch. 2 (reference-values.md): S11 5.525e-12, S12 −1.547e-12, S22 97.09e-12, S66 139.5e-12 1/Pa.
    const S = compliance(KAW_GR_EP); // 1/GPa = 1e-9 1/Pa
    expect(S.s11 * 1e-9).toBeCloseTo(5.525e-12, 15);
    expect(S.s12 * 1e-9).toBeCloseTo(-1.547e-12, 15);
    expect(S.s22 * 1e-9 * 1e12).toBeCloseTo(97.09, 2);
    expect(S.s66 * 1e-9 * 1e12).toBeCloseTo(139.5, 1);
    expect(exAt(KAW_GR_EP, deg(60))).toBeCloseTo(12.42, 2);
    // The transformed compliance at 0° is the on-axis one.
    const S0 = rotatedCompliance(KAW_GR_EP, 0);
    expect(S0.s11).toBeCloseTo(S.s11, 15);
    expect(S0.s16).toBeCloseTo(0, 15);
  });
});

describe('stress concentration at a hole', () => {
  it('Lekhnitskii orthotropic Kt: the [CALC] check values', () => {
    // Isotropic: G = E / 2(1 + ν) → Kt = 3 (Kirsch; Timoshenko & Goodier).
    const iso: Material = { name: 'iso', e1Gpa: 70, e2Gpa: 70, g12Gpa: 70 / (2 * 1.3), nu12: 0.3, densityGPerCm3: 2.7 };
    expect(lekhnitskiiKt(iso, 0)).toBeCloseTo(3.0, 9);
    expect(lekhnitskiiKt(iso, deg(37))).toBeCloseTo(3.0, 9);
    // Unidirectional graphite/epoxy (Kaw's constants) along the fibres: 6.750.
    expect(lekhnitskiiKt(KAW_GR_EP, 0)).toBeCloseTo(6.75, 3);
    // Woven 70/70/5, ν 0.10: 4.975 along the weave, 2.006 at 45°.
    expect(lekhnitskiiKt(WOVEN_70, 0)).toBeCloseTo(4.975, 3);
    expect(lekhnitskiiKt(WOVEN_70, deg(45))).toBeCloseTo(2.006, 3);
  });

  it('Heywood net-section factor: d/W 0.25 → 2.4219, within 0.001 of Roark Table 17.1', () => {
    // Heywood in Peterson's Stress Concentration Factors: Ktn = 2 + (1 − d/W)³.
    expect(heywoodKtn(3, 12)).toBeCloseTo(2.421875, 9);
    // Roark 7th ed. Table 17.1 polynomial, an independent fit of the same case: 2.4223 at d/W 0.25.
    const roark = (r: number): number => 3 - 3.13 * r + 3.66 * r ** 2 - 1.53 * r ** 3;
    expect(Math.abs(heywoodKtn(0.25, 1) - roark(0.25))).toBeLessThan(0.001);
    // The two fits stay within 2 % of each other over d/W 0 to 0.5 (recomputed here: worst 1.6 % at 0.5).
    for (const r of [0, 0.1, 0.2, 0.3, 0.4, 0.5]) expect(Math.abs(heywoodKtn(r, 1) - roark(r)) / roark(r)).toBeLessThan(0.02);
    expect(() => heywoodKtn(5, 4)).toThrow(RangeError);
  });
});
