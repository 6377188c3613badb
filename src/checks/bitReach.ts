import { EndType, JoinType, inflatePathsD, type PathsD } from 'clipper2-ts';
import { distanceToLoop, isInside } from '../geometry/inside.js';
import { asCircle, flattenLoop, loopBBox, reverseLoop } from '../geometry/loop.js';
import { endOf, tangentAt } from '../geometry/segment.js';
import type { Loop, Vec2 } from '../geometry/types.js';
import { cross, dot } from '../geometry/vec.js';
import { radToDeg } from '../params/units.js';
import type { Chord } from './chords.js';
import { finding, mid, mm } from './finding.js';
import type { CheckOptions } from './options.js';
import type { PartIndex } from './partIndex.js';
import type { Finding } from './types.js';

export const BIT_RULE = 'bit-reach';

/** A joint turning right by more than this is a sharp inside corner (material on the left). rad. */
const SHARP_TURN_RAD = 1e-4;

/**
 * Material the cutter leaves in an inside corner below this depth is not reported: a finely
 * divided curve turns a little at every vertex. mm. Common practice, no source: about what a
 * router holds.
 */
export const CORNER_LEFTOVER_MM = 0.01;

/**
 * Depth of material a tool of radius R leaves in an inside corner that turns by turnRad (radius
 * rho: 0 for a sharp corner), measured on the bisector: (R − rho)(1/cos(turn/2) − 1). mm.
 */
export function cornerLeftoverMm(toolRadiusMm: number, cornerRadiusMm: number, turnRad: number): number {
  const half = Math.abs(turnRad) / 2;
  if (half >= Math.PI / 2 - 1e-9) return Infinity;
  return Math.max(0, toolRadiusMm - cornerRadiusMm) * (1 / Math.cos(half) - 1);
}

/** Chord tolerance for the polygon offset that decides whether a cut-out vanishes. mm. */
const VANISH_CHORD_MM = 0.002;

/** Margin of the vanish test: 10 × the chord tolerance, so flattening cannot decide it. mm. */
const VANISH_MARGIN_MM = 10 * VANISH_CHORD_MM;

/** Tolerance when comparing a gap or radius with the tool. mm. */
const TOOL_TOL_MM = 1e-6;

export type InsideCorner = Readonly<{ contour: number; seg: number; at: Vec2; turnRad: number }>;

/**
 * Sharp inside corners of a loop: joints where the boundary turns right (into the material, which
 * lies on the left). seg is the segment ending at the corner.
 */
export function sharpInsideCorners(loop: Loop, contour: number): InsideCorner[] {
  const out: InsideCorner[] = [];
  for (let k = 0; k < loop.length; k++) {
    const a = loop[k];
    const b = loop[(k + 1) % loop.length];
    if (loop.length === 1) break;
    const tin = tangentAt(a, 1);
    const tout = tangentAt(b, 0);
    const turn = Math.atan2(cross(tin, tout), dot(tin, tout));
    if (turn < -SHARP_TURN_RAD) out.push({ contour, seg: k, at: endOf(a), turnRad: turn });
  }
  return out;
}

/**
 * Is some point of the void deeper than the tool radius plus the vanish margin? Then the eroded
 * void is not empty, exactly (distances to true arcs). Tries the centres of the loop's arcs and of
 * its bounding box, which settles slots, rounded cut-outs and strap slots; false only means "not
 * shown this way".
 */
function clearlyEnterable(loop: Loop, toolRadiusMm: number): boolean {
  const b = loopBBox(loop);
  const candidates: Vec2[] = [[(b[0] + b[2]) / 2, (b[1] + b[3]) / 2], ...loop.flatMap((s) => (s.kind === 'arc' ? [s.center] : []))];
  return candidates.some((p) => isInside(loop, p) && distanceToLoop(loop, p) > toolRadiusMm + VANISH_MARGIN_MM);
}

/**
 * Does the void of this inner contour disappear when eroded by the tool radius? A point deeper
 * than the tool radius answers no at once; otherwise a polygon offset (clipper2) decides.
 */
export function vanishesForTool(loop: Loop, toolRadiusMm: number): boolean {
  if (clearlyEnterable(loop, toolRadiusMm)) return false;
  const pts = flattenLoop(reverseLoop(loop), VANISH_CHORD_MM);
  const paths: PathsD = [pts.map(([x, y]) => ({ x, y }))];
  const shrunk = inflatePathsD(paths, -(toolRadiusMm - VANISH_MARGIN_MM), JoinType.Round, EndType.Polygon, 2, 6, VANISH_CHORD_MM);
  return shrunk.length === 0;
}

/**
 * Rule 3, router-bit reach: inside corners sharper than the tool radius (what the cutter leaves),
 * gaps and slots narrower than the tool (void chords), round holes smaller than the tool (drill
 * them), and cut-outs the tool cannot enter at all.
 */
export function bitReachRule(ix: PartIndex, o: CheckOptions, chords: readonly Chord[]): Finding[] {
  if (!o.limits['bit-reach'].enabled) return [];
  const name = ix.part.name;
  const D = o.toolDiameterMm;
  const R = D / 2;
  const out: Finding[] = [];
  const blocked = new Set<number>();
  for (const c of ix.contours) {
    if (c.index === 0) continue;
    const circle = asCircle(c.loop);
    if (circle) {
      if (2 * circle.radius < D - TOOL_TOL_MM) {
        blocked.add(c.index);
        out.push(finding(BIT_RULE, 'warning', name, 2 * circle.radius, D, 'mm', circle.center,
          `${c.label} is smaller than the ${mm(D, 3)} tool: it must be drilled (or cut with a smaller bit)`));
      }
      continue;
    }
    if (vanishesForTool(c.loop, R)) {
      blocked.add(c.index);
      out.push(finding(BIT_RULE, 'error', name, null, D, 'mm', mid(c.bbox.slice(0, 2) as unknown as Vec2, c.bbox.slice(2) as unknown as Vec2),
        `${c.label}: the ${mm(D, 3)} tool cannot enter this cut-out at all; widen it or choose a smaller bit`));
    }
  }
  const gaps = new Map<number, Chord[]>();
  for (const ch of chords) {
    if (ch.through !== 'void' || ch.widthMm >= D - TOOL_TOL_MM || blocked.has(ch.contour)) continue;
    gaps.set(ch.contour, [...(gaps.get(ch.contour) ?? []), ch]);
  }
  for (const [k, list] of gaps) {
    blocked.add(k);
    const narrowest = list.reduce((m, c) => (c.widthMm < m.widthMm ? c : m));
    out.push(finding(BIT_RULE, 'error', name, narrowest.widthMm, D, 'mm', mid(narrowest.p, narrowest.q),
      `${ix.contours[k].label}: gap ${mm(narrowest.widthMm)} is narrower than the ${mm(D, 3)} tool${list.length > 1 ? ` (${list.length} places)` : ''}; it cannot be cut as drawn`));
  }
  for (const c of ix.contours) {
    if (blocked.has(c.index)) continue;
    for (const k of sharpInsideCorners(c.loop, c.index)) {
      if (cornerLeftoverMm(R, 0, k.turnRad) < CORNER_LEFTOVER_MM) continue;
      out.push(finding(BIT_RULE, 'warning', name, 0, R, 'mm', k.at,
        `sharp inside corner of the ${c.label} (turns ${Math.abs(radToDeg(k.turnRad)).toFixed(0)}°): the cutter leaves a ${mm(R)} radius; use --relieve-corners if a square part must fit here`));
    }
    c.loop.forEach((s) => {
      if (s.kind !== 'arc' || s.sweepRad >= 0 || Math.abs(s.sweepRad) >= 2 * Math.PI - 1e-9) return;
      if (s.radius >= R - TOOL_TOL_MM || cornerLeftoverMm(R, s.radius, s.sweepRad) < CORNER_LEFTOVER_MM) return;
      const at = endOf({ ...s, sweepRad: s.sweepRad / 2 });
      out.push(finding(BIT_RULE, 'warning', name, s.radius, R, 'mm', at,
        `inside radius ${mm(s.radius)} of the ${c.label} is below the tool radius: the cutter leaves ${mm(R)}`));
    });
  }
  return out;
}
