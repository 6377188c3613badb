import { describe, expect, it } from 'vitest';
import {
  bareCantileverFrequencyHz,
  CANTILEVER_LAMBDA,
  cantileverFrequencyHz,
  cantileverTipDeflectionMm,
  cantileverTipMassLambda,
  rayleighFrequencyHz,
  tipMassFrequencyEquation,
} from '../../src/analysis/beam.js';

const workedArm = { lengthMm: 100, widthMm: 12, thicknessMm: 5, modulusGpa: 65, densityGPerCm3: 1.6, tipMassG: 35 };

describe('Euler–Bernoulli cantilever', () => {
  it('bare roots satisfy 1 + cos λ cosh λ = 0 and match Blevins', () => {
    // Blevins, Formulas for Natural Frequency and Mode Shape, cantilever: 1.875104069, 4.694091133
    expect(cantileverTipMassLambda(0)).toBeCloseTo(1.875104069, 9);
    expect(CANTILEVER_LAMBDA[1]).toBeCloseTo(4.694091133, 9);
    for (const l of CANTILEVER_LAMBDA) expect(Math.abs(1 + Math.cos(l) * Math.cosh(l))).toBeLessThan(1e-6 * Math.cosh(l));
    // a tiny tip mass tends to the bare root
    expect(cantileverTipMassLambda(1e-9)).toBeCloseTo(1.875104069, 6);
  });

  it('tip-mass roots match the reference values', () => {
    // reference-values.md (Blevins' tip-mass frequency equation, recomputed): μ = 1, 0.5, 2
    expect(cantileverTipMassLambda(1)).toBeCloseTo(1.247917, 6);
    expect(cantileverTipMassLambda(0.5)).toBeCloseTo(1.419964, 6);
    expect(cantileverTipMassLambda(2)).toBeCloseTo(1.076196, 6);
    expect(Math.abs(tipMassFrequencyEquation(cantileverTipMassLambda(2), 2))).toBeLessThan(1e-9);
  });

  it('worked arm: 128.72 Hz with a 35 g motor, 514.8 Hz bare', () => {
    // reference-values.md worked arm [CALC]: L 100, b 12, t 5 mm, E 65 GPa, ρ 1600 kg/m³, 35 g → 128.72 Hz, bare 514.8 Hz
    expect(cantileverFrequencyHz(workedArm)).toBeCloseTo(128.72, 1);
    expect(bareCantileverFrequencyHz(workedArm)).toBeCloseTo(514.8, 0);
    expect(cantileverFrequencyHz({ ...workedArm, tipMassG: 0 })).toBeCloseTo(514.8, 0);
  });

  it('Rayleigh estimate lies within 1 % of the exact value for a heavy tip', () => {
    // Thomson, Theory of Vibration: Rayleigh with 0.2357 of the beam mass; an upper bound
    const exact = cantileverFrequencyHz(workedArm);
    const r = rayleighFrequencyHz(workedArm);
    expect(r).toBeGreaterThanOrEqual(exact);
    expect(r / exact - 1).toBeLessThan(0.01);
  });

  it('static tip deflection is F L³ / 3EI', () => {
    // Roark / any strength-of-materials text: δ = F L³ / (3 E I); 10 N on the worked arm:
    // I = 12·5³/12 = 125 mm⁴; δ = 10·100³ / (3·65000·125) = 0.41026 mm
    expect(cantileverTipDeflectionMm(workedArm, 10)).toBeCloseTo(0.410256, 5);
  });

  it('rejects impossible beams', () => {
    expect(() => cantileverFrequencyHz({ ...workedArm, lengthMm: 0 })).toThrow(/lengthMm/);
    expect(() => cantileverTipMassLambda(-1)).toThrow(RangeError);
  });
});
