import { bboxGap, segmentDistance, type ClosestPair } from '../geometry/distance.js';
import { arcParamOfAngle, closestPoint, lengthOf, pointAt, tangentAt } from '../geometry/segment.js';
import type { Arc, Line, Segment, Vec2 } from '../geometry/types.js';
import { cross, dist, dot, normAngle, sub } from '../geometry/vec.js';
import { distanceToBoundary, inMaterial, type PartIndex } from './partIndex.js';
import { queryBoxGrid } from './spatial.js';

/**
 * Double-normal chords inside one contour: the necks (through material) and gaps (through the
 * void) of a single loop.
 *
 * Method (a discrete look at the medial axis): for every pair of non-adjacent segments of the
 * loop, take their exact closest pair p, q (for parallel lines or concentric arcs, the middle of
 * the stretch where they face each other). Keep it when
 *  1. moving p or q along the loop in either direction does not shorten the chord to first order
 *     (so the chord is normal to the boundary at both ends, or sits in a corner's normal cone) —
 *     this drops chords across a fillet or a short segment between the two pieces;
 *  2. the disc with the chord as diameter holds no boundary point of any contour — then its centre
 *     lies on the medial axis with radius |pq|/2, and the chord crosses nothing.
 * The chord is a neck when its midpoint is in material, a gap when it is in the void. The
 * narrowest neck of a waist is the minimum of these widths along it.
 */
export type Chord = Readonly<{ contour: number; p: Vec2; q: Vec2; widthMm: number; through: 'material' | 'void' }>;

const FIRST_ORDER_EPS = 1e-6;

/** Every double-normal chord of each loop up to maxWidthMm wide. */
export function loopChords(ix: PartIndex, maxWidthMm: number): Chord[] {
  const out: Chord[] = [];
  for (const c of ix.contours) {
    const n = c.loop.length;
    if (n < 3) continue;
    const baseId = ix.firstSeg[c.index];
    // cum[k]: loop length before segment k. A chord whose disc is empty splits the loop into two
    // paths that go round the disc, each at least π/2 × the chord; pairs of pieces closer than
    // that along the loop cannot carry one (this prunes neighbours on a finely divided curve).
    const cum: number[] = [0];
    for (let k = 0; k < n; k++) cum.push(cum[k] + lengthOf(c.loop[k]));
    const total = cum[n];
    for (let i = 0; i < n; i++) {
      const si = ix.segs[baseId + i];
      for (const id of queryBoxGrid(ix.segGrid, si.box, maxWidthMm)) {
        const sj = ix.segs[id];
        if (sj.contour !== c.index) continue;
        const j = sj.seg;
        if (j <= i || j === i + 1 || (i === 0 && j === n - 1)) continue;
        const alongMax = Math.min(cum[j + 1] - cum[i], total - cum[j] + cum[i + 1]);
        if (alongMax < (Math.PI / 2) * bboxGap(si.box, sj.box) * (1 - 1e-9)) continue;
        const pair = facingPair(si.s, sj.s);
        if (pair.distance > maxWidthMm || pair.distance <= 0) continue;
        if (!isNormalAtEnds(c.loop, i, pair.t, pair.p, pair.q) || !isNormalAtEnds(c.loop, j, pair.u, pair.q, pair.p)) continue;
        const mid: Vec2 = [(pair.p[0] + pair.q[0]) / 2, (pair.p[1] + pair.q[1]) / 2];
        const r = pair.distance / 2;
        const tol = 1e-7 + 1e-9 * pair.distance;
        if (distanceToBoundary(ix, mid, r, r - tol) < r - tol) continue;
        out.push({ contour: c.index, p: pair.p, q: pair.q, widthMm: pair.distance, through: inMaterial(ix, mid) ? 'material' : 'void' });
      }
    }
  }
  return out;
}

/**
 * Closest pair of two segments; where the minimum is attained along a whole stretch (parallel
 * lines, concentric arcs) the pair in the middle of the stretch, so that the chord is normal at
 * interior points rather than at a corner.
 */
export function facingPair(a: Segment, b: Segment): ClosestPair {
  const base = segmentDistance(a, b);
  if (a.kind === 'line' && b.kind === 'line') return parallelMid(a, b) ?? base;
  if (a.kind === 'arc' && b.kind === 'arc') return concentricMid(a, b) ?? base;
  return base;
}

function parallelMid(a: Line, b: Line): ClosestPair | null {
  const d = sub(a.end, a.start);
  const e = sub(b.end, b.start);
  const la = Math.hypot(d[0], d[1]);
  const lb = Math.hypot(e[0], e[1]);
  if (la === 0 || lb === 0 || Math.abs(cross(d, e)) > 1e-9 * la * lb) return null;
  const proj = (p: Vec2): number => dot(sub(p, a.start), d) / (la * la);
  const t0 = Math.max(0, Math.min(proj(b.start), proj(b.end)));
  const t1 = Math.min(1, Math.max(proj(b.start), proj(b.end)));
  if (t1 < t0) return null;
  const t = (t0 + t1) / 2;
  const p = pointAt(a, t);
  const c = closestPoint(b, p);
  return { distance: dist(p, c.point), p, t, q: c.point, u: c.t };
}

function concentricMid(a: Arc, b: Arc): ClosestPair | null {
  if (dist(a.center, b.center) > 1e-9 * Math.max(a.radius, b.radius)) return null;
  const ends = (s: Arc): number[] => [s.startRad, s.startRad + s.sweepRad];
  const shared = [...ends(a).filter((x) => !Number.isNaN(arcParamOfAngle(b, x, 1e-12))), ...ends(b).filter((x) => !Number.isNaN(arcParamOfAngle(a, x, 1e-12)))];
  if (shared.length < 2) return null;
  const [x, y] = [shared[0], shared[1]];
  let m = x + normAngle(y - x) / 2;
  if (Number.isNaN(arcParamOfAngle(a, m, 0)) || Number.isNaN(arcParamOfAngle(b, m, 0))) m += Math.PI;
  const t = arcParamOfAngle(a, m, 0);
  const u = arcParamOfAngle(b, m, 0);
  if (Number.isNaN(t) || Number.isNaN(u)) return null;
  const p = pointAt(a, t);
  const q = pointAt(b, u);
  return { distance: dist(p, q), p, t, q, u };
}

/** Does moving p along the loop (segment k at parameter t) in either direction keep |pq| from shrinking? */
function isNormalAtEnds(loop: readonly Segment[], k: number, t: number, p: Vec2, q: Vec2): boolean {
  const n = loop.length;
  const w = sub(q, p);
  const L = Math.hypot(w[0], w[1]);
  const eps = FIRST_ORDER_EPS * L;
  const atStart = t <= 1e-12;
  const atEnd = t >= 1 - 1e-12;
  const fwd = atEnd ? tangentAt(loop[(k + 1) % n], 0) : tangentAt(loop[k], t);
  const bwd = atStart ? tangentAt(loop[(k - 1 + n) % n], 1) : tangentAt(loop[k], t);
  return dot(fwd, w) <= eps && -dot(bwd, w) <= eps;
}
