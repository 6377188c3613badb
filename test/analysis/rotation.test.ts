import { describe, expect, it } from 'vitest';
import { cantileverFrequencyHz, cantileverTipDeflectionMm } from '../../src/analysis/beam.js';
import { fullThrustN, propThrustN, rotationBandFromTipSpeed, rotationHz } from '../../src/analysis/rotation.js';

const IN = 25.4; // international inch, 1959: exactly 25.4 mm

describe("the motors' rotation band", () => {
  it('rotation at a given tip speed is v / (π D): falls as 1/D', () => {
    // circumference π D travels at v: n = v / (π D), hand-computed for 5 in at 200 m/s
    expect(rotationHz(5 * IN, 200)).toBeCloseTo(200 / (Math.PI * 0.127), 9);
    expect(rotationHz(5 * IN, 200)).toBeCloseTo(501.28, 2);
    // 1/D: n(D) · D is the same for every prop; 5 → 7 in scales by 5/7 exactly
    for (const inches of [1, 3, 5, 7, 10, 13]) expect(rotationHz(inches * IN, 230) * inches).toBeCloseTo(rotationHz(IN, 230), 9);
    expect(rotationBandFromTipSpeed(7 * IN).highHz / rotationBandFromTipSpeed(5 * IN).highHz).toBeCloseTo(5 / 7, 12);
    expect(rotationBandFromTipSpeed(7 * IN).lowHz / rotationBandFromTipSpeed(5 * IN).lowHz).toBeCloseTo(5 / 7, 12);
  });

  it("the band's top matches the trade: inside 500–650 Hz at 5 in and 350–450 Hz at 7 in", () => {
    // domain.md, "Resonance in flight" (common practice, no published source)
    const five = rotationBandFromTipSpeed(5 * IN).highHz;
    const seven = rotationBandFromTipSpeed(7 * IN).highHz;
    expect(five).toBeGreaterThanOrEqual(500);
    expect(five).toBeLessThanOrEqual(650);
    expect(seven).toBeGreaterThanOrEqual(350);
    expect(seven).toBeLessThanOrEqual(450);
    // and it reaches down to idle and hover (30 % of the top)
    expect(rotationBandFromTipSpeed(5 * IN).lowHz).toBeCloseTo(0.3 * five, 9);
  });

  it('bad input is refused', () => {
    expect(() => rotationHz(0, 200)).toThrow(RangeError);
    expect(() => rotationHz(127, -1)).toThrow(RangeError);
    expect(() => propThrustN(-5, 100)).toThrow(RangeError);
  });
});

describe('static thrust, T = C_T ρ n² D⁴', () => {
  it('matches the definition by hand and grows as D² at a given tip speed', () => {
    // C_T 0.1, ISA sea level 1.225 kg/m³, 5 in (0.127 m) at 650 rev/s: 0.1 × 1.225 × 650² × 0.127⁴ = 13.46 N
    expect(propThrustN(5 * IN, 650)).toBeCloseTo(0.1 * 1.225 * 650 * 650 * 0.127 ** 4, 9);
    expect(propThrustN(5 * IN, 650)).toBeCloseTo(13.46, 2);
    // n ∝ 1/D at a given tip speed, so T ∝ n² D⁴ ∝ D²
    expect(fullThrustN(7 * IN) / fullThrustN(5 * IN)).toBeCloseTo((7 / 5) ** 2, 9);
  });
  it('is a plausible full thrust: 1.1–1.6 kgf for a 5-inch prop, 2–3 kgf for a 7-inch prop', () => {
    // from memory: static thrust of 5- and 7-inch motor/prop combinations at full throttle (4S to 6S)
    const kgf = (n: number) => n / 9.80665;
    expect(kgf(fullThrustN(5 * IN))).toBeGreaterThan(1.1);
    expect(kgf(fullThrustN(5 * IN))).toBeLessThan(1.6);
    expect(kgf(fullThrustN(7 * IN))).toBeGreaterThan(2);
    expect(kgf(fullThrustN(7 * IN))).toBeLessThan(3);
  });
});

describe('why the size rule keeps f1·D and deflection/length: a frame scaled in every dimension keeps both', () => {
  it('cantilever with tip mass scaled by s (lengths × s, tip mass × s³): f1 × s and δ/L under a D²-thrust stay', () => {
    // Euler–Bernoulli with the tip-mass frequency equation (Blevins): f = λ²/(2πL²)·√(EI/ρA) with
    // μ = M/m unchanged, so f ∝ t/L² ∝ 1/s; δ = F L³ / 3EI with F ∝ s² gives δ ∝ s, δ/L constant.
    const base = { lengthMm: 70, widthMm: 12, thicknessMm: 5, modulusGpa: 65, densityGPerCm3: 1.57, tipMassG: 32 };
    const f0 = cantileverFrequencyHz(base);
    const d0 = cantileverTipDeflectionMm(base, 10) / base.lengthMm;
    for (const s of [0.6, 1.4, 2]) {
      const b = { ...base, lengthMm: base.lengthMm * s, widthMm: base.widthMm * s, thicknessMm: base.thicknessMm * s, tipMassG: base.tipMassG * s ** 3 };
      expect(cantileverFrequencyHz(b) * s).toBeCloseTo(f0, 6);
      expect(cantileverTipDeflectionMm(b, 10 * s * s) / b.lengthMm).toBeCloseTo(d0, 12);
    }
  });
});
