import type { Finding } from '../checks/types.js';
import { intersectSegments } from '../geometry/intersect.js';
import { endOf, segmentBBox, startOf } from '../geometry/segment.js';
import { CHAIN_GAP_MM, COINCIDENT_MM } from '../geometry/tolerance.js';
import type { BBox, Vec2 } from '../geometry/types.js';
import { dist } from '../geometry/vec.js';
import type { ChainedLoop } from './chain.js';
import { overlappingPairs } from './spatial.js';

export type LoopMeeting = Readonly<{ selfIntersecting: ReadonlySet<number>; findings: Finding[] }>;

/**
 * Find loops that cross themselves and pairs of loops that cross or touch, in one sweep over every
 * segment's box (the per-loop check of src/geometry/validate.ts is quadratic; a drawing of
 * thousands of segments needs the sweep). Adjacent segments may meet at their shared end only.
 */
export function findMeetings(loops: readonly ChainedLoop[]): LoopMeeting {
  const owner: Array<{ loop: number; index: number }> = [];
  const boxes: BBox[] = [];
  loops.forEach((l, li) =>
    l.loop.forEach((s, si) => {
      owner.push({ loop: li, index: si });
      boxes.push(segmentBBox(s));
    }),
  );
  const selfHit = new Map<number, Vec2>();
  const crossHit = new Map<string, { a: number; b: number; at: Vec2 }>();
  for (const [i, j] of overlappingPairs(boxes, CHAIN_GAP_MM)) {
    const oi = owner[i];
    const oj = owner[j];
    if (oi.loop === oj.loop && selfHit.has(oi.loop)) continue;
    const key = `${Math.min(oi.loop, oj.loop)},${Math.max(oi.loop, oj.loop)}`;
    if (oi.loop !== oj.loop && crossHit.has(key)) continue;
    const loop = loops[oi.loop].loop;
    const a = loop[oi.index];
    const b = loops[oj.loop].loop[oj.index];
    const hits = intersectSegments(a, b, COINCIDENT_MM);
    if (!hits.length) continue;
    if (oi.loop !== oj.loop) {
      crossHit.set(key, { a: Math.min(oi.loop, oj.loop), b: Math.max(oi.loop, oj.loop), at: hits[0].point });
      continue;
    }
    const n = loop.length;
    const [lo, hi] = oi.index < oj.index ? [oi.index, oj.index] : [oj.index, oi.index];
    const sLo = loop[lo];
    for (const h of hits) {
      // Shared ends of neighbours are the loop itself, not a crossing.
      if (hi === lo + 1 && dist(h.point, endOf(sLo)) <= CHAIN_GAP_MM) continue;
      if (lo === 0 && hi === n - 1 && dist(h.point, startOf(sLo)) <= CHAIN_GAP_MM) continue;
      selfHit.set(oi.loop, h.point);
      break;
    }
  }
  const findings: Finding[] = [];
  for (const [li, at] of [...selfHit.entries()].sort((x, y) => x[0] - y[0])) {
    const src = loops[li].source;
    findings.push({
      rule: 'dxf-self-intersecting',
      severity: 'error',
      part: '',
      measured: null,
      limit: null,
      unit: '',
      atMm: [at[0], at[1]],
      message: `a contour (layer ${src.layer}, from ${src.entity} line ${src.line}) crosses or touches itself at (${at[0].toFixed(3)}, ${at[1].toFixed(3)}) mm; the cutter cannot follow it as one shape, so it was left out of the parts`,
    });
  }
  for (const c of [...crossHit.values()].sort((x, y) => x.a - y.a || x.b - y.b)) {
    const sa = loops[c.a].source;
    const sb = loops[c.b].source;
    findings.push({
      rule: 'dxf-contours-cross',
      severity: 'error',
      part: '',
      measured: null,
      limit: null,
      unit: '',
      atMm: [c.at[0], c.at[1]],
      message: `two contours (from ${sa.entity} line ${sa.line} and ${sb.entity} line ${sb.line}) cross or touch at (${c.at[0].toFixed(3)}, ${c.at[1].toFixed(3)}) mm; the web between them is zero`,
    });
  }
  return { selfIntersecting: new Set(selfHit.keys()), findings };
}
