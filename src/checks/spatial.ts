import type { BBox } from '../geometry/types.js';

/**
 * A uniform grid over bounding boxes: each item is listed in every cell its box touches, so a
 * query returns every item whose box meets the query box (and some near it), each once. Cell size
 * is chosen from the typical item size; queries cost about the number of items near the box, which
 * keeps a 2,000-hole plate far from all-pairs work.
 */
export type BoxGrid = Readonly<{
  boxes: readonly BBox[];
  cellMm: number;
  originMm: readonly [number, number];
  cells: ReadonlyMap<number, readonly number[]>;
  /** Scratch marks for de-duplicating a query (each query fills its result before the next starts). */
  marks: { stamp: number; seen: Int32Array };
}>;

const KEY_SPAN = 1 << 20;

/** Items spanning more cells than this are kept in one spill list instead. */
const SPILL_CELLS = 64;
const key = (ix: number, iy: number): number => ix * KEY_SPAN + iy;

/** Build a grid over the boxes (index = item id). cellMm defaults to twice the median box size. */
export function buildBoxGrid(boxes: readonly BBox[], cellMm?: number): BoxGrid {
  let cell = cellMm;
  if (cell === undefined) {
    const sizes = boxes.map((b) => Math.max(b[2] - b[0], b[3] - b[1])).sort((a, b) => a - b);
    cell = Math.max(2 * (sizes[Math.floor(sizes.length / 2)] ?? 1), 1e-3);
  }
  let ox = Infinity;
  let oy = Infinity;
  for (const b of boxes) {
    ox = Math.min(ox, b[0]);
    oy = Math.min(oy, b[1]);
  }
  if (!Number.isFinite(ox)) ox = oy = 0;
  const cells = new Map<number, number[]>();
  const grid: BoxGrid = { boxes, cellMm: cell, originMm: [ox, oy], cells, marks: { stamp: 0, seen: new Int32Array(boxes.length) } };
  boxes.forEach((b, id) => {
    const [ix0, iy0, ix1, iy1] = cellRange(grid, b, 0);
    // A large item (a long outline edge) would sit in many cells and be met again and again by
    // wide queries: it goes to the spill list, which every query scans once.
    if ((ix1 - ix0 + 1) * (iy1 - iy0 + 1) > SPILL_CELLS) {
      const spill = cells.get(-1) ?? [];
      spill.push(id);
      cells.set(-1, spill);
      return;
    }
    for (let ix = ix0; ix <= ix1; ix++) {
      for (let iy = iy0; iy <= iy1; iy++) {
        const k = key(ix, iy);
        const list = cells.get(k);
        if (list) list.push(id);
        else cells.set(k, [id]);
      }
    }
  });
  return grid;
}

function cellRange(g: BoxGrid, b: BBox, padMm: number): [number, number, number, number] {
  const c = g.cellMm;
  return [
    Math.max(0, Math.floor((b[0] - padMm - g.originMm[0]) / c)),
    Math.max(0, Math.floor((b[1] - padMm - g.originMm[1]) / c)),
    Math.min(KEY_SPAN - 1, Math.floor((b[2] + padMm - g.originMm[0]) / c)),
    Math.min(KEY_SPAN - 1, Math.floor((b[3] + padMm - g.originMm[1]) / c)),
  ];
}

/** Ids of items whose box comes within padMm of the query box (each once, in a deterministic order). */
export function queryBoxGrid(g: BoxGrid, b: BBox, padMm = 0): number[] {
  const out: number[] = [];
  const marks = g.marks;
  const stamp = ++marks.stamp;
  const x0 = b[0] - padMm;
  const y0 = b[1] - padMm;
  const x1 = b[2] + padMm;
  const y1 = b[3] + padMm;
  const visit = (list: readonly number[]): void => {
    for (const id of list) {
      if (marks.seen[id] === stamp) continue;
      marks.seen[id] = stamp;
      const o = g.boxes[id];
      if (o[0] > x1 || x0 > o[2] || o[1] > y1 || y0 > o[3]) continue;
      out.push(id);
    }
  };
  const [ix0, iy0, ix1, iy1] = cellRange(g, b, padMm);
  if ((ix1 - ix0 + 1) * (iy1 - iy0 + 1) > g.cells.size) {
    // The query covers more cells than exist: scanning the occupied ones is cheaper.
    for (const [k, list] of g.cells) if (k !== -1) visit(list);
  } else {
    for (let ix = ix0; ix <= ix1; ix++) {
      for (let iy = iy0; iy <= iy1; iy++) {
        const list = g.cells.get(key(ix, iy));
        if (list) visit(list);
      }
    }
  }
  visit(g.cells.get(-1) ?? []);
  return out;
}
