import type { Segment, Vec2 } from './types.js';
import { cross, dist, dot, sub } from './vec.js';

/**
 * The unbounded curve a segment lies on: an infinite line (through p along d, any length) or a
 * full circle. Fillets and tool-path offsets meet neighbours on their carriers, not their spans.
 */
export type Carrier = Readonly<{ kind: 'line'; p: Vec2; d: Vec2 }> | Readonly<{ kind: 'circle'; c: Vec2; r: number }>;

/** The carrier of a segment. */
export const carrierOf = (s: Segment): Carrier =>
  s.kind === 'line' ? { kind: 'line', p: s.start, d: sub(s.end, s.start) } : { kind: 'circle', c: s.center, r: s.radius };

/**
 * Points where two carriers meet (0, 1 or 2). Parallel lines and concentric circles give none; a
 * tangency that rounding pushed a hair apart (1e-9 relative) still gives its one point.
 */
export function carrierHits(a: Carrier, b: Carrier): Vec2[] {
  if (a.kind === 'line' && b.kind === 'line') {
    const den = cross(a.d, b.d);
    if (Math.abs(den) < 1e-14 * Math.hypot(...a.d) * Math.hypot(...b.d)) return [];
    const t = cross(sub(b.p, a.p), b.d) / den;
    return [[a.p[0] + a.d[0] * t, a.p[1] + a.d[1] * t]];
  }
  if (a.kind === 'circle' && b.kind === 'circle') return circleCircle(a.c, a.r, b.c, b.r);
  const l = (a.kind === 'line' ? a : b) as Extract<Carrier, { kind: 'line' }>;
  const c = (a.kind === 'circle' ? a : b) as Extract<Carrier, { kind: 'circle' }>;
  const f = sub(l.p, c.c);
  const A = dot(l.d, l.d);
  const B = 2 * dot(f, l.d);
  const C = dot(f, f) - c.r * c.r;
  let disc = B * B - 4 * A * C;
  if (disc < 0) {
    if (disc > -1e-9 * B * B) disc = 0;
    else return [];
  }
  const sq = Math.sqrt(disc);
  return [(-B - sq) / (2 * A), (-B + sq) / (2 * A)].map((t) => [l.p[0] + l.d[0] * t, l.p[1] + l.d[1] * t] as Vec2);
}

function circleCircle(c0: Vec2, r0: number, c1: Vec2, r1: number): Vec2[] {
  const d = dist(c0, c1);
  if (d < 1e-12) return [];
  const x = (d * d + r0 * r0 - r1 * r1) / (2 * d);
  const h2 = r0 * r0 - x * x;
  if (h2 < -1e-9 * r0 * r0) return [];
  const h = Math.sqrt(Math.max(0, h2));
  const ex: Vec2 = [(c1[0] - c0[0]) / d, (c1[1] - c0[1]) / d];
  const base: Vec2 = [c0[0] + ex[0] * x, c0[1] + ex[1] * x];
  return [
    [base[0] - ex[1] * h, base[1] + ex[0] * h],
    [base[0] + ex[1] * h, base[1] - ex[0] * h],
  ];
}
