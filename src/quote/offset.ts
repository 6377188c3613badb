import { JoinType, EndType, areaPathsD, inflatePathsD, type PathsD } from 'clipper2-ts';
import {
  arc,
  asCircle,
  assertNever,
  carrierHits,
  carrierOf,
  pointAt,
  endOf,
  flattenLoop,
  line,
  loopProblem,
  reverseLoop,
  signedArea,
  SMOOTH_JOINT_RAD,
  tangentAt,
  type Arc,
  type Loop,
  type Segment,
  type Vec2,
} from '../geometry/index.js';
import { cross, dist, dot, sub } from '../geometry/vec.js';

/** Offset pieces shorter than this are dropped as numerical leftovers. mm. */
const OFFSET_MIN_PIECE_MM = 1e-7;

/** Chord tolerance of the independent polygon offset that guards the exact one. mm. */
const GUARD_CHORD_MM = 0.002;

/** Largest relative area difference between the exact offset and the polygon guard. */
const GUARD_REL_AREA = 2e-3;

export type OffsetResult =
  | Readonly<{ kind: 'exact'; loop: Loop }>
  /** The exact construction failed its guard (global self-overlap); the polygon offset is used. */
  | Readonly<{ kind: 'polygon'; loop: Loop }>
  /** Nothing is left: the contour is narrower than the tool everywhere. */
  | Readonly<{ kind: 'collapsed' }>;

/** A piece of the offset: a carrier (line or full arc) and the parameter window kept on it. */
type Piece = { seg: Segment; t0: number; t1: number; join: boolean };

/**
 * Offset a closed loop by distMm to the right of its direction of travel: outward for a
 * counter-clockwise outline, into the hole for a clockwise inner contour — where a router's tool
 * centre runs. Exact on lines and arcs: each segment is offset, convex corners are joined with arcs
 * of radius distMm about the corner, concave ones trimmed where the offset pieces meet, and pieces
 * that the trimming consumes (arcs tighter than the tool, short edges in a narrow notch) drop out.
 * The result is guarded by an independent polygon offset (clipper2); when the two disagree (the
 * offset overlaps itself far from any corner) the polygon offset, within 0.002 mm, is returned.
 * @param distMm tool radius, mm, > 0.
 * @throws Error when distMm is not positive and finite (a bug in the caller, not user input).
 */
export function offsetRight(loop: Loop, distMm: number): OffsetResult {
  if (!(distMm > 0) || !Number.isFinite(distMm)) throw new Error(`offset distance must be positive (${distMm})`);
  const ccw = signedArea(loop) > 0;
  const guardArea = polygonOffsetArea(loop, distMm, ccw);
  const circle = asCircle(loop);
  if (circle) {
    const s = loop[0] as Arc;
    const r = s.sweepRad > 0 ? s.radius + distMm : s.radius - distMm;
    if (r <= OFFSET_MIN_PIECE_MM) return { kind: 'collapsed' };
    return { kind: 'exact', loop: [arc(s.center, r, s.startRad, s.sweepRad)] };
  }
  const exact = exactOffset(loop, distMm);
  if (exact && guardArea > 0) {
    const a = Math.abs(signedArea(exact));
    const sameSense = signedArea(exact) > 0 === ccw;
    if (sameSense && Math.abs(a - guardArea) <= GUARD_REL_AREA * guardArea + 0.01 && loopProblem(exact) === null) {
      return { kind: 'exact', loop: exact };
    }
  }
  if (guardArea <= 0) return { kind: 'collapsed' };
  return { kind: 'polygon', loop: polygonOffsetLoop(loop, distMm, ccw) };
}

function offsetSegment(s: Segment, d: number): Segment | null {
  switch (s.kind) {
    case 'line': {
      const t = tangentAt(s, 0);
      const n: Vec2 = [t[1] * d, -t[0] * d];
      return line([s.start[0] + n[0], s.start[1] + n[1]], [s.end[0] + n[0], s.end[1] + n[1]]);
    }
    case 'arc': {
      // Right of travel is away from the centre on a counter-clockwise arc, towards it on a clockwise one.
      const r = s.sweepRad > 0 ? s.radius + d : s.radius - d;
      return r > OFFSET_MIN_PIECE_MM ? arc(s.center, r, s.startRad, s.sweepRad) : null;
    }
    default:
      return assertNever(s);
  }
}

const pieceStart = (p: Piece): Vec2 => pointAt(p.seg, p.t0);
const pieceEnd = (p: Piece): Vec2 => pointAt(p.seg, p.t1);

/** Point on the carrier at any parameter (lines and arcs extend beyond [0, 1]). */
/** Parameter of a point on the carrier; for arcs the turn nearest `near`. */
function paramOf(s: Segment, p: Vec2, near: number): number {
  if (s.kind === 'line') {
    const d = sub(s.end, s.start);
    return dot(sub(p, s.start), d) / dot(d, d);
  }
  const ang = Math.atan2(p[1] - s.center[1], p[0] - s.center[0]);
  const base = (ang - s.startRad) / s.sweepRad;
  const period = (2 * Math.PI) / Math.abs(s.sweepRad);
  return base + Math.round((near - base) / period) * period;
}

/** The exact offset, or null when the construction cannot close (the caller falls back). */
function exactOffset(loop: Loop, d: number): Loop | null {
  const n = loop.length;
  // 1. Offset every segment; remember which original vertex follows it, for convex joins.
  const pieces: Piece[] = [];
  for (let i = 0; i < n; i++) {
    const o = offsetSegment(loop[i], d);
    const next = loop[(i + 1) % n];
    const turn = cross(tangentAt(loop[i], 1), tangentAt(next, 0));
    const turnAngle = Math.atan2(turn, dot(tangentAt(loop[i], 1), tangentAt(next, 0)));
    if (o) pieces.push({ seg: o, t0: 0, t1: 1, join: false });
    if (o && offsetSegment(next, d) && turnAngle > SMOOTH_JOINT_RAD) {
      // Left turn = the offset pieces part company: a convex corner, rounded by an arc about it.
      const v = endOf(loop[i]);
      const a0 = Math.atan2(endOf(o)[1] - v[1], endOf(o)[0] - v[0]);
      pieces.push({ seg: arc(v, d, a0, turnAngle), t0: 0, t1: 1, join: true });
    }
  }
  if (pieces.length < 2) return null;
  // 2. Trim every unconnected neighbour pair where the carriers meet; drop pieces consumed by it.
  for (let guard = 0; guard < 4 * pieces.length + 8; guard++) {
    let changed = false;
    for (let i = 0; i < pieces.length && pieces.length >= 2; i++) {
      const a = pieces[i];
      const b = pieces[(i + 1) % pieces.length];
      const e = pieceEnd(a);
      const s = pieceStart(b);
      if (dist(e, s) <= 1e-9) continue;
      const hits = carrierHits(carrierOf(a.seg), carrierOf(b.seg));
      if (hits.length === 0) return null;
      const mid: Vec2 = [(e[0] + s[0]) / 2, (e[1] + s[1]) / 2];
      const p = hits.reduce((best, h) => (dist(h, mid) < dist(best, mid) ? h : best));
      a.t1 = paramOf(a.seg, p, a.t1);
      b.t0 = paramOf(b.seg, p, b.t0);
      changed = true;
    }
    const before = pieces.length;
    for (let i = pieces.length - 1; i >= 0; i--) {
      const p = pieces[i];
      const lenMm = pieceLength(p);
      if (p.t1 - p.t0 <= 0 || lenMm <= OFFSET_MIN_PIECE_MM) {
        // Its neighbours no longer meet; the next sweep trims them against each other.
        pieces.splice(i, 1);
      }
    }
    if (pieces.length < 2) return null;
    if (!changed && pieces.length === before) break;
    if (pieces.length === before && allConnected(pieces)) break;
  }
  if (!allConnected(pieces)) return null;
  return pieces.map(toSegment);
}

function allConnected(pieces: readonly Piece[]): boolean {
  return pieces.every((p, i) => dist(pieceEnd(p), pieceStart(pieces[(i + 1) % pieces.length])) <= 1e-7);
}

function pieceLength(p: Piece): number {
  const s = p.seg;
  if (s.kind === 'line') return dist(s.start, s.end) * (p.t1 - p.t0);
  return Math.abs(s.sweepRad) * s.radius * (p.t1 - p.t0);
}

function toSegment(p: Piece): Segment {
  const s = p.seg;
  if (s.kind === 'line') return line(pointAt(s, p.t0), pointAt(s, p.t1));
  return arc(s.center, s.radius, s.startRad + s.sweepRad * p.t0, s.sweepRad * (p.t1 - p.t0));
}

/** Offset region of the loop by clipper2 (flattened, round joins), as positive paths. */
function polygonOffsetPaths(loop: Loop, d: number, ccw: boolean): PathsD {
  // Work on the region to the right of travel: a hole's interior (reversed to CCW) or the outline.
  const region = ccw ? loop : reverseLoop(loop);
  const pts = flattenLoop(region, GUARD_CHORD_MM).map(([x, y]) => ({ x, y }));
  const delta = ccw ? d : -d;
  return inflatePathsD([pts], delta, JoinType.Round, EndType.Polygon, 2, 6, GUARD_CHORD_MM);
}

function polygonOffsetArea(loop: Loop, d: number, ccw: boolean): number {
  return Math.abs(areaPathsD(polygonOffsetPaths(loop, d, ccw)));
}

function polygonOffsetLoop(loop: Loop, d: number, ccw: boolean): Loop {
  const paths = polygonOffsetPaths(loop, d, ccw);
  // The largest path is the tool path; slivers a narrow neck splits off cannot be reached anyway.
  let best = paths[0];
  for (const p of paths) if (Math.abs(areaPathsD([p])) > Math.abs(areaPathsD([best]))) best = p;
  const poly: Loop = best.map((q, i) => line([q.x, q.y], [best[(i + 1) % best.length].x, best[(i + 1) % best.length].y]));
  const positive = signedArea(poly) > 0 ? poly : reverseLoop(poly);
  return ccw ? positive : reverseLoop(positive);
}
