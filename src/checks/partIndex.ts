import { windingNumber } from '../geometry/inside.js';
import { boxesBBox } from '../geometry/loop.js';
import { featureLabel, type Feature, type Part } from '../geometry/part.js';
import { closestPoint, segmentBBox } from '../geometry/segment.js';
import type { BBox, Loop, Segment, Vec2 } from '../geometry/types.js';
import { buildBoxGrid, queryBoxGrid, type BoxGrid } from './spatial.js';

/** One contour of a part: index 0 is the outline, 1.. the features in order. */
export type Contour = Readonly<{ index: number; loop: Loop; feature: Feature | null; bbox: BBox; label: string }>;

export type SegRef = Readonly<{ contour: number; seg: number; s: Segment; box: BBox }>;

/** A part's contours and segments with spatial indexes, built once and shared by the part rules. */
export type PartIndex = Readonly<{
  part: Part;
  contours: readonly Contour[];
  segs: readonly SegRef[];
  /** Index in segs of each contour's first segment. */
  firstSeg: readonly number[];
  segGrid: BoxGrid;
  contourGrid: BoxGrid;
  /** Diagonal of the part's bounding box: no distance in the part exceeds it. mm. */
  spanMm: number;
}>;

/** A contour in words (see featureLabel). */
export const contourLabel = (f: Feature | null): string => featureLabel(f);

export function indexPart(part: Part): PartIndex {
  const contours: Contour[] = [];
  const segs: SegRef[] = [];
  const firstSeg: number[] = [];
  const segBoxes: BBox[] = [];
  const contourBoxes: BBox[] = [];
  for (let index = 0; index <= part.features.length; index++) {
    const feature = index === 0 ? null : part.features[index - 1];
    const loop = feature ? feature.loop : part.outline;
    const first = segs.length;
    firstSeg.push(first);
    for (let seg = 0; seg < loop.length; seg++) {
      const box = segmentBBox(loop[seg]);
      segs.push({ contour: index, seg, s: loop[seg], box });
      segBoxes.push(box);
    }
    // The contour's box from its segments' boxes (what loopBBox computes, without boxing each segment twice).
    const bbox = boxesBBox(segBoxes, first);
    contours.push({ index, loop, feature, bbox, label: contourLabel(feature) });
    contourBoxes.push(bbox);
  }
  const b = contours[0].bbox;
  return {
    part,
    contours,
    segs,
    firstSeg,
    segGrid: buildBoxGrid(segBoxes),
    contourGrid: buildBoxGrid(contourBoxes),
    spanMm: Math.hypot(b[2] - b[0], b[3] - b[1]),
  };
}

/** Is p in the material (inside the outline, outside every feature)? Points on a boundary: either answer. */
export function inMaterial(ix: PartIndex, p: Vec2): boolean {
  for (const id of queryBoxGrid(ix.contourGrid, [p[0], p[1], p[0], p[1]])) {
    const inside = windingNumber(ix.contours[id].loop, p) !== 0;
    if (id === 0 ? !inside : inside) return false;
  }
  return true;
}

/** Shortest distance from p to any contour, stopping early once below stopBelowMm. mm. */
export function distanceToBoundary(ix: PartIndex, p: Vec2, radiusMm: number, stopBelowMm = -Infinity): number {
  let best = Infinity;
  for (const id of queryBoxGrid(ix.segGrid, [p[0], p[1], p[0], p[1]], radiusMm)) {
    const d = closestPoint(ix.segs[id].s, p).distance;
    if (d < best) {
      best = d;
      if (best < stopBelowMm) return best;
    }
  }
  return best;
}

/**
 * Inner contours in the order of their bounding box's distance to the outline's bounding box, nearest
 * first: a cheap guess at which are near the edge, so that the searches below find a small distance
 * early and can stop the rest at it.
 */
export function edgeFirst(ix: PartIndex): number[] {
  const o = ix.contours[0].bbox;
  const gap = (k: number): number => {
    const b = ix.contours[k].bbox;
    return Math.min(b[0] - o[0], b[1] - o[1], o[2] - b[2], o[3] - b[3]);
  };
  const ids = ix.contours.slice(1).map((c) => c.index);
  const key = new Float64Array(ix.contours.length);
  for (const k of ids) key[k] = gap(k);
  return ids.sort((a, b) => key[a] - key[b] || a - b);
}
