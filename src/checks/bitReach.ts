import { EndType, JoinType, inflatePathsD, type PathsD } from 'clipper2-ts';
import { distanceToLoop, isInside } from '../geometry/inside.js';
import { asCircle, flattenLoop, loopBBox, reverseLoop } from '../geometry/loop.js';
import { sharpInsideCorners } from '../geometry/relief.js';
import { endOf } from '../geometry/segment.js';
import type { Loop, Vec2 } from '../geometry/types.js';
import { radToDeg } from '../params/units.js';
import type { Chord } from './chords.js';
import { bitText, clearWidthMm, finding, largestBitMm, mid, mm } from './finding.js';
import { slotWidthMm } from './holes.js';
import { withArticle } from '../params/words.js';
import type { CheckOptions } from './options.js';
import type { PartIndex } from './partIndex.js';
import type { Finding } from './types.js';

export const BIT_RULE = 'bit-reach';

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
 * The diameter of the largest tool that still enters a cut-out (it vanishes for D): bisection on
 * the erosion test to 0.005 mm, rounded down. mm.
 */
export function largestToolMm(loop: Loop, toolDiameterMm: number): number {
  let lo = 0;
  let hi = toolDiameterMm;
  while (hi - lo > 0.005) {
    const r = (lo + hi) / 2;
    if (vanishesForTool(loop, r / 2 + VANISH_MARGIN_MM)) hi = r;
    else lo = r;
  }
  return Math.floor(lo * 1000) / 1000;
}

/** A slot narrower than the tool, measured across its end caps (its drawn width). */
function narrowSlot(part: string, label: string, widthMm: number, D: number, at: Vec2): Finding {
  const bit = largestBitMm(widthMm);
  return finding(BIT_RULE, 'error', part, widthMm, D, 'mm', at,
    `${label}: slot width ${mm(widthMm)} is below the ${mm(D, 3)} tool diameter; widen the slot to ${mm(clearWidthMm(D), 1)}${bit ? ` or use ${withArticle(bitText(bit))} bit` : ''}`);
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
        // A note, not a warning: drilling small holes is ordinary practice and the quote prices it.
        const bit = largestBitMm(2 * circle.radius);
        out.push(finding(BIT_RULE, 'info', name, 2 * circle.radius, D, 'mm', circle.center,
          `${c.label}: diameter ${mm(2 * circle.radius)} is below the ${mm(D, 3)} tool; drill it${bit ? ` or cut it with ${withArticle(bitText(bit))} bit` : ''}`));
      }
      continue;
    }
    if (vanishesForTool(c.loop, R)) {
      blocked.add(c.index);
      const at = mid(c.bbox.slice(0, 2) as unknown as Vec2, c.bbox.slice(2) as unknown as Vec2);
      const slotW = c.feature?.kind === 'slot' ? slotWidthMm(c.loop) : null;
      if (slotW !== null) out.push(narrowSlot(name, c.label, slotW, D, at));
      else {
        const fits = largestToolMm(c.loop, D);
        const bit = largestBitMm(fits);
        out.push(finding(BIT_RULE, 'error', name, fits, D, 'mm', at,
          `${c.label}: the largest tool that enters it is ${mm(fits)}, below the ${mm(D, 3)} tool; widen it to ${mm(clearWidthMm(D), 1)}${bit ? ` or use ${withArticle(bitText(bit))} bit` : ''}`));
      }
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
    // A slot is measured across its end caps (its drawn width); other cut-outs at their narrowest gap.
    const slotW = ix.contours[k].feature?.kind === 'slot' ? slotWidthMm(ix.contours[k].loop) : null;
    const at = mid(narrowest.p, narrowest.q);
    if (slotW !== null && slotW < D - TOOL_TOL_MM) {
      out.push(narrowSlot(name, ix.contours[k].label, slotW, D, at));
      continue;
    }
    const bit = largestBitMm(narrowest.widthMm);
    out.push(finding(BIT_RULE, 'error', name, narrowest.widthMm, D, 'mm', at,
      `${ix.contours[k].label}: gap ${mm(narrowest.widthMm)} is below the ${mm(D, 3)} tool diameter at its narrowest; widen the gap to ${mm(clearWidthMm(D), 1)}${bit ? ` or use ${withArticle(bitText(bit))} bit` : ''}`));
  }
  for (const c of ix.contours) {
    if (blocked.has(c.index)) continue;
    for (const k of sharpInsideCorners(c.loop, c.index)) {
      if (cornerLeftoverMm(R, 0, k.turnRad) < CORNER_LEFTOVER_MM) continue;
      out.push(finding(BIT_RULE, 'warning', name, 0, R, 'mm', k.at,
        `sharp inside corner of the ${c.label} (turns ${Math.abs(radToDeg(k.turnRad)).toFixed(0)}°): radius ${mm(0)} is below the ${mm(R, 3)} tool radius; round it to ${mm(R, 3)}, or cut a corner relief (cutting.cornerRelief, or check --relieve-corners) if a square part must seat there`));
    }
    c.loop.forEach((s) => {
      if (s.kind !== 'arc' || s.sweepRad >= 0 || Math.abs(s.sweepRad) >= 2 * Math.PI - 1e-9) return;
      if (s.radius >= R - TOOL_TOL_MM || cornerLeftoverMm(R, s.radius, s.sweepRad) < CORNER_LEFTOVER_MM) return;
      const at = endOf({ ...s, sweepRad: s.sweepRad / 2 });
      const bit = largestBitMm(2 * s.radius);
      out.push(finding(BIT_RULE, 'warning', name, s.radius, R, 'mm', at,
        `inside radius of the ${c.label}: radius ${mm(s.radius)} is below the ${mm(R, 3)} tool radius; enlarge it to ${mm(R, 3)}${bit ? ` or use ${withArticle(bitText(bit))} bit` : ''}`));
    });
  }
  return out;
}
