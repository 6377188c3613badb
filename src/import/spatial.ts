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
 * Every pair (i < j) of boxes that overlap once grown by padMm, in a stable order. Boxes go into a
 * uniform grid (cells twice the median box size); a pair is reported only in the cell holding the
 * lower-left corner of the two boxes' overlap, so it is found once. Boxes spanning many cells (a
 * plate outline) are compared with every box directly. Near-linear for drawings whose entities
 * are spread out; capped at MAX_BOX_PAIRS with a DxfReadError for those that are not.
 */
export function overlappingPairs(boxes: readonly BBox[], padMm: number): Array<[number, number]> {
  const n = boxes.length;
  const half = padMm / 2;
  const g: BBox[] = boxes.map((b) => [b[0] - half, b[1] - half, b[2] + half, b[3] + half]);
  const meet = (a: BBox, b: BBox) => a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];
  const pairs: Array<[number, number]> = [];
  const add = (i: number, j: number) => {
    pairs.push(i < j ? [i, j] : [j, i]);
    if (pairs.length > MAX_BOX_PAIRS) {
      throw new DxfReadError(`the drawing has more than ${MAX_BOX_PAIRS} pairs of entities whose extents overlap (thousands of entities on one spot), the reader's limit`);
    }
  };
  if (n < 64) {
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (meet(g[i], g[j])) add(i, j);
    return pairs;
  }
  const sizes = g.map((b) => Math.max(b[2] - b[0], b[3] - b[1])).sort((a, b) => a - b);
  const cell = Math.max(2 * sizes[Math.floor(n / 2)], 1e-6);
  const cellOf = (v: number) => Math.floor(v / cell);
  const grid = new Map<number, Map<number, number[]>>();
  const big: number[] = [];
  for (let i = 0; i < n; i++) {
    const b = g[i];
    const x0 = cellOf(b[0]);
    const x1 = cellOf(b[2]);
    const y0 = cellOf(b[1]);
    const y1 = cellOf(b[3]);
    if ((x1 - x0 + 1) * (y1 - y0 + 1) > 16) {
      big.push(i);
      continue;
    }
    for (let x = x0; x <= x1; x++) {
      let col = grid.get(x);
      if (!col) grid.set(x, (col = new Map()));
      for (let y = y0; y <= y1; y++) {
        const l = col.get(y);
        if (l) l.push(i);
        else col.set(y, [i]);
      }
    }
  }
  for (const [x, col] of grid) {
    for (const [y, l] of col) {
      for (let a = 0; a < l.length; a++) {
        const A = g[l[a]];
        for (let b = a + 1; b < l.length; b++) {
          const B = g[l[b]];
          if (!meet(A, B)) continue;
          // Report the pair only in the cell of the overlap's lower-left corner.
          if (cellOf(Math.max(A[0], B[0])) !== x || cellOf(Math.max(A[1], B[1])) !== y) continue;
          add(l[a], l[b]);
        }
      }
    }
  }
  const isBig = new Set(big);
  for (const i of big) {
    for (let j = 0; j < n; j++) {
      if (j === i || (isBig.has(j) && j < i)) continue;
      if (meet(g[i], g[j])) add(i, j);
    }
  }
  return pairs.sort((p, q) => p[0] - q[0] || p[1] - q[1]);
}
