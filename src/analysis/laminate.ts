import type { Material } from '../geometry/index.js';

/** Plane-stress stiffness in Voigt order [xx, yy, xy] (engineering shear strain), row-major 3×3. MPa. */
export type PlaneStiffness = readonly [number, number, number, number, number, number, number, number, number];

/**
 * Everything the plate elements need from the laminate, in the solver's consistent units
 * (mm, N, tonne, s): membrane stiffness A = Q̄·t (N/mm), bending stiffness D = Q̄·t³/12 (N·mm),
 * areal density ρt (t/mm²) and rotary inertia ρt³/12 (t).
 */
export type Laminate = Readonly<{
  thicknessMm: number;
  weaveRad: number;
  /** Reduced stiffness of the ply in its own axes (1 = warp, 2 = weft). MPa. */
  q: PlaneStiffness;
  /** Reduced stiffness rotated into part axes. MPa. */
  qBar: PlaneStiffness;
  a: PlaneStiffness;
  d: PlaneStiffness;
  /** t/mm³ (1 g/cm³ = 1e-9 t/mm³). */
  densityTPerMm3: number;
  arealMassTPerMm2: number;
  rotaryInertiaT: number;
  /**
   * Transverse shear stiffness κ·G13·t with κ = 5/6 (Reissner–Mindlin), N/mm. The sheet's data gives
   * no G13 (G23); a woven carbon/epoxy laminate's is close to its in-plane G12, so G13 = G23 = G12
   * is taken (from memory). It matters: E/G13 ≈ 16 makes shear deformation lower the modes of
   * 2–6 mm plates by several per cent.
   */
  shearStiffnessNPerMm: number;
}>;

/** Shear correction factor of a homogeneous plate (Reissner). */
export const SHEAR_CORRECTION = 5 / 6;

/**
 * Reduced stiffness of an orthotropic ply (classical laminate theory; Kaw, Mechanics of Composite
 * Materials, 2nd ed., §2.4): Q11 = E1/(1 − ν12ν21), Q12 = ν12E2/(1 − ν12ν21), Q22 = E2/(1 − ν12ν21), Q66 = G12.
 * Moduli in GPa in, MPa out. Throws on non-positive moduli or ν12² ≥ E1/E2 (not positive definite).
 */
export function reducedStiffness(m: Pick<Material, 'e1Gpa' | 'e2Gpa' | 'g12Gpa' | 'nu12'>): PlaneStiffness {
  const e1 = m.e1Gpa * 1000;
  const e2 = m.e2Gpa * 1000;
  const g12 = m.g12Gpa * 1000;
  if (!(e1 > 0 && e2 > 0 && g12 > 0)) throw new RangeError(`material moduli must be positive (E1 ${m.e1Gpa}, E2 ${m.e2Gpa}, G12 ${m.g12Gpa} GPa)`);
  const nu21 = (m.nu12 * e2) / e1;
  const den = 1 - m.nu12 * nu21;
  if (!(den > 0)) throw new RangeError(`Poisson ratio ν12 ${m.nu12} is too large for E1 ${m.e1Gpa} / E2 ${m.e2Gpa} GPa`);
  const q11 = e1 / den;
  const q12 = (m.nu12 * e2) / den;
  const q22 = e2 / den;
  return [q11, q12, 0, q12, q22, 0, 0, 0, g12];
}

/**
 * Q̄: the ply stiffness seen in part axes when the ply's 1-axis lies at angle θ (rad, counter-clockwise
 * from part x). Kaw §2.6, eq. 2.104. Input and output MPa.
 */
export function rotateStiffness(q: PlaneStiffness, thetaRad: number): PlaneStiffness {
  const [q11, q12, , , q22, , , , q66] = q;
  const c = Math.cos(thetaRad);
  const s = Math.sin(thetaRad);
  const c2 = c * c;
  const s2 = s * s;
  const b11 = q11 * c2 * c2 + 2 * (q12 + 2 * q66) * s2 * c2 + q22 * s2 * s2;
  const b12 = (q11 + q22 - 4 * q66) * s2 * c2 + q12 * (c2 * c2 + s2 * s2);
  const b22 = q11 * s2 * s2 + 2 * (q12 + 2 * q66) * s2 * c2 + q22 * c2 * c2;
  const b16 = (q11 - q12 - 2 * q66) * c2 * c * s - (q22 - q12 - 2 * q66) * s2 * s * c;
  const b26 = (q11 - q12 - 2 * q66) * c * s2 * s - (q22 - q12 - 2 * q66) * c2 * c * s;
  const b66 = (q11 + q22 - 2 * q12 - 2 * q66) * s2 * c2 + q66 * (s2 * s2 + c2 * c2);
  return [b11, b12, b16, b12, b22, b26, b16, b26, b66];
}

const scale = (m: PlaneStiffness, k: number): PlaneStiffness => m.map((x) => x * k) as unknown as PlaneStiffness;

/**
 * Laminate constants for a plate of uniform woven 0/90 sheet, treated as a symmetric laminate of
 * identically oriented plies: A = Q̄t, B = 0, D = Q̄t³/12 (classical laminate theory). Never isotropic:
 * the woven sheet's low in-plane shear modulus G12 is kept (see reference-values.md).
 * @param thicknessMm plate thickness, mm (> 0)
 * @param weaveRad angle of the sheet's 0° fibres in part axes, rad
 * @throws RangeError on non-positive thickness or density, or an inadmissible material
 */
export function laminate(material: Material, thicknessMm: number, weaveRad: number): Laminate {
  if (!(thicknessMm > 0)) throw new RangeError(`thickness must be positive (got ${thicknessMm} mm)`);
  if (!(material.densityGPerCm3 > 0)) throw new RangeError(`density must be positive (got ${material.densityGPerCm3} g/cm³)`);
  const q = reducedStiffness(material);
  const qBar = rotateStiffness(q, weaveRad);
  const rho = material.densityGPerCm3 * 1e-9;
  const t = thicknessMm;
  return {
    thicknessMm: t,
    weaveRad,
    q,
    qBar,
    a: scale(qBar, t),
    d: scale(qBar, (t * t * t) / 12),
    densityTPerMm3: rho,
    arealMassTPerMm2: rho * t,
    rotaryInertiaT: (rho * t * t * t) / 12,
    shearStiffnessNPerMm: SHEAR_CORRECTION * material.g12Gpa * 1000 * t,
  };
}

/** Young's modulus along direction θ (rad from part x) from Q̄: 1 / (Q̄⁻¹)11. MPa. */
export function modulusAlong(qBar: PlaneStiffness, thetaRad: number): number {
  const r = rotateStiffness(qBar, -thetaRad);
  const [a, b, c, , e, f, , , i] = r;
  const det = a * (e * i - f * f) - b * (b * i - f * c) + c * (b * f - e * c);
  const s11 = (e * i - f * f) / det;
  return 1 / s11;
}
