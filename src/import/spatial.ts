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
 * Every pair (i < j) of boxes that overlap once grown by padMm, in a stable order. A hierarchy of
 * uniform grids (cells 4× larger per level) holds each box at the finest level where it covers at
 * most 16 cells, so a plate outline does not sit in hundreds of small cells nor meet every hole one
 * by one. A box looks for partners at its own level and the coarser ones; a pair is reported only
 * from the cell holding the lower-left corner of the overlap, so it is found once. Capped at
 * MAX_BOX_PAIRS with a DxfReadError.
 */
export function overlappingPairs(boxes: readonly BBox[], padMm: number): Array<[number, number]> {
  const n = boxes.length;
  const half = padMm / 2;
  const g: BBox[] = boxes.map((b) => [b[0] - half, b[1] - half, b[2] + half, b[3] + half]);
  const pairs: Array<[number, number]> = [];
  const add = (i: number, j: number) => {
    pairs.push(i < j ? [i, j] : [j, i]);
    if (pairs.length > MAX_BOX_PAIRS) {
      throw new DxfReadError(`the drawing has more than ${MAX_BOX_PAIRS} pairs of entities whose extents overlap (thousands of entities on one spot), the reader's limit`);
    }
  };
  const meet = (a: BBox, b: BBox) => a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];
  if (n < 64) {
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (meet(g[i], g[j])) add(i, j);
    return pairs;
  }
  const sizes = g.map((b) => Math.max(b[2] - b[0], b[3] - b[1])).sort((a, b) => a - b);
  const base = Math.max(2 * sizes[Math.floor(n / 2)], 1e-6);
  const MAX_LEVEL = 20;
  const cellAt = (level: number) => base * 4 ** level;
  const levelOf = new Array<number>(n);
  const grids: Array<Map<number, Map<number, number[]>>> = [];
  for (let i = 0; i < n; i++) {
    const b = g[i];
    let L = 0;
    for (; L < MAX_LEVEL; L++) {
      const c = cellAt(L);
      if ((Math.floor(b[2] / c) - Math.floor(b[0] / c) + 1) * (Math.floor(b[3] / c) - Math.floor(b[1] / c) + 1) <= 16) break;
    }
    levelOf[i] = L;
    const c = cellAt(L);
    const grid = (grids[L] ??= new Map());
    for (let x = Math.floor(b[0] / c); x <= Math.floor(b[2] / c); x++) {
      let col = grid.get(x);
      if (!col) grid.set(x, (col = new Map()));
      for (let y = Math.floor(b[1] / c); y <= Math.floor(b[3] / c); y++) {
        const l = col.get(y);
        if (l) l.push(i);
        else col.set(y, [i]);
      }
    }
  }
  for (let i = 0; i < n; i++) {
    const A = g[i];
    for (let L = levelOf[i]; L < grids.length; L++) {
      const grid = grids[L];
      if (!grid) continue;
      const c = cellAt(L);
      for (let x = Math.floor(A[0] / c); x <= Math.floor(A[2] / c); x++) {
        const col = grid.get(x);
        if (!col) continue;
        for (let y = Math.floor(A[1] / c); y <= Math.floor(A[3] / c); y++) {
          const l = col.get(y);
          if (!l) continue;
          for (const j of l) {
            // Same level: visit each pair from its lower index only; coarser levels: from the finer box only.
            if (L === levelOf[i] && j <= i) continue;
            const B = g[j];
            if (!meet(A, B)) continue;
            if (Math.floor(Math.max(A[0], B[0]) / c) !== x || Math.floor(Math.max(A[1], B[1]) / c) !== y) continue;
            add(i, j);
          }
        }
      }
    }
  }
  return pairs.sort((p, q) => p[0] - q[0] || p[1] - q[1]);
}
