/**
 * A straight two-node beam in 3D with six DOFs per node [u, v, w, rx, ry, rz] in global axes:
 * axial bar, Saint-Venant torsion, and bending in two planes with shear deformation (Timoshenko
 * beam; the stiffness of Przemieniecki, Theory of Matrix Structural Analysis, 1968, §5.6, with
 * Φ = 12EI/(κGAL²)). Mass is the consistent mass of the Euler–Bernoulli beam (Przemieniecki §11)
 * with the polar inertia for torsion. Units: mm, N, tonne (MPa, t/mm³).
 */

/** A beam cross-section and its material. */
export type BeamSection = Readonly<{
  areaMm2: number;
  /** Second moments about the section's two principal axes, mm⁴ (equal for a round bar). */
  i1Mm4: number;
  i2Mm4: number;
  /** Saint-Venant torsion constant, mm⁴ (the polar moment for a round bar). */
  torsionMm4: number;
  youngMpa: number;
  shearMpa: number;
  densityTPerMm3: number;
  /** Timoshenko shear coefficient κ (Cowper 1966: 6(1 + ν)/(7 + 6ν) for a solid circle). */
  shearFactor: number;
}>;

/**
 * A solid round bar of diameter d: A = πd²/4, I = πd⁴/64, J = πd⁴/32, κ = 6(1 + ν)/(7 + 6ν)
 * (Cowper, J. Appl. Mech. 33, 1966).
 * @param diameterMm > 0; youngGpa, poisson (0 to 0.5), densityGPerCm3 of the material
 * @throws RangeError on a non-positive diameter, modulus or density
 */
export function roundBar(diameterMm: number, youngGpa: number, poisson: number, densityGPerCm3: number): BeamSection {
  if (!(diameterMm > 0 && youngGpa > 0 && densityGPerCm3 > 0) || !(poisson >= 0 && poisson < 0.5)) {
    throw new RangeError(`round bar needs a positive diameter, modulus and density and 0 ≤ ν < 0.5 (got d ${diameterMm} mm, E ${youngGpa} GPa, ν ${poisson}, ρ ${densityGPerCm3} g/cm³)`);
  }
  const i = (Math.PI * diameterMm ** 4) / 64;
  return {
    areaMm2: (Math.PI * diameterMm ** 2) / 4,
    i1Mm4: i,
    i2Mm4: i,
    torsionMm4: 2 * i,
    youngMpa: youngGpa * 1000,
    shearMpa: (youngGpa * 1000) / (2 * (1 + poisson)),
    densityTPerMm3: densityGPerCm3 * 1e-9,
    shearFactor: (6 * (1 + poisson)) / (7 + 6 * poisson),
  };
}

/** Rows are the beam's local x (along it), y, z axes in global components (9 numbers). */
export function beamAxes(a: readonly number[], b: readonly number[]): { axes: number[]; lengthMm: number } {
  const d = [b[0] - a[0], b[1] - a[1], b[2] - a[2]];
  const l = Math.hypot(d[0], d[1], d[2]);
  if (!(l > 0)) throw new RangeError('beam of zero length');
  const ex = d.map((v) => v / l);
  // Any axis not along the beam starts the section's axes; a round bar does not care which.
  const ref = Math.abs(ex[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0];
  const ey0 = [ref[1] * ex[2] - ref[2] * ex[1], ref[2] * ex[0] - ref[0] * ex[2], ref[0] * ex[1] - ref[1] * ex[0]];
  const ny = Math.hypot(ey0[0], ey0[1], ey0[2]);
  const ey = ey0.map((v) => v / ny);
  const ez = [ex[1] * ey[2] - ex[2] * ey[1], ex[2] * ey[0] - ex[0] * ey[2], ex[0] * ey[1] - ex[1] * ey[0]];
  return { axes: [...ex, ...ey, ...ez], lengthMm: l };
}

/** 12×12 stiffness in the beam's local axes. */
function localStiffness(s: BeamSection, l: number): Float64Array {
  const k = new Float64Array(144);
  const set = (i: number, j: number, v: number) => {
    k[i * 12 + j] = v;
    k[j * 12 + i] = v;
  };
  const ea = (s.youngMpa * s.areaMm2) / l;
  set(0, 0, ea);
  set(6, 6, ea);
  set(0, 6, -ea);
  const gj = (s.shearMpa * s.torsionMm4) / l;
  set(3, 3, gj);
  set(9, 9, gj);
  set(3, 9, -gj);
  // Bending in the local x–y plane (v, rz) about z with I2, and in x–z (w, ry) about y with I1.
  const plane = (iMm4: number, t: number, r: number, sign: number) => {
    const phi = (12 * s.youngMpa * iMm4) / (s.shearFactor * s.shearMpa * s.areaMm2 * l * l);
    const c = (s.youngMpa * iMm4) / ((1 + phi) * l ** 3);
    set(t, t, 12 * c);
    set(t + 6, t + 6, 12 * c);
    set(t, t + 6, -12 * c);
    set(t, r, sign * 6 * l * c);
    set(t, r + 6, sign * 6 * l * c);
    set(t + 6, r, -sign * 6 * l * c);
    set(t + 6, r + 6, -sign * 6 * l * c);
    set(r, r, (4 + phi) * l * l * c);
    set(r + 6, r + 6, (4 + phi) * l * l * c);
    set(r, r + 6, (2 - phi) * l * l * c);
  };
  plane(s.i2Mm4, 1, 5, 1);
  plane(s.i1Mm4, 2, 4, -1);
  return k;
}

/** 12×12 consistent mass in the beam's local axes. */
function localMass(s: BeamSection, l: number): Float64Array {
  const k = new Float64Array(144);
  const set = (i: number, j: number, v: number) => {
    k[i * 12 + j] = v;
    k[j * 12 + i] = v;
  };
  const m = s.densityTPerMm3 * s.areaMm2 * l;
  for (const d of [0]) {
    set(d, d, m / 3);
    set(d + 6, d + 6, m / 3);
    set(d, d + 6, m / 6);
  }
  const jp = s.densityTPerMm3 * (s.i1Mm4 + s.i2Mm4) * l;
  set(3, 3, jp / 3);
  set(9, 9, jp / 3);
  set(3, 9, jp / 6);
  const plane = (t: number, r: number, sign: number) => {
    const c = m / 420;
    set(t, t, 156 * c);
    set(t + 6, t + 6, 156 * c);
    set(t, t + 6, 54 * c);
    set(t, r, sign * 22 * l * c);
    set(t + 6, r + 6, -sign * 22 * l * c);
    set(t, r + 6, -sign * 13 * l * c);
    set(t + 6, r, sign * 13 * l * c);
    set(r, r, 4 * l * l * c);
    set(r + 6, r + 6, 4 * l * l * c);
    set(r, r + 6, -3 * l * l * c);
  };
  plane(1, 5, 1);
  plane(2, 4, -1);
  return k;
}

/** Kᵍ = Tᵀ K T with T repeating the 3×3 axes for the four vector triples of the element. */
function rotate12(k: Float64Array, r: readonly number[]): Float64Array {
  const tmp = new Float64Array(144);
  for (let i = 0; i < 12; i++) {
    for (let b = 0; b < 4; b++) {
      for (let c = 0; c < 3; c++) {
        let s = 0;
        for (let a = 0; a < 3; a++) s += k[i * 12 + 3 * b + a] * r[a * 3 + c];
        tmp[i * 12 + 3 * b + c] = s;
      }
    }
  }
  const out = new Float64Array(144);
  for (let b = 0; b < 4; b++) {
    for (let c = 0; c < 3; c++) {
      for (let j = 0; j < 12; j++) {
        let s = 0;
        for (let a = 0; a < 3; a++) s += r[a * 3 + c] * tmp[(3 * b + a) * 12 + j];
        out[(3 * b + c) * 12 + j] = s;
      }
    }
  }
  return out;
}

/**
 * Global 12×12 stiffness and consistent mass of a beam between points a and b (mm), DOFs
 * [u, v, w, rx, ry, rz] of a then b.
 * @throws RangeError for coincident end points
 */
export function beamMatrices(s: BeamSection, a: readonly number[], b: readonly number[]): { k: Float64Array; m: Float64Array } {
  const { axes, lengthMm } = beamAxes(a, b);
  return { k: rotate12(localStiffness(s, lengthMm), axes), m: rotate12(localMass(s, lengthMm), axes) };
}
