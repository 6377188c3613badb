import type { Loop, Segment, Vec2 } from './types.js';
import { arc, closestPoint, endOf, startOf, subSegment, tangentAt } from './segment.js';
import { SMOOTH_JOINT_RAD } from './tolerance.js';
import { carrierHits, type Carrier } from './carriers.js';
import { cross, dist, dot, normAngle, sub } from './vec.js';

export class FilletError extends Error {
  constructor(
    message: string,
    readonly at: Vec2,
  ) {
    super(message);
  }
}

export type CornerSide = 'inside' | 'outside';

/**
 * Corners of a loop, as indices of the segment that ends there. Inside corners turn right (material
 * is on the left, so the material wraps round the corner: a router leaves its radius there);
 * outside corners turn left.
 */
export function cornerIndices(loop: Loop, side: CornerSide): number[] {
  const out: number[] = [];
  const s = Math.sin(SMOOTH_JOINT_RAD);
  for (let i = 0; i < loop.length; i++) {
    if (loop.length === 1) break;
    const ta = tangentAt(loop[i], 1);
    const tb = tangentAt(loop[(i + 1) % loop.length], 0);
    const turn = cross(ta, tb);
    const reversal = dot(ta, tb) < 0 && Math.abs(turn) <= s;
    if (side === 'inside' ? turn < -s || reversal : turn > s) out.push(i);
  }
  return out;
}

/** Indices of the segments that end at an inside corner (see cornerIndices). */
export const insideCornerIndices = (loop: Loop): number[] => cornerIndices(loop, 'inside');

/**
 * Round every inside corner of the loop with an arc of radiusMm tangent to both neighbours
 * (line–line, line–arc and arc–arc joints alike). The loop keeps its orientation.
 * Throws FilletError when a neighbouring segment is too short to take the fillet.
 */
export function filletInsideCorners(loop: Loop, radiusMm: number): Loop {
  return filletCorners(loop, radiusMm, 'inside');
}

/**
 * Round the inside or the outside corners of a loop (see filletInsideCorners). When a segment next
 * to a corner is too short to take the fillet (a small corner round, a short edge stub), the fillet
 * may reach past up to two such segments and replace them, as a rolling ball would.
 */
export function filletCorners(loop: Loop, radiusMm: number, side: CornerSide): Loop {
  if (radiusMm <= 0) return loop;
  const corners = cornerIndices(loop, side);
  if (corners.length === 0) return loop;
  const sign = side === 'inside' ? 1 : -1;
  const n = loop.length;
  const keep: Array<[number, number]> = loop.map(() => [0, 1]);
  const dropped = new Array<boolean>(n).fill(false);
  const filletAfter = new Map<number, Segment>();
  const SPANS: ReadonlyArray<[number, number]> = [[0, 0], [0, 1], [1, 0], [1, 1], [0, 2], [2, 0]];
  for (const i of corners) {
    if (dropped[i] || dropped[(i + 1) % n] || filletAfter.has(i)) continue;
    const corner = endOf(loop[i]);
    let done = false;
    for (const [before, after] of SPANS) {
      if (before + after + 2 > n) continue;
      const ia = (i - before + n) % n;
      const ib = (i + 1 + after) % n;
      const skipped = [...range(before).map((k) => (i - k + n) % n), ...range(after).map((k) => (i + 1 + k) % n)];
      if (skipped.some((k) => dropped[k]) || dropped[ia] || dropped[ib]) continue;
      const fit = fitFillet(loop[ia], loop[ib], radiusMm, sign, corner);
      if (!fit) continue;
      if (fit.ta.t < keep[ia][0] - 1e-12 || fit.tb.t > keep[ib][1] + 1e-12) continue;
      if (skipped.some((k) => closestPoint(loop[k], fit.centre).distance < radiusMm - 1e-6)) continue;
      keep[ia][1] = fit.ta.t;
      keep[ib][0] = fit.tb.t;
      for (const k of skipped) dropped[k] = true;
      const a0 = Math.atan2(fit.ta.point[1] - fit.centre[1], fit.ta.point[0] - fit.centre[0]);
      const a1 = Math.atan2(fit.tb.point[1] - fit.centre[1], fit.tb.point[0] - fit.centre[0]);
      filletAfter.set(ia, arc(fit.centre, radiusMm, a0, side === 'inside' ? -normAngle(a0 - a1) : normAngle(a1 - a0)));
      done = true;
      break;
    }
    if (!done) throw new FilletError(`a fillet of radius ${radiusMm} mm does not fit the edges next to this corner`, corner);
  }
  const out: Segment[] = [];
  for (let i = 0; i < n; i++) {
    const [t0, t1] = keep[i];
    if (!dropped[i]) {
      if (t1 - t0 < -1e-12) throw new FilletError(`fillets of radius ${radiusMm} mm overlap on one edge`, startOf(loop[i]));
      if (t1 - t0 > 1e-9) out.push(t0 === 0 && t1 === 1 ? loop[i] : subSegment(loop[i], t0, t1));
    }
    const f = filletAfter.get(i);
    if (f) out.push(f);
  }
  return out;
}

const range = (k: number): number[] => Array.from({ length: k }, (_, j) => j);

/** The tangent circle nearest the corner whose tangent points fall on both segments, or null. */
function fitFillet(a: Segment, b: Segment, radiusMm: number, sign: number, corner: Vec2) {
  for (const centre of filletCentres(a, b, radiusMm * sign, corner)) {
    const ta = closestPoint(a, centre);
    const tb = closestPoint(b, centre);
    if (Math.abs(ta.distance - radiusMm) <= 1e-6 && Math.abs(tb.distance - radiusMm) <= 1e-6) return { centre, ta, tb };
  }
  return null;
}

/**
 * Centres of circles tangent to both segments' carriers, nearest the corner first: on their right for r > 0,
 * on their left for r < 0 (|r| is the radius).
 */
function filletCentres(a: Segment, b: Segment, r: number, corner: Vec2): Vec2[] {
  return intersectOffsets(offsetRight(a, r), offsetRight(b, r)).sort((p, q) => dist(p, corner) - dist(q, corner));
}

function offsetRight(s: Segment, r: number): Carrier | null {
  if (s.kind === 'line') {
    const t = tangentAt(s, 0);
    return { kind: 'line', p: [s.start[0] + t[1] * r, s.start[1] - t[0] * r], d: t };
  }
  // Offsetting to the right moves away from the centre of a counter-clockwise arc.
  const rr = s.sweepRad > 0 ? s.radius + r : s.radius - r;
  if (rr <= 0) return null;
  return { kind: 'circle', c: s.center, r: rr };
}

const intersectOffsets = (x: Carrier | null, y: Carrier | null): Vec2[] => (x && y ? carrierHits(x, y) : []);
