import type { Frame } from './frame.js';
import type { Feature, Part } from './part.js';
import { arc, endOf, line, startOf, tangentAt } from './segment.js';
import type { Loop, Segment, Vec2 } from './types.js';
import { loopProblem } from './validate.js';
import { add, cross, dist, dot, normAngle, scale, sub, unit } from './vec.js';

/**
 * Corner reliefs: where a square tab must seat fully in a slot or cut-out, the router's round
 * inside corners are cut past with a relief sized to the tool.
 * - dogbone: a disc centred on the corner's bisector, its edge through the corner;
 * - T-bone: a disc centred on the shorter adjacent side, one radius back from the corner, so the
 *   relief runs along the longer side and the long walls stay straight where the tab bears.
 * The relief radius is the tool radius plus RELIEF_CLEARANCE_MM, so the tool-centre path of the
 * relief is a small circle rather than a single point (CAM drops zero-length paths).
 */
export type CornerRelief = 'none' | 'dogbone' | 'tbone';

/** Relief radius beyond the tool radius. mm. Common practice, no source: a few hundredths. */
export const RELIEF_CLEARANCE_MM = 0.05;

/** Corners turning less than this are left alone: the cutter's radius there removes almost nothing. rad. */
const MIN_RELIEF_TURN_RAD = (30 * Math.PI) / 180;

/** A joint turning right by more than this is a sharp inside corner (material on the left). rad. */
const SHARP_TURN_RAD = 1e-4;

export type InsideCorner = Readonly<{ contour: number; seg: number; at: Vec2; turnRad: number }>;

/**
 * Sharp inside corners of a loop: joints where the boundary turns right (into the material, which
 * lies on the left). seg is the segment ending at the corner.
 */
export function sharpInsideCorners(loop: Loop, contour: number): InsideCorner[] {
  const out: InsideCorner[] = [];
  if (loop.length === 1) return out;
  for (let k = 0; k < loop.length; k++) {
    const a = loop[k];
    const b = loop[(k + 1) % loop.length];
    const tin = tangentAt(a, 1);
    const tout = tangentAt(b, 0);
    const turn = Math.atan2(cross(tin, tout), dot(tin, tout));
    if (turn < -SHARP_TURN_RAD) out.push({ contour, seg: k, at: endOf(a), turnRad: turn });
  }
  return out;
}

export type ReliefResult = Readonly<{ part: Part; added: number; skipped: number }>;

/**
 * Reliefs at every sharp inside corner between two straight sides of an inner contour (slots and
 * cut-outs; the outline is unchanged). A corner whose relief would use up a whole side is skipped
 * and counted. Pure.
 * @param toolDiameterMm router bit diameter, > 0 (RangeError otherwise)
 * @example relieveCorners(part, 3.175, 'dogbone').added
 */
export function relieveCorners(part: Part, toolDiameterMm: number, style: Exclude<CornerRelief, 'none'> = 'dogbone'): ReliefResult {
  if (!(toolDiameterMm > 0)) throw new RangeError(`tool diameter must be positive, got ${toolDiameterMm} mm`);
  const r = toolDiameterMm / 2 + RELIEF_CLEARANCE_MM;
  let added = 0;
  let skipped = 0;
  const features: Feature[] = part.features.map((f) => {
    const res = relieveLoop(f.loop, r, style);
    added += res.added;
    skipped += res.skipped;
    return res.added ? { ...f, loop: res.loop } : f;
  });
  return { part: added ? { ...part, features } : part, added, skipped };
}

/** Where a relief cuts into one corner: the incoming side ends at p1, the arc runs to p2, the outgoing side starts at p2. */
type Relief = { p1: Vec2; p2: Vec2; arc: Segment };

function dogbone(V: Vec2, a: Vec2, b: Vec2, r: number): Relief {
  const u = unit(sub(b, a)); // bisector pointing into the void
  const C = add(V, scale(u, r));
  const p1 = add(V, scale(a, 2 * r * dot(a, u))); // back along the incoming side
  const p2 = add(V, scale(b, 2 * r * dot(b, u))); // on along the outgoing side
  const ang = (p: Vec2): number => Math.atan2(p[1] - C[1], p[0] - C[0]);
  const t1 = ang(p1);
  // Clockwise round the far side of the disc, through the corner V.
  const cw = -normAngle(t1 - ang(p2));
  const passesV = normAngle(t1 - ang(V)) <= normAngle(t1 - ang(p2));
  return { p1, p2, arc: arc(C, r, t1, passesV ? cw : normAngle(ang(p2) - t1)) };
}

/**
 * T-bone on the incoming side (its centre one radius back along it): a half disc into the material
 * on the side's left, from p1 = V − 2r·a back to the corner; or mirrored onto the outgoing side.
 * Material lies on the left, so the half turn is clockwise (sweep −π).
 */
function tbone(V: Vec2, a: Vec2, b: Vec2, r: number, onIncoming: boolean): Relief {
  if (onIncoming) {
    const C = sub(V, scale(a, r));
    const p1 = sub(V, scale(a, 2 * r));
    return { p1, p2: V, arc: arc(C, r, Math.atan2(-a[1], -a[0]), -Math.PI) };
  }
  const C = add(V, scale(b, r));
  const p2 = add(V, scale(b, 2 * r));
  return { p1: V, p2, arc: arc(C, r, Math.atan2(-b[1], -b[0]), -Math.PI) };
}

/**
 * Corners whose relief leaves a side with no length: each straight side loses the pieces its
 * reliefs take and must keep a positive length in its own direction.
 */
function crowded(loop: Loop, reliefs: ReadonlyMap<number, Relief>): number[] {
  const n = loop.length;
  const out: number[] = [];
  for (const [k, rel] of reliefs) {
    const sa = loop[k];
    const before = reliefs.get((k - 1 + n) % n);
    const from = before ? before.p2 : startOf(sa);
    const nextK = (k + 1) % n;
    const after = reliefs.get(nextK);
    const sb = loop[nextK];
    const toB = after ? after.p1 : endOf(sb);
    const okA = dist(from, rel.p1) > 1e-6 && dot(sub(rel.p1, from), tangentAt(sa, 1)) > 0;
    const okB = dist(rel.p2, toB) > 1e-6 && dot(sub(toB, rel.p2), tangentAt(sb, 0)) > 0;
    if (!okA || !okB) out.push(k);
  }
  return out;
}

function relieveLoop(loop: Loop, r: number, style: Exclude<CornerRelief, 'none'>): { loop: Loop; added: number; skipped: number } {
  const n = loop.length;
  const reliefs = new Map<number, Relief>();
  const corners = new Map<number, { at: Vec2; a: Vec2; b: Vec2; shorterIncoming: boolean }>();
  for (const c of sharpInsideCorners(loop, 0)) {
    const sa = loop[c.seg];
    const sb = loop[(c.seg + 1) % n];
    if (sa.kind !== 'line' || sb.kind !== 'line' || Math.abs(c.turnRad) < MIN_RELIEF_TURN_RAD) continue;
    const a = tangentAt(sa, 1);
    const b = tangentAt(sb, 0);
    // T-bone: centred on the shorter side, so the relief runs along the longer one.
    const shorterIncoming = dist(sa.start, sa.end) <= dist(sb.start, sb.end);
    corners.set(c.seg, { at: c.at, a, b, shorterIncoming });
    reliefs.set(c.seg, style === 'dogbone' ? dogbone(c.at, a, b, r) : tbone(c.at, a, b, r, shorterIncoming));
  }
  // A T-bone that does not fit its shorter side (a slot narrower than two reliefs) moves to the longer one.
  if (style === 'tbone') {
    for (const k of crowded(loop, reliefs)) {
      const c = corners.get(k)!;
      reliefs.set(k, tbone(c.at, c.a, c.b, r, !c.shorterIncoming));
    }
  }
  const failing = crowded(loop, reliefs);
  for (const k of failing) reliefs.delete(k);
  const skipped = failing.length;
  if (reliefs.size === 0) return { loop, added: 0, skipped };
  const out: Segment[] = [];
  for (let k = 0; k < n; k++) {
    const s = loop[k];
    const before = reliefs.get((k - 1 + n) % n);
    const after = reliefs.get(k);
    if (s.kind === 'line') out.push(line(before ? before.p2 : s.start, after ? after.p1 : s.end));
    else out.push(s);
    if (after) out.push(after.arc);
  }
  if (loopProblem(out)) return { loop, added: 0, skipped: skipped + reliefs.size };
  return { loop: out, added: reliefs.size, skipped };
}

/**
 * Reliefs on every part of a frame (see relieveCorners); the frame's other data is kept.
 * Returns the edited frame and how many reliefs were added and skipped. Pure.
 */
export function relieveFrame(frame: Frame, toolDiameterMm: number, style: Exclude<CornerRelief, 'none'> = 'dogbone'): { frame: Frame; added: number; skipped: number } {
  let added = 0;
  let skipped = 0;
  const parts: Part[] = frame.parts.map((p) => {
    const r = relieveCorners(p, toolDiameterMm, style);
    added += r.added;
    skipped += r.skipped;
    return r.part;
  });
  return { frame: { ...frame, parts }, added, skipped };
}
