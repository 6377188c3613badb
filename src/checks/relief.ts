import type { Frame } from '../geometry/frame.js';
import type { Feature, Part } from '../geometry/part.js';
import { arc, endOf, line, startOf, tangentAt } from '../geometry/segment.js';
import type { Loop, Segment, Vec2 } from '../geometry/types.js';
import { loopProblem } from '../geometry/validate.js';
import { add, dist, dot, normAngle, scale, sub, unit } from '../geometry/vec.js';
import { sharpInsideCorners } from './bitReach.js';

/** Corners turning less than this are left alone: the cutter's radius there removes almost nothing. rad. */
const MIN_RELIEF_TURN_RAD = (30 * Math.PI) / 180;

export type ReliefResult = Readonly<{ part: Part; added: number; skipped: number }>;

/**
 * Dogbone reliefs: at every sharp inside corner between two straight sides of an inner contour
 * (a slot or cut-out a square tab must enter), the contour is extended by a disc of the tool radius
 * centred on the corner's bisector one radius from the corner, so the cutter reaches the corner
 * itself. A corner whose relief would use up a whole side (too short a side) is skipped and counted.
 * The part's outline is unchanged. Pure; re-check the result with checkParts.
 * @param toolDiameterMm router bit diameter, > 0 (RangeError otherwise)
 */
export function relieveCorners(part: Part, toolDiameterMm: number): Part {
  return relieveCornersDetailed(part, toolDiameterMm).part;
}

export function relieveCornersDetailed(part: Part, toolDiameterMm: number): ReliefResult {
  if (!(toolDiameterMm > 0)) throw new RangeError(`tool diameter must be positive, got ${toolDiameterMm} mm`);
  const r = toolDiameterMm / 2;
  let added = 0;
  let skipped = 0;
  const features: Feature[] = part.features.map((f) => {
    const res = relieveLoop(f.loop, r);
    added += res.added;
    skipped += res.skipped;
    return res.added ? { ...f, loop: res.loop } : f;
  });
  return { part: added ? { ...part, features } : part, added, skipped };
}

type Relief = { p1: Vec2; p2: Vec2; arc: Segment };

function relieveLoop(loop: Loop, r: number): { loop: Loop; added: number; skipped: number } {
  const n = loop.length;
  const reliefs = new Map<number, Relief>();
  let skipped = 0;
  for (const c of sharpInsideCorners(loop, 0)) {
    const sa = loop[c.seg];
    const sb = loop[(c.seg + 1) % n];
    if (sa.kind !== 'line' || sb.kind !== 'line' || Math.abs(c.turnRad) < MIN_RELIEF_TURN_RAD) continue;
    const V = c.at;
    const a = tangentAt(sa, 1);
    const b = tangentAt(sb, 0);
    const u = unit(sub(b, a)); // bisector pointing into the void
    const C = add(V, scale(u, r));
    const s1 = 2 * r * dot(a, u); // ≤ 0: back along the incoming side
    const s2 = 2 * r * dot(b, u); // ≥ 0: on along the outgoing side
    const p1 = add(V, scale(a, s1));
    const p2 = add(V, scale(b, s2));
    const ang = (p: Vec2): number => Math.atan2(p[1] - C[1], p[0] - C[0]);
    const t1 = ang(p1);
    const tv = ang(V);
    // Go round the far side of the disc, through the corner V.
    const cw = -normAngle(t1 - ang(p2));
    const passesV = normAngle(t1 - tv) <= normAngle(t1 - ang(p2));
    const sweep = passesV ? cw : normAngle(ang(p2) - t1);
    reliefs.set(c.seg, { p1, p2, arc: arc(C, r, t1, sweep) });
  }
  // Each straight side loses the pieces its reliefs take; it must keep a positive length.
  for (const [k, rel] of [...reliefs]) {
    const sa = loop[k];
    const startTrim = reliefs.get((k - 1 + n) % n);
    const from = startTrim ? startTrim.p2 : startOf(sa);
    const nextK = (k + 1) % n;
    const nextRel = reliefs.get(nextK);
    const sb = loop[nextK];
    const okA = dist(from, rel.p1) > 1e-6 && dot(sub(rel.p1, from), tangentAt(sa, 1)) > 0;
    const toB = nextRel ? nextRel.p1 : endOf(sb);
    const okB = dist(rel.p2, toB) > 1e-6 && dot(sub(toB, rel.p2), tangentAt(sb, 0)) > 0;
    if (!okA || !okB) {
      reliefs.delete(k);
      skipped++;
    }
  }
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
 * Dogbone reliefs on every part of a frame (see relieveCorners); the frame's other data is kept.
 * Returns the edited frame and how many reliefs were added and skipped. Pure.
 */
export function relieveFrame(frame: Frame, toolDiameterMm: number): { frame: Frame; added: number; skipped: number } {
  let added = 0;
  let skipped = 0;
  const parts: Part[] = frame.parts.map((p) => {
    const r = relieveCornersDetailed(p, toolDiameterMm);
    added += r.added;
    skipped += r.skipped;
    return r.part;
  });
  return { frame: { ...frame, parts }, added, skipped };
}
