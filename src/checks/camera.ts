import type { Vec2 } from '../geometry/types.js';
import { dist } from '../geometry/vec.js';

/**
 * Props in the camera view, with the camera as a pinhole: a point is seen when, in camera axes
 * (forward f tilted up by the uptilt, left, up), |left| ≤ forward·tan(hFov/2) and
 * |up| ≤ forward·tan(vFov/2). The view is a convex cone bounded by four planes through the eye; its
 * cut with the horizontal prop plane is a convex region, so whether a prop disc shows is exact:
 * the disc is visible when the distance from its centre to that region is at most its radius.
 * Frame parts hiding a prop are ignored (the answer errs on the visible side).
 */
export type CameraPose = Readonly<{
  /** Eye position, frame coordinates: x forward, y left, z up from the bottom plate's lower face. mm. */
  eyeMm: readonly [number, number, number];
  uptiltRad: number;
  hFovRad: number;
  vFovRad: number;
}>;

/** A prop disc lying in a horizontal plane. */
export type PropDisc = Readonly<{ id: string; centerMm: Vec2; radiusMm: number; zMm: number }>;

/** a·x + b·y + c ≤ 0 inside. */
export type HalfPlane = Readonly<{ a: number; b: number; c: number }>;

/** The view's four bounding planes cut by the plane z = zMm. */
export function viewHalfPlanes(pose: CameraPose, zMm: number): HalfPlane[] {
  const u = pose.uptiltRad;
  const f = [Math.cos(u), 0, Math.sin(u)];
  const left = [0, 1, 0];
  const up = [-Math.sin(u), 0, Math.cos(u)];
  const th = Math.tan(pose.hFovRad / 2);
  const tv = Math.tan(pose.vFovRad / 2);
  const comb = (s: number, v: number[], t: number): number[] => v.map((x, i) => s * x - t * f[i]);
  const normals = [comb(1, left, th), comb(-1, left, th), comb(1, up, tv), comb(-1, up, tv)];
  const [ex, ey, ez] = pose.eyeMm;
  return normals.map(([nx, ny, nz]) => ({ a: nx, b: ny, c: -nx * ex - ny * ey + nz * (zMm - ez) }));
}

/** Convex polygon (counter-clockwise) of the view region in the plane, clipped to the box [minX, minY, maxX, maxY]. */
export function viewRegion(pose: CameraPose, zMm: number, box: readonly [number, number, number, number]): Vec2[] {
  let poly: Vec2[] = [[box[0], box[1]], [box[2], box[1]], [box[2], box[3]], [box[0], box[3]]];
  for (const h of viewHalfPlanes(pose, zMm)) poly = clip(poly, h);
  return poly;
}

function clip(poly: Vec2[], h: HalfPlane): Vec2[] {
  const val = (p: Vec2): number => h.a * p[0] + h.b * p[1] + h.c;
  const out: Vec2[] = [];
  for (let i = 0; i < poly.length; i++) {
    const p = poly[i];
    const q = poly[(i + 1) % poly.length];
    const vp = val(p);
    const vq = val(q);
    if (vp <= 0) out.push(p);
    if ((vp < 0 && vq > 0) || (vp > 0 && vq < 0)) {
      const t = vp / (vp - vq);
      out.push([p[0] + (q[0] - p[0]) * t, p[1] + (q[1] - p[1]) * t]);
    }
  }
  return out;
}

/** Distance from p to a convex polygon (0 inside). mm. */
function distanceToConvex(poly: readonly Vec2[], p: Vec2): number {
  if (poly.length === 0) return Infinity;
  let inside = poly.length >= 3;
  let best = Infinity;
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % poly.length];
    const cr = (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]);
    if (cr < 0) inside = false;
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const l2 = dx * dx + dy * dy;
    const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / l2));
    best = Math.min(best, dist(p, [a[0] + dx * t, a[1] + dy * t]));
  }
  return inside ? 0 : best;
}

/**
 * How far the disc stays out of view: distance from its centre to the view region minus its
 * radius (mm). Positive: hidden with that margin; zero: a tip on the view boundary; negative: visible.
 * Margins beyond three radii are reported as 3 × radius.
 */
export function discViewMargin(pose: CameraPose, disc: PropDisc): number {
  const R = disc.radiusMm;
  const [cx, cy] = disc.centerMm;
  const region = viewRegion(pose, disc.zMm, [cx - 4 * R, cy - 4 * R, cx + 4 * R, cy + 4 * R]);
  return Math.min(distanceToConvex(region, disc.centerMm), 4 * R) - R;
}

/**
 * Smallest value of a camera setting in [lo, hi] at which every disc is hidden (margin > 0),
 * scanning in steps and bisecting the first change to 1e-4; null when none in the range.
 */
export function smallestHiding(margin: (v: number) => number, lo: number, hi: number, step: number): number | null {
  let prev = lo;
  if (margin(lo) > 0) return lo;
  for (let v = lo + step; v <= hi + 1e-9; v += step) {
    const x = Math.min(v, hi);
    if (margin(x) > 0) {
      let a = prev;
      let b = x;
      while (b - a > 1e-4) {
        const m = (a + b) / 2;
        if (margin(m) > 0) b = m;
        else a = m;
      }
      return b;
    }
    prev = x;
  }
  return null;
}
