import { boxesBBox } from '../geometry/loop.js';
import type { BBox } from '../geometry/types.js';

/**
 * A uniform grid over bounding boxes: each item is listed in every cell its box touches, so a
 * query returns every item whose box meets the query box (and some near it), each once. Cell size
 * is chosen from the data (`gridCellMm`); queries cost about the number of items near the box, so
 * every rule that asks about neighbours stays linear in the number of holes. Cells are stored as one
 * flat list (offsets per cell), which the cell size keeps to about one cell per item.
 */
export type BoxGrid = Readonly<{
  /** The items' boxes, four numbers each (x0, y0, x1, y1): queries read one flat array, not one array per item. */
  coords: Float64Array;
  cellMm: number;
  originMm: readonly [number, number];
  /** Cells across and up. */
  nx: number;
  ny: number;
  /** Items of cell (ix, iy) are items[start[ix * ny + iy] .. start[ix * ny + iy + 1]). */
  start: Int32Array;
  items: Int32Array;
  /** Items spanning many cells (a long outline edge), scanned once by every query. */
  spill: Int32Array;
  /** Scratch marks for de-duplicating a query (each query fills its result before the next starts). */
  marks: { stamp: number; seen: Int32Array };
}>;

/** Items spanning more cells than this are kept in the spill list instead. */
const SPILL_CELLS = 64;

/** At most this many cells per item (plus a constant): a caller's tiny cell is widened to it. */
const CELLS_PER_ITEM = 4;

/**
 * Cell size from the data: twice the median item size, but never below the mean spacing of the items
 * (the side of the square each item would have if they were spread evenly over their extent). Points
 * (zero-size boxes, e.g. hole centres) thus get about one item per cell instead of a degenerate cell
 * that makes every query walk the whole grid. An item's size is the geometric mean of its box's sides:
 * long thin items (a strut's centreline, a straight edge) then share cells with few others, where
 * their length would make one cell of the whole part and every query a scan of every item. mm.
 */
export function gridCellMm(boxes: readonly BBox[]): number {
  if (boxes.length === 0) return 1;
  const sizes = new Float64Array(boxes.length);
  boxes.forEach((b, i) => {
    sizes[i] = Math.sqrt((b[2] - b[0]) * (b[3] - b[1]));
  });
  sizes.sort();
  const [x0, y0, x1, y1] = extent(boxes);
  // A line of items (zero width or height) spreads along its length only.
  const w = x1 - x0;
  const h = y1 - y0;
  const spread = w > 0 && h > 0 ? Math.sqrt((w * h) / boxes.length) : Math.max(w, h) / boxes.length;
  const cell = Math.max(2 * sizes[Math.floor(sizes.length / 2)], spread);
  return cell > 0 && Number.isFinite(cell) ? cell : 1;
}

/** The items' extent; an empty grid spans the origin. */
function extent(boxes: readonly BBox[]): BBox {
  const b = boxesBBox(boxes);
  return Number.isFinite(b[0]) ? b : [0, 0, 0, 0];
}

/** Build a grid over the boxes (index = item id); cellMm defaults to `gridCellMm(boxes)`. */
export function buildBoxGrid(boxes: readonly BBox[], cellMm?: number): BoxGrid {
  const [ox, oy, ex, ey] = extent(boxes);
  let cell = cellMm ?? gridCellMm(boxes);
  const dims = (c: number): [number, number] => [Math.floor((ex - ox) / c) + 1, Math.floor((ey - oy) / c) + 1];
  let [nx, ny] = dims(cell);
  while (nx * ny > CELLS_PER_ITEM * boxes.length + 1024) {
    cell *= 2;
    [nx, ny] = dims(cell);
  }
  const count = new Int32Array(nx * ny + 1);
  const spill: number[] = [];
  // Each box's cell range, kept in flat arrays (no tuple per box: a plate's grid has one box per hole).
  const n = boxes.length;
  const cells = new Int32Array(4 * n);
  const coords = new Float64Array(4 * n);
  const big = new Uint8Array(n);
  for (let id = 0; id < n; id++) {
    const b = boxes[id];
    coords[4 * id] = b[0];
    coords[4 * id + 1] = b[1];
    coords[4 * id + 2] = b[2];
    coords[4 * id + 3] = b[3];
    const ix0 = Math.floor((b[0] - ox) / cell);
    const iy0 = Math.floor((b[1] - oy) / cell);
    const ix1 = Math.floor((b[2] - ox) / cell);
    const iy1 = Math.floor((b[3] - oy) / cell);
    cells[4 * id] = ix0;
    cells[4 * id + 1] = iy0;
    cells[4 * id + 2] = ix1;
    cells[4 * id + 3] = iy1;
    // A large item (a long outline edge) would sit in many cells and be met again and again by
    // wide queries: it goes to the spill list, which every query scans once.
    if ((ix1 - ix0 + 1) * (iy1 - iy0 + 1) > SPILL_CELLS) {
      big[id] = 1;
      spill.push(id);
      continue;
    }
    for (let ix = ix0; ix <= ix1; ix++) for (let iy = iy0; iy <= iy1; iy++) count[ix * ny + iy + 1]++;
  }
  for (let k = 1; k <= nx * ny; k++) count[k] += count[k - 1];
  const start = count;
  const items = new Int32Array(start[nx * ny]);
  const fill = start.slice(0, nx * ny);
  for (let id = 0; id < n; id++) {
    if (big[id]) continue;
    for (let ix = cells[4 * id]; ix <= cells[4 * id + 2]; ix++) for (let iy = cells[4 * id + 1]; iy <= cells[4 * id + 3]; iy++) items[fill[ix * ny + iy]++] = id;
  }
  return { coords, cellMm: cell, originMm: [ox, oy], nx, ny, start, items, spill: Int32Array.from(spill), marks: { stamp: 0, seen: new Int32Array(boxes.length) } };
}

/** Ids of items whose box comes within padMm of the query box (each once, in a deterministic order). */
export function queryBoxGrid(g: BoxGrid, b: BBox, padMm = 0): number[] {
  const out: number[] = [];
  const { coords, marks, start, items, ny } = g;
  const seen = marks.seen;
  const stamp = ++marks.stamp;
  const x0 = b[0] - padMm;
  const y0 = b[1] - padMm;
  const x1 = b[2] + padMm;
  const y1 = b[3] + padMm;
  const c = g.cellMm;
  const ix0 = Math.max(0, Math.floor((x0 - g.originMm[0]) / c));
  const iy0 = Math.max(0, Math.floor((y0 - g.originMm[1]) / c));
  const ix1 = Math.min(g.nx - 1, Math.floor((x1 - g.originMm[0]) / c));
  const iy1 = Math.min(ny - 1, Math.floor((y1 - g.originMm[1]) / c));
  for (let ix = ix0; ix <= ix1; ix++) {
    for (let iy = iy0; iy <= iy1; iy++) {
      const k = ix * ny + iy;
      for (let n = start[k]; n < start[k + 1]; n++) {
        const id = items[n];
        if (seen[id] === stamp) continue;
        seen[id] = stamp;
        const k4 = 4 * id;
        if (coords[k4] > x1 || x0 > coords[k4 + 2] || coords[k4 + 1] > y1 || y0 > coords[k4 + 3]) continue;
        out.push(id);
      }
    }
  }
  for (let n = 0; n < g.spill.length; n++) {
    const id = g.spill[n];
    const k4 = 4 * id;
    if (coords[k4] > x1 || x0 > coords[k4 + 2] || coords[k4 + 1] > y1 || y0 > coords[k4 + 3]) continue;
    out.push(id);
  }
  return out;
}
