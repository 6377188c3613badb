import type { BBox, Vec2 } from '../geometry/types.js';
import { DxfReadError } from './errors.js';

/** Box pairs one drawing may produce before the reader gives up (thousands of copies of one entity). */
export const MAX_BOX_PAIRS = 2_000_000;

/**
 * Uniform grid of points for "everything within r of p" queries in near-constant time.
 * Cells are r wide, so a query looks at the 3 × 3 cells around p. Callers that only need one
 * representative per cluster add only points that found no neighbour, which keeps every cell small
 * even when thousands of ends meet at one point.
 */
export class PointGrid {
  private readonly cells = new Map<number, number[]>();
  constructor(private readonly cellMm: number) {}

  /** Hashed cell key; two cells may share a key, which only adds candidates the caller discards. */
  private key(ix: number, iy: number): number {
    return Math.imul(ix | 0, 73856093) ^ Math.imul(iy | 0, 19349663);
  }

  add(id: number, p: Vec2): void {
    const k = this.key(Math.floor(p[0] / this.cellMm), Math.floor(p[1] / this.cellMm));
    const c = this.cells.get(k);
    if (c) c.push(id);
    else this.cells.set(k, [id]);
  }

  /** Ids stored in the cells that could hold a point within one cell width of p (caller checks distance). */
  near(p: Vec2): number[] {
    const ix = Math.floor(p[0] / this.cellMm);
    const iy = Math.floor(p[1] / this.cellMm);
    const out: number[] = [];
    for (let dx = -1; dx <= 1; dx++) {
      for (let dy = -1; dy <= 1; dy++) {
        const c = this.cells.get(this.key(ix + dx, iy + dy));
        if (c) for (const id of c) out.push(id);
      }
    }
    return out;
  }
}

/**
 * Every pair (i < j) of boxes that overlap once grown by padMm, by sweep and prune along x:
 * O(n log n + pairs) for drawings whose boxes are spread out, as plate drawings are.
 */
export function overlappingPairs(boxes: readonly BBox[], padMm: number): Array<[number, number]> {
  const order = boxes.map((_, i) => i).sort((a, b) => boxes[a][0] - boxes[b][0] || a - b);
  const active: number[] = [];
  const pairs: Array<[number, number]> = [];
  for (const i of order) {
    const b = boxes[i];
    let w = 0;
    for (let k = 0; k < active.length; k++) {
      const j = active[k];
      if (boxes[j][2] + padMm < b[0]) continue; // can never meet a box further right
      active[w++] = j;
      const a = boxes[j];
      if (a[1] <= b[3] + padMm && b[1] <= a[3] + padMm) {
        pairs.push(i < j ? [i, j] : [j, i]);
        if (pairs.length > MAX_BOX_PAIRS) {
          throw new DxfReadError(`the drawing has more than ${MAX_BOX_PAIRS} pairs of entities whose extents overlap (thousands of entities on one spot), the reader's limit`);
        }
      }
    }
    active.length = w;
    active.push(i);
  }
  return pairs.sort((p, q) => p[0] - q[0] || p[1] - q[1]);
}
