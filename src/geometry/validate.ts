import type { Loop, Vec2 } from './types.js';
import { intersectSegments } from './intersect.js';
import { endOf, lengthOf, segmentBBox, startOf } from './segment.js';
import { maxChainGap } from './loop.js';
import { CHAIN_GAP_MM, COINCIDENT_MM } from './tolerance.js';
import { dist } from './vec.js';

export type LoopProblem = Readonly<{ kind: 'open' | 'degenerate' | 'self-intersection'; at: Vec2; detail: string }>;

/**
 * First problem that keeps the loop from being a valid cut contour: a gap between consecutive
 * segments, a zero-length segment, or two segments crossing or touching anywhere except at their
 * shared end. Null when the loop is a simple closed curve.
 */
export function loopProblem(loop: Loop, gapMm = CHAIN_GAP_MM): LoopProblem | null {
  if (loop.length === 0) return { kind: 'degenerate', at: [0, 0], detail: 'empty loop' };
  const gap = maxChainGap(loop);
  if (gap.gapMm > gapMm) return { kind: 'open', at: gap.at, detail: `gap of ${gap.gapMm.toFixed(4)} mm` };
  for (const s of loop) {
    if (lengthOf(s) <= COINCIDENT_MM) return { kind: 'degenerate', at: startOf(s), detail: 'zero-length segment' };
  }
  const n = loop.length;
  const boxes = loop.map(segmentBBox);
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const a = boxes[i];
      const b = boxes[j];
      if (a[0] > b[2] + gapMm || b[0] > a[2] + gapMm || a[1] > b[3] + gapMm || b[1] > a[3] + gapMm) continue;
      const adjacentNext = j === i + 1;
      const adjacentPrev = i === 0 && j === n - 1;
      for (const h of intersectSegments(loop[i], loop[j], COINCIDENT_MM)) {
        if (adjacentNext && dist(h.point, endOf(loop[i])) <= gapMm) continue;
        if (adjacentPrev && dist(h.point, startOf(loop[i])) <= gapMm) continue;
        if (n === 2 && (dist(h.point, startOf(loop[i])) <= gapMm || dist(h.point, endOf(loop[i])) <= gapMm)) continue;
        return { kind: 'self-intersection', at: h.point, detail: `segments ${i} and ${j} meet` };
      }
    }
  }
  return null;
}
