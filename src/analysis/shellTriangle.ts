import type { PlaneStiffness } from './laminate.js';

/**
 * A flat three-node shell triangle with six degrees of freedom per node, ordered
 * [u, v, w, rx, ry, rz] (translations, then rotation vector components, right-handed, in the
 * element's own plane axes). It is the sum of two published elements that do not interact in a
 * symmetric laminate:
 *  - bending: the Discrete Kirchhoff Triangle (DKT; Batoz, Bathe & Ho, Int. J. Num. Meth. Eng. 15, 1980),
 *    extended for transverse shear deformation in the manner of the discrete Kirchhoff–Mindlin
 *    triangle (DKMT; Katili, Int. J. Num. Meth. Eng. 36, 1993), DOFs w, rx = ∂w/∂y, ry = −∂w/∂x;
 *  - membrane: Allman's triangle with drilling rotations (Allman, Computers & Structures 19, 1984), built
 *    as the six-node quadratic triangle whose mid-side displacements follow from the corner rotations rz,
 *    plus a small penalty on the one spurious drilling mode.
 * Stiffness is returned in element axes; `toGlobal` rotates an 18×18 matrix for a plate placed in 3D,
 * so an assembled frame can reuse the element unchanged.
 */

export const DOF_PER_NODE = 6;
export const BENDING_DOFS = [2, 3, 4] as const;
export const MEMBRANE_DOFS = [0, 1, 5] as const;

/** Penalty weight on the spurious drilling mode, relative to G·t·area; small enough not to stiffen bending in plane. */
const DRILL_PENALTY = 0.01;

/** Gauss points at the mid-sides (area coordinates), exact for quadratic integrands (weights 1/3 of the area). */
const MIDSIDE_POINTS: ReadonlyArray<readonly [number, number, number]> = [
  [0.5, 0.5, 0],
  [0, 0.5, 0.5],
  [0.5, 0, 0.5],
];

/** Sides (i, j) of the six-node triangle, in the order of mid-side nodes 3, 4, 5. */
const SIDES: ReadonlyArray<readonly [number, number]> = [
  [0, 1],
  [1, 2],
  [2, 0],
];

type Tri = readonly [number, number, number];

/** Twice the signed area; positive when the corners run counter-clockwise. */
export const twiceArea = (x: Tri, y: Tri): number => (x[1] - x[0]) * (y[2] - y[0]) - (x[2] - x[0]) * (y[1] - y[0]);

/**
 * Derivatives ∂N/∂x, ∂N/∂y of the six quadratic shape functions at area coordinates L.
 * N_i = L_i(2L_i − 1) at corners, N = 4 L_i L_j at the mid-side of side (i, j).
 */
function quadraticGradients(x: Tri, y: Tri, L: readonly [number, number, number]): { dx: Float64Array; dy: Float64Array } {
  const a2 = twiceArea(x, y);
  const bx = [(y[1] - y[2]) / a2, (y[2] - y[0]) / a2, (y[0] - y[1]) / a2];
  const by = [(x[2] - x[1]) / a2, (x[0] - x[2]) / a2, (x[1] - x[0]) / a2];
  const dx = new Float64Array(6);
  const dy = new Float64Array(6);
  for (let i = 0; i < 3; i++) {
    dx[i] = (4 * L[i] - 1) * bx[i];
    dy[i] = (4 * L[i] - 1) * by[i];
  }
  SIDES.forEach(([i, j], k) => {
    dx[3 + k] = 4 * (bx[i] * L[j] + L[i] * bx[j]);
    dy[3 + k] = 4 * (by[i] * L[j] + L[i] * by[j]);
  });
  return { dx, dy };
}

/** Bending stiffness along direction (c, s): D_ss = n·D·n for the curvature of a cylinder bent about the normal. N·mm. */
function bendingAlong(d: PlaneStiffness, c: number, s: number): number {
  const v = [c * c, s * s, c * s];
  const dv = [0, 1, 2].map((r) => d[3 * r] * v[0] + d[3 * r + 1] * v[1] + d[3 * r + 2] * 2 * v[2]);
  return v[0] * dv[0] + v[1] * dv[1] + 2 * v[2] * dv[2];
}

/**
 * Rotations βx = −∂w/∂x, βy = −∂w/∂y (Kirchhoff limit) at the six nodes of the quadratic triangle as
 * linear combinations of the nine DOFs [w, rx, ry] × 3, and each side's constant transverse shear
 * strain γ_s. At corners βx = ry, βy = −rx. Along a side the tangential rotation is quadratic and w
 * cubic, tied by the Timoshenko beam relation with φ = 12 D_ss / (κGt l²): the mid-side excess over
 * the mean is Δβ = −3/(2l(1+φ))·(w_j − w_i) − 3/(4(1+φ))·(β_si + β_sj) and γ_s = −(2/3)·φ·Δβ. The
 * normal rotation varies linearly. With φ = 0 this is exactly the DKT of Batoz, Bathe & Ho (1980);
 * with φ > 0 it is a discrete Kirchhoff–Mindlin triangle in the manner of Katili's DKMT (1993).
 */
function rotationMaps(x: Tri, y: Tri, d: PlaneStiffness, shearNPerMm: number): { bx: Float64Array; by: Float64Array; gs: Float64Array } {
  rotationMapsInto(x, y, d, shearNPerMm);
  return { bx: Float64Array.from(S.rbx), by: Float64Array.from(S.rby), gs: Float64Array.from(S.gs) };
}

/** `rotationMaps` into the scratch arrays S.rbx, S.rby, S.gs. */
function rotationMapsInto(x: Tri, y: Tri, d: PlaneStiffness, shearNPerMm: number): void {
  const { rbx: bx, rby: by, gs } = S;
  bx.fill(0);
  by.fill(0);
  gs.fill(0);
  for (let i = 0; i < 3; i++) {
    bx[i * 9 + 3 * i + 2] = 1;
    by[i * 9 + 3 * i + 1] = -1;
  }
  for (let side = 0; side < 3; side++) {
    const [i, j] = SIDES[side];
    const row = (3 + side) * 9;
    const ex = x[j] - x[i];
    const ey = y[j] - y[i];
    const l = Math.hypot(ex, ey);
    const c = ex / l;
    const sn = ey / l;
    const phi = shearNPerMm > 0 && Number.isFinite(shearNPerMm) ? (12 * bendingAlong(d, c, sn)) / (shearNPerMm * l * l) : 0;
    const a = 0.5 - 3 / (4 * (1 + phi));
    const bw = 3 / (2 * l * (1 + phi));
    // βx_k = bw·c·(w_i − w_j) + (a c² + s²/2)(βx_i + βx_j) + (a − 1/2) c s (βy_i + βy_j)
    // βy_k = bw·s·(w_i − w_j) + (a − 1/2) c s (βx_i + βx_j) + (a s² + c²/2)(βy_i + βy_j)
    const kxx = a * c * c + (sn * sn) / 2;
    const kxy = (a - 0.5) * c * sn;
    const kyy = a * sn * sn + (c * c) / 2;
    // Δβ = (a − 1/2)(β_si + β_sj) + bw (w_i − w_j); γ_s = −(2/3) φ Δβ
    const g = (-2 / 3) * phi;
    for (let e = 0; e < 2; e++) {
      const node = e === 0 ? i : j;
      const sign = e === 0 ? 1 : -1;
      bx[row + 3 * node] += sign * bw * c;
      by[row + 3 * node] += sign * bw * sn;
      // βx_node = ry, βy_node = −rx
      bx[row + 3 * node + 2] += kxx;
      bx[row + 3 * node + 1] += -kxy;
      by[row + 3 * node + 2] += kxy;
      by[row + 3 * node + 1] += -kyy;
      gs[side * 9 + 3 * node] += g * sign * bw;
      gs[side * 9 + 3 * node + 2] += g * (a - 0.5) * c;
      gs[side * 9 + 3 * node + 1] += -g * (a - 0.5) * sn;
    }
  }
}

/** Scratch space of `shellBlocksInto` (one thread; reused so that assembling a frame allocates nothing per element). */
const S = {
  rbx: new Float64Array(54),
  rby: new Float64Array(54),
  gs: new Float64Array(27),
  b: new Float64Array(27),
  cb: new Float64Array(27),
  dx: new Float64Array(6),
  dy: new Float64Array(6),
  t: new Float64Array(108),
  par: new Float64Array(27),
  am: new Float64Array(9),
  gx: new Float64Array(9),
  gy: new Float64Array(9),
  h: new Float64Array(9),
  gradX: new Float64Array(3),
  gradY: new Float64Array(3),
};

/**
 * S.b (3×9) = the strain rows at the point whose shape-function gradients are in S.dx, S.dy:
 * ε_x = Σ dx·u, ε_y = Σ dy·v, γ_xy = Σ dy·u + dx·v, with u of node n and DOF k at u[9n + k]
 * and v at v[vAt + 9n + k] (the bending curvatures and the membrane strains have this one form).
 */
function strainRowsInto(u: Float64Array, v: Float64Array, vAt: number): void {
  const { b, dx, dy } = S;
  for (let k = 0; k < 9; k++) {
    let b0 = 0;
    let b1 = 0;
    let b2 = 0;
    for (let n = 0; n < 6; n++) {
      const un = u[n * 9 + k];
      const vn = v[vAt + n * 9 + k];
      b0 += dx[n] * un;
      b1 += dy[n] * vn;
      b2 += dy[n] * un + dx[n] * vn;
    }
    b[k] = b0;
    b[9 + k] = b1;
    b[18 + k] = b2;
  }
}

/** k (9×9) += w·Bᵀ·C·B for the 3×9 matrix in S.b. */
function addBtCBFast(k: Float64Array, c: PlaneStiffness, w: number): void {
  const { b, cb } = S;
  for (let r = 0; r < 3; r++) {
    const c0 = c[r * 3];
    const c1 = c[r * 3 + 1];
    const c2 = c[r * 3 + 2];
    for (let j = 0; j < 9; j++) cb[r * 9 + j] = c0 * b[j] + c1 * b[9 + j] + c2 * b[18 + j];
  }
  for (let i = 0; i < 9; i++) {
    const b0 = w * b[i];
    const b1 = w * b[9 + i];
    const b2 = w * b[18 + i];
    const row = i * 9;
    for (let j = 0; j < 9; j++) k[row + j] += b0 * cb[j] + b1 * cb[9 + j] + b2 * cb[18 + j];
  }
}

/** Gradients of the six quadratic shape functions at area coordinates (l0, l1, l2) into S.dx, S.dy. */
function gradientsAt(l0: number, l1: number, l2: number): void {
  const { dx, dy, gradX: gx, gradY: gy } = S;
  dx[0] = (4 * l0 - 1) * gx[0];
  dx[1] = (4 * l1 - 1) * gx[1];
  dx[2] = (4 * l2 - 1) * gx[2];
  dy[0] = (4 * l0 - 1) * gy[0];
  dy[1] = (4 * l1 - 1) * gy[1];
  dy[2] = (4 * l2 - 1) * gy[2];
  dx[3] = 4 * (gx[0] * l1 + l0 * gx[1]);
  dy[3] = 4 * (gy[0] * l1 + l0 * gy[1]);
  dx[4] = 4 * (gx[1] * l2 + l1 * gx[2]);
  dy[4] = 4 * (gy[1] * l2 + l1 * gy[2]);
  dx[5] = 4 * (gx[2] * l0 + l2 * gx[0]);
  dy[5] = 4 * (gy[2] * l0 + l2 * gy[0]);
}

/**
 * The element's bending (9×9, DOFs [w, rx, ry] per corner) and membrane (9×9, DOFs [u, v, rz] per
 * corner) stiffness blocks, added into `bend` and `mem` (zero them first). The same element as
 * `plateBendingStiffness` and `allmanStiffness`, computed without allocating: assembling a frame of
 * ten thousand triangles spends its time here. Either output may be null to skip that block.
 * @throws RangeError on a degenerate or clockwise triangle
 */
export function shellBlocksInto(x: Tri, y: Tri, a: PlaneStiffness, d: PlaneStiffness, shearNPerMm: number, bend: Float64Array | null, mem: Float64Array | null): void {
  const a2 = twiceArea(x, y);
  const area = a2 / 2;
  if (!(area > 0)) throw new RangeError(`degenerate or clockwise triangle (area ${area} mm²)`);
  const { gradX, gradY } = S;
  gradX[0] = (y[1] - y[2]) / a2;
  gradX[1] = (y[2] - y[0]) / a2;
  gradX[2] = (y[0] - y[1]) / a2;
  gradY[0] = (x[2] - x[1]) / a2;
  gradY[1] = (x[0] - x[2]) / a2;
  gradY[2] = (x[1] - x[0]) / a2;
  const w3 = area / 3;
  if (bend) {
    const shear = shearNPerMm > 0 && Number.isFinite(shearNPerMm) ? shearNPerMm : 0;
    rotationMapsInto(x, y, d, shear);
    const { rbx, rby } = S;
    for (let p = 0; p < 3; p++) {
      const L = MIDSIDE_POINTS[p];
      gradientsAt(L[0], L[1], L[2]);
      strainRowsInto(rbx, rby, 0);
      addBtCBFast(bend, d, w3);
    }
    if (shear > 0) {
      const { gs, am, par, gx, gy } = S;
      const xc = (x[0] + x[1] + x[2]) / 3;
      const yc = (y[0] + y[1] + y[2]) / 3;
      for (let side = 0; side < 3; side++) {
        const [i, j] = SIDES[side];
        const l = Math.hypot(x[j] - x[i], y[j] - y[i]);
        const c = (x[j] - x[i]) / l;
        const s = (y[j] - y[i]) / l;
        am[3 * side] = c;
        am[3 * side + 1] = s;
        am[3 * side + 2] = c * ((y[i] + y[j]) / 2 - yc) - s * ((x[i] + x[j]) / 2 - xc);
      }
      const ai = invert3(am);
      for (let r = 0; r < 3; r++) for (let k = 0; k < 9; k++) par[r * 9 + k] = ai[3 * r] * gs[k] + ai[3 * r + 1] * gs[9 + k] + ai[3 * r + 2] * gs[18 + k];
      const w = w3 * shear;
      for (let p = 0; p < 3; p++) {
        const L = MIDSIDE_POINTS[p];
        const px = L[0] * x[0] + L[1] * x[1] + L[2] * x[2] - xc;
        const py = L[0] * y[0] + L[1] * y[1] + L[2] * y[2] - yc;
        for (let k = 0; k < 9; k++) {
          gx[k] = par[k] + py * par[18 + k];
          gy[k] = par[9 + k] - px * par[18 + k];
        }
        for (let i = 0; i < 9; i++) {
          const wx = w * gx[i];
          const wy = w * gy[i];
          for (let j = 0; j < 9; j++) bend[i * 9 + j] += wx * gx[j] + wy * gy[j];
        }
      }
    }
  }
  if (mem) {
    const t = S.t;
    allmanMapInto(x, y, t);
    for (let p = 0; p < 3; p++) {
      const L = MIDSIDE_POINTS[p];
      gradientsAt(L[0], L[1], L[2]);
      strainRowsInto(t, t, 54);
      addBtCBFast(mem, a, w3);
    }
    gradientsAt(1 / 3, 1 / 3, 1 / 3);
    const { dx, dy, h } = S;
    h.fill(0);
    for (let n = 0; n < 6; n++) for (let dd = 0; dd < 9; dd++) h[dd] -= 0.5 * (dx[n] * t[(6 + n) * 9 + dd] - dy[n] * t[n * 9 + dd]);
    for (let i = 0; i < 3; i++) h[3 * i + 2] += 1 / 3;
    const pen = DRILL_PENALTY * a[8] * area;
    for (let i = 0; i < 9; i++) {
      const hi = pen * h[i];
      for (let j = 0; j < 9; j++) mem[i * 9 + j] += hi * h[j];
    }
  }
}

/**
 * Curvature–displacement matrix (3×9, row-major) at area coordinates L:
 * κ = [∂βx/∂x, ∂βy/∂y, ∂βx/∂y + ∂βy/∂x] (= [−w,xx, −w,yy, −2w,xy] in the Kirchhoff limit).
 * @param shearNPerMm κGt; Infinity or 0 for the Kirchhoff (DKT) element
 */
export function plateCurvatureMatrix(x: Tri, y: Tri, L: readonly [number, number, number], d: PlaneStiffness, shearNPerMm = 0): Float64Array {
  const { bx, by } = rotationMaps(x, y, d, shearNPerMm);
  const { dx, dy } = quadraticGradients(x, y, L);
  const b = new Float64Array(27);
  for (let n = 0; n < 6; n++) {
    for (let k = 0; k < 9; k++) {
      b[k] += dx[n] * bx[n * 9 + k];
      b[9 + k] += dy[n] * by[n * 9 + k];
      b[18 + k] += dy[n] * bx[n * 9 + k] + dx[n] * by[n * 9 + k];
    }
  }
  return b;
}

/**
 * Bending stiffness (9×9, DOFs [w, rx, ry] per corner) for bending stiffness D (N·mm) and
 * transverse shear stiffness κGt (N/mm; 0 gives the Kirchhoff DKT). The transverse shear strain
 * field is linear, γ = (a1 + c(y − yc), a2 − c(x − xc)), fixed by the three sides' tangential shear
 * strains (the assumed field of MITC3-type elements). Coordinates in mm, corners counter-clockwise.
 * Throws RangeError on a degenerate triangle.
 */
export function plateBendingStiffness(x: Tri, y: Tri, d: PlaneStiffness, shearNPerMm = 0): Float64Array {
  const k = new Float64Array(81);
  shellBlocksInto(x, y, d, d, shearNPerMm, k, null);
  return k;
}

function invert3(m: Float64Array): Float64Array {
  const [a, b, c, d, e, f, g, h, i] = m;
  const A = e * i - f * h;
  const B = -(d * i - f * g);
  const C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (!(Math.abs(det) > 0)) throw new RangeError('degenerate triangle (shear field not defined)');
  return Float64Array.of(A / det, -(b * i - c * h) / det, (b * f - c * e) / det, B / det, (a * i - c * g) / det, -(a * f - c * d) / det, C / det, -(a * h - b * g) / det, (a * e - b * d) / det);
}

/**
 * The 12×9 map from Allman DOFs [u, v, rz] × 3 to the six-node triangle's [u0..u5, v0..v5]:
 * u_m = (u_i + u_j)/2 + (y_j − y_i)(rz_j − rz_i)/8, v_m = (v_i + v_j)/2 + (x_i − x_j)(rz_j − rz_i)/8,
 * written into t (12×9, overwritten).
 */
function allmanMapInto(x: Tri, y: Tri, t: Float64Array): void {
  t.fill(0);
  for (let i = 0; i < 3; i++) {
    t[i * 9 + 3 * i] = 1;
    t[(6 + i) * 9 + 3 * i + 1] = 1;
  }
  for (let s = 0; s < 3; s++) {
    const [i, j] = SIDES[s];
    const ru = (3 + s) * 9;
    const rv = (9 + s) * 9;
    t[ru + 3 * i] += 0.5;
    t[ru + 3 * j] += 0.5;
    t[rv + 3 * i + 1] += 0.5;
    t[rv + 3 * j + 1] += 0.5;
    const fu = (y[j] - y[i]) / 8;
    const fv = (x[i] - x[j]) / 8;
    t[ru + 3 * j + 2] += fu;
    t[ru + 3 * i + 2] -= fu;
    t[rv + 3 * j + 2] += fv;
    t[rv + 3 * i + 2] -= fv;
  }
}

/**
 * Allman membrane stiffness (9×9, DOFs [u, v, rz] per corner) for membrane stiffness A (N/mm).
 * The penalty ties the mean corner rotation to the continuum rotation at the centroid, which
 * removes the element's one zero-energy drilling mode without touching rigid-body motion.
 */
export function allmanStiffness(x: Tri, y: Tri, a: PlaneStiffness): Float64Array {
  const k = new Float64Array(81);
  shellBlocksInto(x, y, a, a, 0, null, k);
  return k;
}

/**
 * The 18×18 flat-shell stiffness in element axes: discrete Kirchhoff(–Mindlin) bending plus Allman membrane, DOFs
 * [u, v, w, rx, ry, rz] per corner. x, y are the corners in the element plane (mm). `parts` may skip
 * the bending or membrane block when only the other is wanted (a flat plate solved block by block).
 */
export function shellStiffness(x: Tri, y: Tri, a: PlaneStiffness, d: PlaneStiffness, shearNPerMm = 0, parts: Readonly<{ bending: boolean; membrane: boolean }> = { bending: true, membrane: true }): Float64Array {
  const k = new Float64Array(18 * 18);
  const bend = parts.bending ? new Float64Array(81) : null;
  const mem = parts.membrane ? new Float64Array(81) : null;
  shellBlocksInto(x, y, a, d, shearNPerMm, bend, mem);
  if (bend) scatterBlock(k, bend, BENDING_DOFS);
  if (mem) scatterBlock(k, mem, MEMBRANE_DOFS);
  return k;
}

/** Add a 9×9 block over DOFs `dofs` of each corner into an 18×18 element matrix. */
export function scatterBlock(k18: Float64Array, k9: Float64Array, dofs: readonly number[]): void {
  for (let i = 0; i < 9; i++) {
    const gi = 6 * Math.floor(i / 3) + dofs[i % 3];
    for (let j = 0; j < 9; j++) k18[gi * 18 + 6 * Math.floor(j / 3) + dofs[j % 3]] += k9[i * 9 + j];
  }
}

/**
 * Lumped (diagonal) mass per corner, 6 entries: a third of the element's mass on each translation,
 * a third of its rotary inertia ρt³/12·A about the in-plane axes, and a small inertia about the normal
 * (the drilling rotation carries no physical inertia in plate theory; it only has to be positive).
 * @param arealMass ρt, t/mm²; rotary ρt³/12, t
 */
export function shellLumpedMass(x: Tri, y: Tri, arealMass: number, rotary: number): Float64Array {
  const area = twiceArea(x, y) / 2;
  const m = (arealMass * area) / 3;
  const j = (rotary * area) / 3;
  return Float64Array.of(m, m, m, j, j, (m * area) / 12);
}

/**
 * Rotate an 18×18 element matrix from element axes to global axes: K_g = Tᵀ K T, where T repeats
 * the 3×3 direction-cosine matrix r (rows: element x, y, z axes in global components) for the
 * translations and rotations of each corner.
 */
export function toGlobal(k: Float64Array, r: ArrayLike<number>): Float64Array {
  const out = new Float64Array(324);
  toGlobalInto(k, r, new Float64Array(324), out);
  return out;
}

/** `toGlobal` into `out` with `tmp` as scratch (both 324 long; neither may be k). */
export function toGlobalInto(k: Float64Array, r: ArrayLike<number>, tmp: Float64Array, out: Float64Array): void {
  const n = 18;
  // tmp = K T (T block-diagonal with r)
  for (let i = 0; i < n; i++) {
    for (let b = 0; b < 6; b++) {
      const kb = i * n + 3 * b;
      const k0 = k[kb];
      const k1 = k[kb + 1];
      const k2 = k[kb + 2];
      for (let c = 0; c < 3; c++) tmp[kb + c] = k0 * r[c] + k1 * r[3 + c] + k2 * r[6 + c];
    }
  }
  for (let b = 0; b < 6; b++) {
    for (let c = 0; c < 3; c++) {
      const r0 = r[c];
      const r1 = r[3 + c];
      const r2 = r[6 + c];
      const row = (3 * b + c) * n;
      const t0 = 3 * b * n;
      for (let j = 0; j < n; j++) out[row + j] = r0 * tmp[t0 + j] + r1 * tmp[t0 + n + j] + r2 * tmp[t0 + 2 * n + j];
    }
  }
}
