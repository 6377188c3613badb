import { lengthOf, pointAt, tangentAt } from '../geometry/segment.js';
import type { Loop, Segment } from '../geometry/types.js';
import type { Mat3, Vec3 } from './types.js';

/**
 * Mass properties as moments about the frame origin, so bodies add by plain sums:
 * m = ∫dm, first = ∫r dm, second = ∫r rᵀ dm (g, g·mm, g·mm²). The centre of mass and the inertia
 * tensor about it follow from the sums (`centreOfMass`, `inertiaAboutCentre`).
 */
export type MassBody = Readonly<{ massG: number; firstGMm: Vec3; secondGMm2: Mat3 }>;

export const ZERO_BODY: MassBody = { massG: 0, firstGMm: [0, 0, 0], secondGMm2: [0, 0, 0, 0, 0, 0, 0, 0, 0] };

/** Sum of bodies. */
export function addBodies(bodies: readonly MassBody[]): MassBody {
  let m = 0;
  const f = [0, 0, 0];
  const s = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (const b of bodies) {
    m += b.massG;
    for (let i = 0; i < 3; i++) f[i] += b.firstGMm[i];
    for (let i = 0; i < 9; i++) s[i] += b.secondGMm2[i];
  }
  return { massG: m, firstGMm: [f[0], f[1], f[2]], secondGMm2: s as unknown as Mat3 };
}

/** Centre of mass. mm. Throws on a massless body (a bug: every solid has mass). */
export function centreOfMass(b: MassBody): Vec3 {
  if (!(b.massG > 0)) throw new Error('centre of mass of a massless body');
  return [b.firstGMm[0] / b.massG, b.firstGMm[1] / b.massG, b.firstGMm[2] / b.massG];
}

/**
 * Inertia tensor about the centre of mass, frame axes, g·mm²: I = tr(S)·1 − S with
 * S = ∫(r − c)(r − c)ᵀ dm = second − m c cᵀ.
 */
export function inertiaAboutCentre(b: MassBody): Mat3 {
  const c = centreOfMass(b);
  const S = b.secondGMm2.map((v, k) => v - b.massG * c[Math.floor(k / 3)] * c[k % 3]);
  const tr = S[0] + S[4] + S[8];
  return S.map((v, k) => (k % 4 === 0 ? tr - v : -v)) as unknown as Mat3;
}

/**
 * A body described in its own axes (moments about its own origin: m, Q1 = ∫q dm, Q2 = ∫q qᵀ dm),
 * placed at `origin` with its axes along the frame vectors `axes` (columns of R): r = o + R q, so
 * first = m o + R Q1 and second = m o oᵀ + o (R Q1)ᵀ + (R Q1) oᵀ + R Q2 Rᵀ.
 */
export function placeBody(local: MassBody, origin: Vec3, axes: readonly [Vec3, Vec3, Vec3]): MassBody {
  const R = (i: number, j: number): number => axes[j][i];
  const q1 = local.firstGMm;
  const Rq1 = [0, 1, 2].map((i) => R(i, 0) * q1[0] + R(i, 1) * q1[1] + R(i, 2) * q1[2]);
  const Q2 = local.secondGMm2;
  const second: number[] = [];
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      let rqr = 0;
      for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) rqr += R(i, a) * Q2[a * 3 + b] * R(j, b);
      second.push(local.massG * origin[i] * origin[j] + origin[i] * Rq1[j] + Rq1[i] * origin[j] + rqr);
    }
  }
  return {
    massG: local.massG,
    firstGMm: [local.massG * origin[0] + Rq1[0], local.massG * origin[1] + Rq1[1], local.massG * origin[2] + Rq1[2]],
    secondGMm2: second as unknown as Mat3,
  };
}

/** Identity axes. */
export const FRAME_AXES: readonly [Vec3, Vec3, Vec3] = [[1, 0, 0], [0, 1, 0], [0, 0, 1]];

/** Area moments of a region: A, ∫x, ∫y, ∫x², ∫y², ∫xy over the area (mm², mm³, mm⁴). */
export type AreaMoments = Readonly<{ a: number; sx: number; sy: number; sxx: number; syy: number; sxy: number }>;

// Gauss–Legendre, 8 points on [0, 1]: exact for polynomials to degree 15, so exact on lines (the
// integrands are cubic); on arcs each piece spans at most 45°, where the trigonometric integrands
// are resolved to machine precision.
const GL_X = [-0.9602898564975363, -0.7966664774136267, -0.525532409916329, -0.1834346424956498, 0.1834346424956498, 0.525532409916329, 0.7966664774136267, 0.9602898564975363];
const GL_W = [0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.3626837833783620, 0.3626837833783620, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763];

/**
 * Exact area moments of a closed loop of lines and arcs by Green's theorem: A = ∮x dy,
 * ∫x = ∮x²/2 dy, ∫y = −∮y²/2 dx, ∫x² = ∮x³/3 dy, ∫y² = −∮y³/3 dx, ∫xy = ∮x²y/2 dy. Signed: a
 * counter-clockwise loop gives positive area, a clockwise hole negative, so a part's moments are the
 * plain sum over its outline and features.
 */
export function loopMoments(loop: Loop): AreaMoments {
  const m = { a: 0, sx: 0, sy: 0, sxx: 0, syy: 0, sxy: 0 };
  for (const seg of loop) for (const piece of pieces(seg)) accumulate(m, piece);
  return m;
}

function pieces(s: Segment): Array<(t: number) => { x: number; y: number; dx: number; dy: number }> {
  const n = s.kind === 'arc' ? Math.max(1, Math.ceil(Math.abs(s.sweepRad) / (Math.PI / 4))) : 1;
  const out = [];
  const length = lengthOf(s);
  for (let k = 0; k < n; k++) {
    const t0 = k / n;
    const dt = 1 / n;
    const ds = length * dt;
    out.push((u: number) => {
      const t = t0 + dt * u;
      const p = pointAt(s, t);
      const d = tangentAt(s, t);
      return { x: p[0], y: p[1], dx: d[0] * ds, dy: d[1] * ds };
    });
  }
  return out;
}

function accumulate(m: { a: number; sx: number; sy: number; sxx: number; syy: number; sxy: number }, f: (u: number) => { x: number; y: number; dx: number; dy: number }): void {
  for (let i = 0; i < 8; i++) {
    const w = GL_W[i] / 2;
    const { x, y, dx, dy } = f((GL_X[i] + 1) / 2);
    m.a += w * x * dy;
    m.sx += (w * x * x * dy) / 2;
    m.sy -= (w * y * y * dx) / 2;
    m.sxx += (w * x * x * x * dy) / 3;
    m.syy -= (w * y * y * y * dx) / 3;
    m.sxy += (w * x * x * y * dy) / 2;
  }
}

/** Sum of area moments (outline plus holes). */
export function sumMoments(ms: readonly AreaMoments[]): AreaMoments {
  const r = { a: 0, sx: 0, sy: 0, sxx: 0, syy: 0, sxy: 0 };
  for (const m of ms) {
    r.a += m.a;
    r.sx += m.sx;
    r.sy += m.sy;
    r.sxx += m.sxx;
    r.syy += m.syy;
    r.sxy += m.sxy;
  }
  return r;
}

/**
 * A uniform plate of the region, thickness t from w = 0 to w = t, density ρ g/mm³, in its own axes
 * (u, v in the region's plane, w through the thickness).
 */
export function plateBody(m: AreaMoments, thicknessMm: number, densityGPerMm3: number): MassBody {
  const t = thicknessMm;
  const k = densityGPerMm3 * t;
  const w2 = (densityGPerMm3 * t * t) / 2;
  return {
    massG: k * m.a,
    firstGMm: [k * m.sx, k * m.sy, w2 * m.a],
    secondGMm2: [k * m.sxx, k * m.sxy, w2 * m.sx, k * m.sxy, k * m.syy, w2 * m.sy, w2 * m.sx, w2 * m.sy, (densityGPerMm3 * t * t * t * m.a) / 3],
  };
}

/**
 * A solid cylinder of the given diameter and length along its own w axis from w = 0, in its own
 * axes (centre line through u = v = 0). Optional coaxial bore.
 */
export function cylinderBody(diameterMm: number, lengthMm: number, densityGPerMm3: number, boreMm = 0): MassBody {
  const r = diameterMm / 2;
  const ri = boreMm / 2;
  const a = Math.PI * (r * r - ri * ri);
  // ∫u² over an annulus = π (r⁴ − ri⁴) / 4.
  const uu = (Math.PI * (r ** 4 - ri ** 4)) / 4;
  return plateBody({ a, sx: 0, sy: 0, sxx: uu, syy: uu, sxy: 0 }, lengthMm, densityGPerMm3);
}

/**
 * A regular hexagonal prism of width across flats s (flats normal to u), length along w from 0,
 * optional coaxial round bore. Hexagon: A = (√3/2) s², ∫u² = ∫v² = (5√3/144) s⁴ (second moment
 * of a regular hexagon about a centroidal axis, 5√3 a⁴/16 with side a = s/√3).
 */
export function hexPrismBody(acrossFlatsMm: number, lengthMm: number, densityGPerMm3: number, boreMm = 0): MassBody {
  const s = acrossFlatsMm;
  const ri = boreMm / 2;
  const a = (Math.sqrt(3) / 2) * s * s - Math.PI * ri * ri;
  const uu = ((5 * Math.sqrt(3)) / 144) * s ** 4 - (Math.PI * ri ** 4) / 4;
  return plateBody({ a, sx: 0, sy: 0, sxx: uu, syy: uu, sxy: 0 }, lengthMm, densityGPerMm3);
}

/** A solid box centred on its own origin with sides (lx, ly, lz). */
export function boxBody(size: Vec3, massG: number): MassBody {
  const [lx, ly, lz] = size;
  return { massG, firstGMm: [0, 0, 0], secondGMm2: [(massG * lx * lx) / 12, 0, 0, 0, (massG * ly * ly) / 12, 0, 0, 0, (massG * lz * lz) / 12] };
}

/** A body of the given mass spread like a uniform solid cylinder (diameter, length along w from 0). */
export function cylinderOfMass(diameterMm: number, lengthMm: number, massG: number): MassBody {
  const unit = cylinderBody(diameterMm, lengthMm, 1);
  return scaleBody(unit, massG / unit.massG);
}

/** The body with every moment scaled (a different density). */
export function scaleBody(b: MassBody, k: number): MassBody {
  return { massG: b.massG * k, firstGMm: b.firstGMm.map((v) => v * k) as unknown as Vec3, secondGMm2: b.secondGMm2.map((v) => v * k) as unknown as Mat3 };
}
