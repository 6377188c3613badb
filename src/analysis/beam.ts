/**
 * Euler–Bernoulli cantilever formulas for a uniform beam of rectangular section, clamped at one end,
 * optionally carrying a point mass at the free end (a motor on an arm). Out-of-plane bending of a
 * flat plate: the bending depth is the plate thickness, so I = b·t³/12.
 *
 * Sources: Blevins, Formulas for Natural Frequency and Mode Shape (cantilever λ values, tip-mass
 * frequency equation); Thomson, Theory of Vibration, App. D (Rayleigh estimate). Units at the
 * interface: mm, GPa, g/cm³, g, N, Hz.
 */

/** Roots λ_n of 1 + cos λ cosh λ = 0: bare cantilever modes 1–3 (Blevins). */
export const CANTILEVER_LAMBDA = [1.875104069, 4.694091133, 7.854757438] as const;

/** A uniform rectangular cantilever; lengths mm, modulus GPa, density g/cm³, tip mass g. */
export type CantileverBeam = Readonly<{
  lengthMm: number;
  widthMm: number;
  thicknessMm: number;
  modulusGpa: number;
  densityGPerCm3: number;
  /** Point mass at the free end (0 for a bare beam). g. */
  tipMassG: number;
}>;

/** Second moment of area of the rectangle about its bending axis, b·t³/12. mm⁴. */
export const sectionSecondMomentMm4 = (widthMm: number, thicknessMm: number): number => (widthMm * thicknessMm ** 3) / 12;

/** Mass of the beam itself (without the tip mass). g. */
export const beamMassG = (b: CantileverBeam): number => (b.lengthMm * b.widthMm * b.thicknessMm * b.densityGPerCm3) / 1000;

/**
 * Left side of the tip-mass frequency equation, `1 + cos λ cosh λ + μλ(cos λ sinh λ − sin λ cosh λ)`,
 * with μ = tip mass / beam mass.
 */
export function tipMassFrequencyEquation(lambda: number, massRatio: number): number {
  const c = Math.cos(lambda);
  const s = Math.sin(lambda);
  const ch = Math.cosh(lambda);
  const sh = Math.sinh(lambda);
  return 1 + c * ch + massRatio * lambda * (c * sh - s * ch);
}

/**
 * First root λ1 of the tip-mass frequency equation for mass ratio μ = M / m (tip mass over beam mass).
 * μ = 0 gives the bare cantilever's 1.875104069. The root is bracketed in (0, 1.875104069]: the
 * equation is +2 at λ → 0 and changes sign no later than the bare root. Throws RangeError for a
 * negative or non-finite μ.
 * @example cantileverTipMassLambda(1) // ≈ 1.247917 (Blevins)
 */
export function cantileverTipMassLambda(massRatio: number): number {
  if (!Number.isFinite(massRatio) || massRatio < 0) throw new RangeError(`tip-mass ratio must be a finite number ≥ 0, got ${massRatio}`);
  if (massRatio === 0) return CANTILEVER_LAMBDA[0];
  let lo = 1e-9;
  let hi = CANTILEVER_LAMBDA[0] + 1e-9;
  // Bisection: robust, and 80 halvings take the bracket below 1e-15.
  for (let i = 0; i < 80; i++) {
    const mid = (lo + hi) / 2;
    if (tipMassFrequencyEquation(mid, massRatio) > 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

function checkBeam(b: CantileverBeam): void {
  const positive: Array<[string, number]> = [
    ['lengthMm', b.lengthMm],
    ['widthMm', b.widthMm],
    ['thicknessMm', b.thicknessMm],
    ['modulusGpa', b.modulusGpa],
    ['densityGPerCm3', b.densityGPerCm3],
  ];
  for (const [name, v] of positive) {
    if (!Number.isFinite(v) || v <= 0) throw new RangeError(`cantilever ${name} must be a positive number, got ${v}`);
  }
  if (!Number.isFinite(b.tipMassG) || b.tipMassG < 0) throw new RangeError(`cantilever tipMassG must be ≥ 0, got ${b.tipMassG}`);
}

/** √(EI / ρA) in SI units (m²/s), the beam's bending wave constant. */
function waveConstant(b: CantileverBeam): number {
  const E = b.modulusGpa * 1e9;
  const I = sectionSecondMomentMm4(b.widthMm, b.thicknessMm) * 1e-12;
  const rhoA = b.densityGPerCm3 * 1000 * b.widthMm * b.thicknessMm * 1e-6;
  return Math.sqrt((E * I) / rhoA);
}

/**
 * First bending frequency of the cantilever with its tip mass, from the exact frequency equation:
 * `f1 = λ1² / (2π L²) · √(EI / ρA)`. Hz. Throws RangeError for non-positive dimensions.
 * @example cantileverFrequencyHz({ lengthMm: 100, widthMm: 12, thicknessMm: 5, modulusGpa: 65, densityGPerCm3: 1.6, tipMassG: 35 }) // ≈ 128.72
 */
export function cantileverFrequencyHz(b: CantileverBeam): number {
  checkBeam(b);
  const lambda = cantileverTipMassLambda(b.tipMassG / beamMassG(b));
  const L = b.lengthMm * 1e-3;
  return ((lambda * lambda) / (2 * Math.PI * L * L)) * waveConstant(b);
}

/** Bending frequency of mode n (1–3) of the bare cantilever, ignoring any tip mass. Hz. */
export function bareCantileverFrequencyHz(b: CantileverBeam, mode: 1 | 2 | 3 = 1): number {
  checkBeam(b);
  const lambda = CANTILEVER_LAMBDA[mode - 1];
  const L = b.lengthMm * 1e-3;
  return ((lambda * lambda) / (2 * Math.PI * L * L)) * waveConstant(b);
}

/**
 * Rayleigh estimate of the first frequency with a tip mass: the static tip stiffness 3EI/L³ against
 * the tip mass plus 0.2357 of the beam mass (Thomson). Hz. Within about 1 % of the exact value for
 * tip masses above the beam mass.
 */
export function rayleighFrequencyHz(b: CantileverBeam): number {
  checkBeam(b);
  const k = tipStiffnessNPerM(b);
  const mEff = (b.tipMassG + 0.2357 * beamMassG(b)) * 1e-3;
  return Math.sqrt(k / mEff) / (2 * Math.PI);
}

/** Static stiffness at the tip, 3EI/L³. N/m. */
export function tipStiffnessNPerM(b: CantileverBeam): number {
  checkBeam(b);
  const E = b.modulusGpa * 1e9;
  const I = sectionSecondMomentMm4(b.widthMm, b.thicknessMm) * 1e-12;
  const L = b.lengthMm * 1e-3;
  return (3 * E * I) / (L * L * L);
}

/** Static tip deflection under a tip force (e.g. a motor's full thrust), F·L³ / 3EI. mm. */
export function cantileverTipDeflectionMm(b: CantileverBeam, forceN: number): number {
  if (!Number.isFinite(forceN)) throw new RangeError(`force must be a finite number, got ${forceN}`);
  return (forceN / tipStiffnessNPerM(b)) * 1000;
}
