import type { Arc, Line, Segment, Vec2 } from './types.js';
import { arcParamOfAngle, closestPoint, endOf, pointAt, startOf } from './segment.js';
import { cross, dist, dot, sub } from './vec.js';

/** A meeting point of two segments: parameters on each (0..1) and the point. */
export type Hit = Readonly<{ t: number; u: number; point: Vec2 }>;

/**
 * Every point where two segments meet, including the ends of overlapping stretches (collinear
 * lines, arcs on one circle), so that splitting at them separates shared from unshared pieces.
 * tolMm decides when points are the same.
 */
export function intersectSegments(a: Segment, b: Segment, tolMm: number): Hit[] {
  if (a.kind === 'line' && b.kind === 'line') return lineLine(a, b, tolMm);
  if (a.kind === 'line' && b.kind === 'arc') return lineArc(a, b, tolMm);
  if (a.kind === 'arc' && b.kind === 'line') return lineArc(b, a, tolMm).map((h) => ({ t: h.u, u: h.t, point: h.point }));
  return arcArc(a as Arc, b as Arc, tolMm);
}

function endpointTouches(a: Segment, b: Segment, tolMm: number): Hit[] {
  const hits: Hit[] = [];
  for (const [pa, ta] of [[startOf(a), 0], [endOf(a), 1]] as const) {
    const c = closestPoint(b, pa);
    if (c.distance <= tolMm) hits.push({ t: ta, u: c.t, point: pa });
  }
  for (const [pb, ub] of [[startOf(b), 0], [endOf(b), 1]] as const) {
    const c = closestPoint(a, pb);
    if (c.distance <= tolMm) hits.push({ t: c.t, u: ub, point: pb });
  }
  return hits;
}

function dedupe(hits: Hit[], tolMm: number): Hit[] {
  const out: Hit[] = [];
  for (const h of hits) if (!out.some((o) => dist(o.point, h.point) <= tolMm)) out.push(h);
  return out;
}

function lineLine(a: Line, b: Line, tolMm: number): Hit[] {
  const r = sub(a.end, a.start);
  const s = sub(b.end, b.start);
  const denom = cross(r, s);
  const qp = sub(b.start, a.start);
  const lr = Math.hypot(r[0], r[1]);
  const ls = Math.hypot(s[0], s[1]);
  const hits = endpointTouches(a, b, tolMm);
  if (Math.abs(denom) > 1e-12 * lr * ls) {
    const t = cross(qp, s) / denom;
    const u = cross(qp, r) / denom;
    const et = tolMm / lr;
    const eu = tolMm / ls;
    if (t >= -et && t <= 1 + et && u >= -eu && u <= 1 + eu) {
      hits.push({ t: clamp01(t), u: clamp01(u), point: pointAt(a, clamp01(t)) });
    }
  }
  return dedupe(hits, tolMm);
}

function lineArc(l: Line, a: Arc, tolMm: number): Hit[] {
  const hits = endpointTouches(l, a, tolMm);
  const d = sub(l.end, l.start);
  const f = sub(l.start, a.center);
  const A = dot(d, d);
  const B = 2 * dot(f, d);
  const C = dot(f, f) - a.radius * a.radius;
  let disc = B * B - 4 * A * C;
  const ll = Math.sqrt(A);
  // Tangency within tolerance counts as one touching point.
  const distToCentre = Math.abs(cross(d, f)) / ll;
  if (disc < 0 && Math.abs(distToCentre - a.radius) <= tolMm) disc = 0;
  if (disc >= 0) {
    const sq = Math.sqrt(disc);
    for (const t of disc === 0 ? [-B / (2 * A)] : [(-B - sq) / (2 * A), (B * -1 + sq) / (2 * A)]) {
      const et = tolMm / ll;
      if (t < -et || t > 1 + et) continue;
      const tc = clamp01(t);
      const p = pointAt(l, tc);
      const u = arcParamOfAngle(a, Math.atan2(p[1] - a.center[1], p[0] - a.center[0]), tolMm / a.radius);
      if (!Number.isNaN(u)) hits.push({ t: tc, u, point: p });
    }
  }
  return dedupe(hits, tolMm);
}

function arcArc(a: Arc, b: Arc, tolMm: number): Hit[] {
  const hits = endpointTouches(a, b, tolMm);
  const d = dist(a.center, b.center);
  const concentric = d <= tolMm && Math.abs(a.radius - b.radius) <= tolMm;
  if (!concentric && d > 1e-12) {
    const r0 = a.radius;
    const r1 = b.radius;
    if (d <= r0 + r1 + tolMm && d >= Math.abs(r0 - r1) - tolMm) {
      const x = (d * d + r0 * r0 - r1 * r1) / (2 * d);
      const h = Math.sqrt(Math.max(0, r0 * r0 - x * x));
      const ex = [(b.center[0] - a.center[0]) / d, (b.center[1] - a.center[1]) / d];
      const base: Vec2 = [a.center[0] + ex[0] * x, a.center[1] + ex[1] * x];
      const pts: Vec2[] = h <= 1e-12 ? [base] : [
        [base[0] - ex[1] * h, base[1] + ex[0] * h],
        [base[0] + ex[1] * h, base[1] - ex[0] * h],
      ];
      for (const p of pts) {
        const t = arcParamOfAngle(a, Math.atan2(p[1] - a.center[1], p[0] - a.center[0]), tolMm / a.radius);
        const u = arcParamOfAngle(b, Math.atan2(p[1] - b.center[1], p[0] - b.center[0]), tolMm / b.radius);
        if (!Number.isNaN(t) && !Number.isNaN(u)) hits.push({ t, u, point: p });
      }
    }
  }
  return dedupe(hits, tolMm);
}

const clamp01 = (x: number): number => (x < 0 ? 0 : x > 1 ? 1 : x);
