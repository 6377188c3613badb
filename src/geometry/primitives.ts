import type { Loop, Vec2 } from './types.js';
import { arc, line } from './segment.js';
import { add, cross, dist, len, polar, sub, unit } from './vec.js';

/** Full circle, counter-clockwise (pass ccw=false for a hole). */
export function circle(center: Vec2, radius: number, ccw = true): Loop {
  return [arc(center, radius, 0, ccw ? 2 * Math.PI : -2 * Math.PI)];
}

/** Polygon from vertices given counter-clockwise. */
export function polygon(pts: readonly Vec2[]): Loop {
  return pts.map((p, i) => line(p, pts[(i + 1) % pts.length]));
}

/**
 * Rectangle centred at `center`, rotated by rotRad, with all four corners rounded by radiusMm
 * (0 gives sharp corners). Counter-clockwise.
 */
export function roundedRect(center: Vec2, widthMm: number, heightMm: number, radiusMm: number, rotRad = 0): Loop {
  const hw = widthMm / 2;
  const hh = heightMm / 2;
  const r = Math.min(radiusMm, hw, hh);
  const c = Math.cos(rotRad);
  const s = Math.sin(rotRad);
  const tf = (p: Vec2): Vec2 => [center[0] + p[0] * c - p[1] * s, center[1] + p[0] * s + p[1] * c];
  if (r <= 0) return polygon([tf([-hw, -hh]), tf([hw, -hh]), tf([hw, hh]), tf([-hw, hh])]);
  const cornerCentres: Vec2[] = [
    [hw - r, -hh + r],
    [hw - r, hh - r],
    [-hw + r, hh - r],
    [-hw + r, -hh + r],
  ];
  const out: Loop[number][] = [];
  for (let i = 0; i < 4; i++) {
    const a0 = -Math.PI / 2 + (i * Math.PI) / 2;
    out.push(arc(tf(cornerCentres[i]), r, a0 + rotRad, Math.PI / 2));
    const from = tf(add(cornerCentres[i], polar(r, a0 + Math.PI / 2)));
    const to = tf(add(cornerCentres[(i + 1) % 4], polar(r, a0 + Math.PI / 2)));
    // A side whose length is zero (radius equal to a half side) is left out: no degenerate segments.
    if (dist(from, to) > 1e-12) out.push(line(from, to));
  }
  return out;
}

/** Stadium slot between centres a and b, full width widthMm (a round hole when a = b). Counter-clockwise. */
export function slot(a: Vec2, b: Vec2, widthMm: number): Loop {
  const r = widthMm / 2;
  const d = sub(b, a);
  if (len(d) < 1e-12) return [arc(a, r, 0, 2 * Math.PI)];
  const ang = Math.atan2(d[1], d[0]);
  const n = polar(r, ang - Math.PI / 2);
  return [
    line(add(a, n), add(b, n)),
    arc(b, r, ang - Math.PI / 2, Math.PI),
    line(sub(b, n), sub(a, n)),
    arc(a, r, ang + Math.PI / 2, Math.PI),
  ];
}

/**
 * Curved slot: the set of points within widthMm/2 of the arc of radius `radius` about `center`,
 * from startRad sweeping sweepRad (> 0). Counter-clockwise.
 */
export function arcSlot(center: Vec2, radius: number, startRad: number, sweepRad: number, widthMm: number): Loop {
  const h = widthMm / 2;
  const a1 = startRad + sweepRad;
  return [
    arc(center, radius + h, startRad, sweepRad),
    arc(add(center, polar(radius, a1)), h, a1, Math.PI),
    arc(center, radius - h, a1, -sweepRad),
    arc(add(center, polar(radius, startRad)), h, startRad + Math.PI, Math.PI),
  ];
}

/**
 * Convex hull of equal circles (e.g. bolt holes plus a margin): straight tangents joined by arcs.
 * Exact; counter-clockwise. Needs at least one centre.
 */
export function hullOfCircles(centers: readonly Vec2[], radius: number): Loop {
  const hull = convexHull(centers);
  if (hull.length === 1) return [arc(hull[0], radius, 0, 2 * Math.PI)];
  const out: Loop[number][] = [];
  const n = hull.length;
  for (let i = 0; i < n; i++) {
    const a = hull[i];
    const b = hull[(i + 1) % n];
    const dir = unit(sub(b, a));
    const outward: Vec2 = [dir[1] * radius, -dir[0] * radius];
    out.push(line(add(a, outward), add(b, outward)));
    const c = hull[(i + 2) % n];
    const dir2 = unit(sub(c, b));
    const a0 = Math.atan2(-dir[0], dir[1]);
    let sweep = Math.atan2(-dir2[0], dir2[1]) - a0;
    while (sweep < 0) sweep += 2 * Math.PI;
    while (sweep >= 2 * Math.PI) sweep -= 2 * Math.PI;
    if (sweep > 1e-12) out.push(arc(b, radius, a0, sweep));
  }
  return out;
}

/** Convex hull (Andrew's monotone chain), counter-clockwise, collinear points dropped. */
export function convexHull(points: readonly Vec2[]): Vec2[] {
  const pts = [...points].sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  const uniq = pts.filter((p, i) => i === 0 || dist(p, pts[i - 1]) > 1e-9);
  if (uniq.length < 3) return uniq;
  const lower: Vec2[] = [];
  for (const p of uniq) {
    while (lower.length >= 2 && cross(sub(lower[lower.length - 1], lower[lower.length - 2]), sub(p, lower[lower.length - 1])) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: Vec2[] = [];
  for (let i = uniq.length - 1; i >= 0; i--) {
    const p = uniq[i];
    while (upper.length >= 2 && cross(sub(upper[upper.length - 1], upper[upper.length - 2]), sub(p, upper[upper.length - 1])) <= 0) upper.pop();
    upper.push(p);
  }
  return lower.slice(0, -1).concat(upper.slice(0, -1));
}
