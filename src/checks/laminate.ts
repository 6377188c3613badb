import type { Material } from '../geometry/part.js';

/**
 * In-plane properties of one orthotropic lamina (a woven 0/90 ply counts as one), by classical
 * laminate theory (Jones; Kaw, Mechanics of Composite Materials, ch. 2). Units: GPa, compliances
 * in 1/GPa, angles in radians measured from the material's 1 (warp) direction.
 */
export type Compliance = Readonly<{ s11: number; s12: number; s22: number; s16: number; s26: number; s66: number }>;

/** Reduced compliance [S] of the material in its own axes. 1/GPa. */
export function compliance(m: Material): Compliance {
  return { s11: 1 / m.e1Gpa, s12: -m.nu12 / m.e1Gpa, s22: 1 / m.e2Gpa, s16: 0, s26: 0, s66: 1 / m.g12Gpa };
}

/**
 * Transformed compliance [S̄] in axes turned by thetaRad from the 1 direction (Kaw eq. 2.103).
 * Throws nothing; non-finite input gives non-finite output.
 */
export function rotatedCompliance(m: Material, thetaRad: number): Compliance {
  const { s11, s12, s22, s66 } = compliance(m);
  const c = Math.cos(thetaRad);
  const s = Math.sin(thetaRad);
  const c2 = c * c;
  const s2 = s * s;
  return {
    s11: s11 * c2 * c2 + (2 * s12 + s66) * s2 * c2 + s22 * s2 * s2,
    s12: s12 * (s2 * s2 + c2 * c2) + (s11 + s22 - s66) * s2 * c2,
    s22: s11 * s2 * s2 + (2 * s12 + s66) * s2 * c2 + s22 * c2 * c2,
    s16: (2 * s11 - 2 * s12 - s66) * s * c2 * c - (2 * s22 - 2 * s12 - s66) * s2 * s * c,
    s26: (2 * s11 - 2 * s12 - s66) * s2 * s * c - (2 * s22 - 2 * s12 - s66) * s * c2 * c,
    s66: 2 * (2 * s11 + 2 * s22 - 4 * s12 - s66) * s2 * c2 + s66 * (s2 * s2 + c2 * c2),
  };
}

/** Engineering constants in turned axes: Ex, Ey, Gxy (GPa) and νxy. */
export function engineeringConstants(m: Material, thetaRad: number): { exGpa: number; eyGpa: number; gxyGpa: number; nuxy: number } {
  const S = rotatedCompliance(m, thetaRad);
  return { exGpa: 1 / S.s11, eyGpa: 1 / S.s22, gxyGpa: 1 / S.s66, nuxy: -S.s12 / S.s11 };
}

/**
 * Axial modulus along a direction at thetaRad to the warp:
 * 1/Ex = c⁴/E1 + (1/G12 − 2ν12/E1) s²c² + s⁴/E2. GPa.
 * @example exAt({e1Gpa:70,e2Gpa:70,g12Gpa:5,nu12:0.1,...}, Math.PI/4) // ≈ 17.72
 */
export function exAt(m: Material, thetaRad: number): number {
  return engineeringConstants(m, thetaRad).exGpa;
}

/**
 * Stress concentration at a circular hole in an infinite orthotropic plate loaded along x
 * (Lekhnitskii, Anisotropic Plates): Kt = 1 + sqrt(2(sqrt(Ex/Ey) − νxy) + Ex/Gxy), with the
 * constants taken in axes turned by thetaRad from the warp (the load direction).
 */
export function lekhnitskiiKt(m: Material, thetaRad: number): number {
  const e = engineeringConstants(m, thetaRad);
  return 1 + Math.sqrt(2 * (Math.sqrt(e.exGpa / e.eyGpa) - e.nuxy) + e.exGpa / e.gxyGpa);
}

/**
 * Net-section stress concentration of a centred circular hole in a finite-width isotropic strip
 * under tension (Heywood, in Peterson's Stress Concentration Factors): Ktn = 2 + (1 − d/W)³.
 * Throws RangeError unless 0 ≤ d/W < 1.
 */
export function heywoodKtn(holeDiameterMm: number, widthMm: number): number {
  const r = holeDiameterMm / widthMm;
  if (!(r >= 0 && r < 1)) throw new RangeError(`hole diameter over width must be in [0, 1), got ${r}`);
  return 2 + (1 - r) ** 3;
}
