import { bboxGap, segmentDistance, type ClosestPair } from '../geometry/distance.js';
import type { Vec2 } from '../geometry/types.js';
import type { Chord } from './chords.js';
import { finding, mid, mm } from './finding.js';
import type { CheckOptions } from './options.js';
import { edgeFirst, type PartIndex, type SegRef } from './partIndex.js';
import { buildBoxGrid, queryBoxGrid, type BoxGrid } from './spatial.js';
import type { Finding } from './types.js';
import { withArticle } from '../params/words.js';

export const WEB_RULE = 'web-width';

/** Error limit for a plate: the larger of the absolute minimum and the multiple of thickness. mm. */
export function webLimitMm(o: CheckOptions, thicknessMm: number): number {
  const w = o.limits['web-width'];
  return Math.max(w.minMm, w.perThickness * thicknessMm);
}

/** Closest pair between two different contours, found by the rule. */
export type ContourPair = ClosestPair & Readonly<{ a: number; b: number }>;

/**
 * For every inner contour, the closest pair to each other contour (the outline, or a later inner
 * contour) within radiusMm, via the segment grid. Each unordered pair appears once.
 */
export function contourPairsWithin(ix: PartIndex, radiusMm: number, want: (a: number, b: number) => boolean = () => true): ContourPair[] {
  const out: ContourPair[] = [];
  for (let a = 1; a < ix.contours.length; a++) {
    const best = new Map<number, ContourPair>();
    const first = ix.firstSeg[a];
    for (let k = 0; k < ix.contours[a].loop.length; k++) {
      const sa = ix.segs[first + k];
      for (const id of queryBoxGrid(ix.segGrid, sa.box, radiusMm)) {
        const sb = ix.segs[id];
        const b = sb.contour;
        if (b === a || (b !== 0 && b < a) || !want(a, b)) continue;
        const cur = best.get(b);
        const bound = Math.min(radiusMm, cur ? cur.distance : Infinity);
        if (bboxGap(sa.box, sb.box) > bound) continue;
        const c = segmentDistance(sa.s, sb.s);
        if (c.distance <= bound && (!cur || c.distance < cur.distance)) best.set(b, { ...c, a, b });
      }
    }
    out.push(...[...best.values()].sort((x, y) => x.b - y.b));
  }
  return out;
}

/**
 * Smallest distance from an inner contour to a contour accepted by `accept(a, b)` among the segments
 * in `grid` (ids mapped by `segOf`): each inner contour searches with a radius that doubles until it
 * meets something (exact: every segment nearer than the radius is seen). The radius never grows past
 * the smallest distance found so far, and contours nearest the edge go first, so holes deep inside a
 * large plate cost one or two cheap queries each: linear in the number of holes.
 */
function nearestBySearch(ix: PartIndex, startMm: number, grid: BoxGrid, segOf: (id: number) => SegRef, accept: (a: number, b: number) => boolean): ContourPair | null {
  let best: ContourPair | null = null;
  for (const a of edgeFirst(ix)) {
    const box = ix.contours[a].bbox;
    // Once something is found, one query at the best distance so far settles each further contour.
    for (let r = Math.max(startMm, 1e-3, best ? best.distance : 0); r <= 4 * ix.spanMm + 1; r *= 2) {
      const cap = best ? Math.min(r, best.distance) : r;
      let found: ContourPair | null = null;
      const near = queryBoxGrid(grid, box, cap);
      for (let k = 0; k < ix.contours[a].loop.length; k++) {
        const sa = ix.segs[ix.firstSeg[a] + k];
        for (const id of near) {
          const so = segOf(id);
          if (!accept(a, so.contour)) continue;
          const bound = Math.min(cap, found ? found.distance : Infinity);
          if (bboxGap(sa.box, so.box) > bound) continue;
          const c = segmentDistance(sa.s, so.s);
          if (c.distance <= bound && (!found || c.distance < found.distance)) found = { ...c, a, b: so.contour };
        }
      }
      if (found && (!best || found.distance < best.distance)) best = found;
      // Nothing nearer than the best so far can lie beyond it.
      if (found || (best && r >= best.distance)) break;
    }
  }
  return best;
}

/** Smallest distance from any inner contour to the outline (an outline-only grid). Null without inner contours. */
export function nearestToOutline(ix: PartIndex, startMm: number): ContourPair | null {
  const outline = ix.contours[0].loop.map((_, k) => ix.segs[ix.firstSeg[0] + k]);
  return nearestBySearch(ix, startMm, buildBoxGrid(outline.map((s) => s.box)), (id) => outline[id], () => true);
}

/** Smallest distance between an inner contour and another contour accepted by `want` (exact). */
export function nearestPair(ix: PartIndex, startMm: number, want: (a: number, b: number) => boolean): ContourPair | null {
  return nearestBySearch(ix, startMm, ix.segGrid, (id) => ix.segs[id], (a, b) => b !== a && want(a, b));
}

export type WebMetrics = { minWebMm: number | null; minHoleEdgeWebMm: number | null; minHoleHoleWebMm: number | null };

/**
 * Rule 1, web width: the material between any two contours, and the necks inside one contour
 * (material chords from `loopChords`). Error below the limit, warning below limit × warnFactor.
 */
export function webRule(ix: PartIndex, o: CheckOptions, chords: readonly Chord[]): { findings: Finding[]; metrics: WebMetrics } {
  const part = ix.part;
  const limit = webLimitMm(o, part.thicknessMm);
  const warn = limit * o.limits['web-width'].warnFactor;
  const findings: Finding[] = [];
  const run = o.limits['web-width'].enabled;
  const plate = withArticle(`${Number(part.thicknessMm.toFixed(2))} mm plate`);
  const report = (width: number, at: Vec2, what: string, fix: (moreMm: string) => string): void => {
    if (!run || width >= warn) return;
    const error = width < limit;
    const need = error ? limit : warn;
    findings.push(
      finding(WEB_RULE, error ? 'error' : 'warning', part.name, width, need, 'mm', at,
        `${what}: web ${mm(width)} is below the ${error ? 'minimum' : 'warning level'} ${mm(need)} for ${plate}; ${fix(mm(need - width))}`),
    );
  };
  let holeHole: ContourPair | null = null;
  for (const p of contourPairsWithin(ix, warn)) {
    report(p.distance, mid(p.p, p.q), `${ix.contours[p.a].label} to ${ix.contours[p.b].label}`, (more) => `move the two contours ${more} further apart`);
    if (p.b !== 0 && (!holeHole || p.distance < holeHole.distance)) holeHole = p;
  }
  let minNeck: number | null = null;
  for (const c of chords) {
    if (c.through !== 'material') continue;
    minNeck = minNeck === null ? c.widthMm : Math.min(minNeck, c.widthMm);
    report(c.widthMm, mid(c.p, c.q), `narrow neck in the ${ix.contours[c.contour].label}`, (more) => `widen the material there by ${more}`);
  }
  const edge = nearestToOutline(ix, warn);
  // The pass above saw every pair nearer than the warning level; search further only when it found none.
  holeHole ??= nearestPair(ix, warn, (_a, b) => b !== 0);
  const candidates = [edge?.distance, holeHole?.distance, minNeck ?? undefined].filter((x): x is number => x !== undefined);
  return {
    findings,
    metrics: {
      minWebMm: candidates.length ? Math.min(...candidates) : null,
      minHoleEdgeWebMm: edge ? edge.distance : null,
      minHoleHoleWebMm: holeHole ? holeHole.distance : null,
    },
  };
}
