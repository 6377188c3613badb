import { intersectSegments } from './intersect.js';
import { arcParamOfAngle, closestPoint, endOf, pointAt, startOf } from './segment.js';
import { COINCIDENT_MM } from './tolerance.js';
import type { Arc, BBox, Line, Segment, Vec2 } from './types.js';
import { add, dist, dot, polar, sub } from './vec.js';

/** The closest pair of points of two segments: p on the first at parameter t, q on the second at u. */
export type ClosestPair = Readonly<{ distance: number; p: Vec2; t: number; q: Vec2; u: number }>;

/**
 * Exact minimum distance between two segments (line–line, line–arc, arc–arc), with the closest
 * pair. The minimum of a smooth distance over two curve pieces lies either at a crossing (0), at an
 * end of one piece (closest point of the other), or at an interior pair joined by a common normal;
 * every such candidate is evaluated in closed form, so no flattening is involved.
 * Degenerate input (zero-length line, zero radius) is handled as a point. mm.
 * @example segmentDistance(line([0,0],[10,0]), arc([5,5],2,0,Math.PI*2)).distance // 3
 */
export function segmentDistance(a: Segment, b: Segment): ClosestPair {
  if (a.kind === 'arc' && b.kind === 'arc') {
    const c = separateCircles(a, b);
    if (c) return c;
  }
  let best: ClosestPair = endCandidates(a, b);
  const consider = (c: ClosestPair | null): void => {
    if (c && c.distance < best.distance) best = c;
  };
  if (a.kind === 'line' && b.kind === 'arc') for (const c of lineArcNormals(a, b)) consider(c);
  else if (a.kind === 'arc' && b.kind === 'line') for (const c of lineArcNormals(b, a)) consider(swap(c));
  else if (a.kind === 'arc' && b.kind === 'arc') for (const c of arcArcNormals(a, b)) consider(c);
  if (best.distance > 0 && bboxGap(segBoxLoose(a), segBoxLoose(b)) <= 0) {
    const hits = intersectSegments(a, b, COINCIDENT_MM * 1e-3);
    if (hits.length) {
      const h = hits[0];
      return { distance: 0, p: h.point, t: h.t, q: h.point, u: h.u };
    }
  }
  return best;
}

/**
 * Two full circles, each outside the other: the closest pair lies on the line of centres, at
 * |c1c2| − r1 − r2 (the common case of two round holes, answered without the general search).
 */
function separateCircles(a: Arc, b: Arc): ClosestPair | null {
  const full = (s: Arc) => Math.abs(s.sweepRad) >= 2 * Math.PI;
  if (!full(a) || !full(b)) return null;
  const d = dist(a.center, b.center);
  if (d <= a.radius + b.radius || d === 0) return null;
  const ang = Math.atan2(b.center[1] - a.center[1], b.center[0] - a.center[0]);
  const p = add(a.center, polar(a.radius, ang));
  const q = add(b.center, polar(b.radius, ang + Math.PI));
  return { distance: d - a.radius - b.radius, p, t: arcParamOfAngle(a, ang, 1e-9), q, u: arcParamOfAngle(b, ang + Math.PI, 1e-9) };
}

function swap(c: ClosestPair): ClosestPair {
  return { distance: c.distance, p: c.q, t: c.u, q: c.p, u: c.t };
}

/** Ends of each piece against the whole of the other. */
function endCandidates(a: Segment, b: Segment): ClosestPair {
  let best: ClosestPair | null = null;
  for (const t of [0, 1]) {
    const p = t === 0 ? startOf(a) : endOf(a);
    const c = closestPoint(b, p);
    if (!best || c.distance < best.distance) best = { distance: c.distance, p, t, q: c.point, u: c.t };
  }
  for (const u of [0, 1]) {
    const q = u === 0 ? startOf(b) : endOf(b);
    const c = closestPoint(a, q);
    if (c.distance < best!.distance) best = { distance: c.distance, p: c.point, t: c.t, q, u };
  }
  return best!;
}

/** Interior pairs of a line and an arc joined by a common normal: the arc point on the radius normal to the line. */
function lineArcNormals(l: Line, a: Arc): ClosestPair[] {
  const d = sub(l.end, l.start);
  const L2 = dot(d, d);
  if (L2 === 0) return [];
  const out: ClosestPair[] = [];
  const foot = add(l.start, scaleV(d, dot(sub(a.center, l.start), d) / L2));
  const n = sub(foot, a.center);
  const base = Math.hypot(n[0], n[1]) > 0 ? Math.atan2(n[1], n[0]) : Math.atan2(d[0], -d[1]);
  for (const ang of [base, base + Math.PI]) {
    const u = arcParamOfAngle(a, ang, 0);
    if (Number.isNaN(u)) continue;
    const q = add(a.center, polar(a.radius, ang));
    const t = dot(sub(q, l.start), d) / L2;
    if (t < 0 || t > 1) continue;
    const p = pointAt(l, t);
    out.push({ distance: dist(p, q), p, t, q, u });
  }
  return out;
}

/** Interior pairs of two arcs joined by a common normal: both points on the line through the centres. */
function arcArcNormals(a: Arc, b: Arc): ClosestPair[] {
  const v = sub(b.center, a.center);
  if (Math.hypot(v[0], v[1]) === 0) return []; // concentric: ends decide (see endCandidates)
  const phi = Math.atan2(v[1], v[0]);
  const out: ClosestPair[] = [];
  for (const ta of [phi, phi + Math.PI]) {
    const t = arcParamOfAngle(a, ta, 0);
    if (Number.isNaN(t)) continue;
    const p = add(a.center, polar(a.radius, ta));
    for (const tb of [phi, phi + Math.PI]) {
      const u = arcParamOfAngle(b, tb, 0);
      if (Number.isNaN(u)) continue;
      const q = add(b.center, polar(b.radius, tb));
      out.push({ distance: dist(p, q), p, t, q, u });
    }
  }
  return out;
}

const scaleV = (v: Vec2, k: number): Vec2 => [v[0] * k, v[1] * k];

/** Bounding box of a segment, slightly loose for arcs (whole circle box clipped by nothing). Cheap. */
function segBoxLoose(s: Segment): BBox {
  if (s.kind === 'line') {
    return [Math.min(s.start[0], s.end[0]), Math.min(s.start[1], s.end[1]), Math.max(s.start[0], s.end[0]), Math.max(s.start[1], s.end[1])];
  }
  return [s.center[0] - s.radius, s.center[1] - s.radius, s.center[0] + s.radius, s.center[1] + s.radius];
}

/** Gap between two boxes (0 when they overlap); a lower bound of the distance between their contents. mm. */
export function bboxGap(a: BBox, b: BBox): number {
  const dx = Math.max(0, a[0] - b[2], b[0] - a[2]);
  const dy = Math.max(0, a[1] - b[3], b[1] - a[3]);
  return Math.hypot(dx, dy);
}
