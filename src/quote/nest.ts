import { EndType, JoinType, inflatePathsD, type PathsD } from 'clipper2-ts';
import { flattenLoop, partArea, transformPoint, type Part, type Transform } from '../geometry/index.js';
import { DesignError } from '../params/errors.js';

/** Chord tolerance for the nesting raster's polygons; added to the dilation so it stays conservative. mm. */
const NEST_CHORD_MM = 0.02;

export type SheetSize = Readonly<{ widthMm: number; heightMm: number }>;

export type NestOptions = Readonly<{
  sheet: SheetSize;
  /** Smallest distance between two parts (tool diameter + a margin). mm. */
  spacingMm: number;
  /** Clear border at each sheet edge. mm. */
  marginMm: number;
  /** Raster cell; smaller packs tighter and runs slower. mm. Default 0.5. */
  cellMm?: number;
  /** Retry groups that use more sheets than the area bound on a raster of half the cell (default true). */
  refine?: boolean;
  /** Called after each placed part, for a progress bar. */
  onProgress?: (placed: number, total: number) => void;
}>;

/** A part and how many copies to nest. */
export type NestItem = Readonly<{ part: Part; count: number }>;

export type Placement = Readonly<{
  /** Index into the items given to nestParts. */
  item: number;
  partName: string;
  copy: number;
  /** Part coordinates → sheet coordinates (sheet origin at its lower-left corner). */
  transform: Transform;
  rotationDeg: number;
}>;

export type NestedSheet = Readonly<{
  thicknessMm: number;
  material: string;
  widthMm: number;
  heightMm: number;
  placements: readonly Placement[];
  partAreaMm2: number;
  /** Part area / sheet area. */
  utilisation: number;
}>;

export type NestGroup = Readonly<{
  thicknessMm: number;
  material: string;
  sheets: number;
  partAreaMm2: number;
  /** Sum of part areas / sheet area: no packing can use fewer sheets than its ceiling. */
  areaBoundSheets: number;
  utilisation: number;
  /** Raster cell and placement rule of the layout kept. */
  cellMm: number;
  rule: string;
}>;

export type NestResult = Readonly<{
  sheets: readonly NestedSheet[];
  groups: readonly NestGroup[];
  spacingMm: number;
  marginMm: number;
  cellMm: number;
}>;

/** One rotation of a part rasterised: per row, inclusive cell intervals, plus its placement offset. */
type Raster = Readonly<{
  rotRad: number;
  w: number;
  h: number;
  rows: readonly Int32Array[];
  /** Dilated shape's lower-left corner in rotated part coordinates. mm. */
  originMm: readonly [number, number];
  areaCells: number;
}>;

type SheetState = {
  thicknessMm: number;
  material: string;
  /** prevOcc[y][x]: largest occupied x ≤ x in row y, or −1. */
  prevOcc: Int32Array[];
  placements: Placement[];
  partAreaMm2: number;
  /** Where the last copy of a raster was put: later copies can only land at or after it. */
  resume: Map<string, number>;
  full: Set<number>;
};

/**
 * Nest copies of parts onto sheets: true-shape bottom-left fill on a raster of each part's outline
 * dilated by half the spacing (a cell is occupied when the dilated part touches it, so two parts on
 * disjoint cells are at least the spacing apart). Rotations keep the 0/90 weave on the sheet axes:
 * a part turns by −weaveRad + k·90°. Parts of different thickness or material go on different sheets.
 * Largest parts go first; each copy takes the first sheet (of its group) and the lowest, then
 * leftmost, position where it fits. Inner cut-outs are not filled with other parts.
 * @throws DesignError naming `sheet` when a part does not fit on an empty sheet in any allowed rotation.
 */
export function nestParts(items: readonly NestItem[], options: NestOptions): NestResult {
  const cell = options.cellMm ?? 0.5;
  const { widthMm: W, heightMm: H } = options.sheet;
  const s = options.spacingMm;
  const m = options.marginMm;
  if (Math.min(W, H) - 2 * m + s <= cell) {
    throw new DesignError([{ path: 'sheet', value: `${W}x${H}`, message: `leaves no room inside the ${m} mm sheet margin` }]);
  }
  const coarse = level(items, options, cell);
  for (let i = 0; i < items.length; i++) {
    const fits = coarse.shapes[i].some((r) => r.w <= coarse.upright.gw && r.h <= coarse.upright.gh);
    if (items[i].count > 0 && !fits) {
      throw new DesignError([{
        path: 'sheet',
        value: `${W}x${H}`,
        message: `is too small for part ${items[i].part.name} (with ${m} mm margins and ${s.toFixed(2)} mm spacing, in any rotation that keeps the weave aligned)`,
      }]);
    }
  }
  const groups = new Map<string, number[]>();
  items.forEach((it, i) => {
    if (it.count <= 0) return;
    const key = groupKey(it.part);
    groups.set(key, [...(groups.get(key) ?? []), i]);
  });
  const copies = items.reduce((a, it) => a + Math.max(0, it.count), 0);
  const total = copies * (STRATEGIES.length + REFINE_STRATEGIES);
  let progress = 0;
  const tick = () => options.onProgress?.(Math.min(++progress, total), total);
  const sheets: NestedSheet[] = [];
  const summary: NestGroup[] = [];
  const sheetArea = W * H;
  for (const key of [...groups.keys()].sort()) {
    const members = groups.get(key)!;
    const tried = STRATEGIES.map((strategy) => ({ strategy, result: runStrategy(coarse, items, members, strategy, tick) }))
      .filter((t): t is { strategy: Strategy; result: SheetState[] } => t.result !== null)
      .sort((a, b) => (better(a.result, b.result) ? -1 : better(b.result, a.result) ? 1 : 0));
    if (!tried.length) throw new Error(`nesting: no strategy placed group ${key}`);
    let best = tried[0];
    let bestCell = cell;
    const area = best.result.reduce((a, sh) => a + sh.partAreaMm2, 0);
    const groupCopies = members.reduce((a, i) => a + items[i].count, 0);
    if (options.refine !== false && best.result.length > Math.ceil(area / sheetArea - 1e-9)) {
      // Not provably optimal by area: a finer raster (less rounding of the gaps) with the best rules
      // so far may save a sheet. Rules that gave the very same layout are retried once.
      const fine = level(items, options, cell / 2, new Set(members));
      const seen = new Set<string>();
      const retry = tried.filter((t) => {
        const sig = layoutSignature(t.strategy, t.result);
        if (seen.has(sig)) return false;
        seen.add(sig);
        return true;
      }).slice(0, REFINE_STRATEGIES);
      for (const t of retry) {
        const r = runStrategy(fine, items, members, t.strategy, tick);
        if (r && r.length < best.result.length) {
          best = { strategy: t.strategy, result: r };
          bestCell = cell / 2;
        }
      }
      for (let k = 0; k < groupCopies * (REFINE_STRATEGIES - retry.length); k++) tick();
    } else {
      for (let k = 0; k < groupCopies * REFINE_STRATEGIES; k++) tick();
    }
    for (const sh of best.result) {
      const placements = best.strategy.turned ? sh.placements.map((p) => ({ ...p, transform: turnSheet(p.transform, W), rotationDeg: normDeg(p.rotationDeg + 90) })) : sh.placements;
      sheets.push({ thicknessMm: sh.thicknessMm, material: sh.material, widthMm: W, heightMm: H, placements, partAreaMm2: sh.partAreaMm2, utilisation: sh.partAreaMm2 / sheetArea });
    }
    summary.push({
      thicknessMm: best.result[0].thicknessMm,
      material: best.result[0].material,
      sheets: best.result.length,
      partAreaMm2: area,
      areaBoundSheets: area / sheetArea,
      utilisation: area / (best.result.length * sheetArea),
      cellMm: bestCell,
      rule: best.strategy.name,
    });
  }
  return { sheets, groups: summary, spacingMm: s, marginMm: m, cellMm: cell };
}

/** How many of the best rules (with distinct layouts) are retried on the finer raster. */
const REFINE_STRATEGIES = 3;

/** Identifies a layout: which part went where on which sheet. */
function layoutSignature(strategy: Strategy, sheets: readonly SheetState[]): string {
  const pos = (p: Placement) => `${p.item}@${p.transform.translate[0].toFixed(3)},${p.transform.translate[1].toFixed(3)},${p.rotationDeg}`;
  return `${strategy.turned}|${sheets.map((sh) => sh.placements.map(pos).join(' ')).join('/')}`;
}

/** Rasters and grids for one cell size. */
type Level = Readonly<{ shapes: Raster[][]; boxes: Raster[][]; upright: Grid; turned: Grid }>;

/** Rasters of the items (only those in `only`, when given) and the grids, at one cell size. */
function level(items: readonly NestItem[], options: NestOptions, cell: number, only?: ReadonlySet<number>): Level {
  const s = options.spacingMm;
  const m = options.marginMm;
  const grid = (w: number, h: number): Grid => ({
    gw: Math.floor((w - 2 * m + s) / cell),
    gh: Math.floor((h - 2 * m + s) / cell),
    // The grid spans the usable area grown by half the spacing: dilated parts may reach that far.
    origin: [m - s / 2, m - s / 2],
    cell,
  });
  const shapes = items.map((it, i) => (it.count > 0 && (!only || only.has(i)) ? allowedRotations(it.part).map((rot) => rasterise(it.part, rot, s / 2, cell)) : []));
  return { shapes, boxes: shapes.map((rs) => rs.map(boxRaster)), upright: grid(options.sheet.widthMm, options.sheet.heightMm), turned: grid(options.sheet.heightMm, options.sheet.widthMm) };
}

function runStrategy(l: Level, items: readonly NestItem[], members: readonly number[], strategy: Strategy, tick: () => void): SheetState[] | null {
  return nestGroup(items, strategy.boxes ? l.boxes : l.shapes, members, strategy.turned ? l.turned : l.upright, withPreference(strategy), tick);
}

/** The strategy's score, with every rotation of the other parity ranked after all of the preferred one. */
function withPreference(strategy: Strategy): Score {
  const { prefer, score } = strategy;
  return prefer === undefined ? score : (x, y, r, k) => (k % 2 === prefer ? 0 : 1e15) + score(x, y, r, k);
}

type Grid = Readonly<{ gw: number; gh: number; origin: readonly [number, number]; cell: number }>;
/** Lower is better; k indexes the part's allowed rotations (quarter turns from the weave-aligned one). */
type Score = (x: number, y: number, r: Raster, k: number) => number;

/**
 * Placement rules tried for every group, on the sheet as given and turned by 90° (which keeps every
 * part's weave aligned); the group keeps the result with the fewest sheets. Greedy fill is myopic —
 * an early interlocking placement can cost a whole column — so a few rules beat any single one.
 */
const topEdge: Score = (x, y, r) => (y + r.h) * 1e6 + x;
const bottomLeft: Score = (x, y) => y * 1e6 + x;
const centre: Score = (x, y, r) => (2 * y + r.h) * 1e6 + x;
/**
 * With `prefer`, a copy takes a rotation of that parity (an even or odd number of quarter turns from
 * the weave-aligned one) wherever one fits on the sheet, and only then the other: long parts fill a band
 * one way, then the strip left over the other way, where a free choice per copy mixes them early and
 * leaves gaps no copy fits (80 Farline 7 arms: 4 sheets instead of 5).
 */
type Strategy = Readonly<{ name: string; turned: boolean; boxes: boolean; score: Score; prefer?: 0 | 1 }>;
const STRATEGIES: readonly Strategy[] = [
  { name: 'lowest top edge', turned: false, boxes: false, score: topEdge },
  { name: 'lowest top edge, turned sheet', turned: true, boxes: false, score: topEdge },
  { name: 'bottom-left', turned: false, boxes: false, score: bottomLeft },
  { name: 'bottom-left, turned sheet', turned: true, boxes: false, score: bottomLeft },
  { name: 'lowest centre', turned: false, boxes: false, score: centre },
  { name: 'lowest centre, turned sheet', turned: true, boxes: false, score: centre },
  // Bounding boxes only: avoids the trap where interlocking two parts costs a column.
  { name: 'boxes, lowest top edge', turned: false, boxes: true, score: topEdge },
  { name: 'boxes, lowest top edge, turned sheet', turned: true, boxes: true, score: topEdge },
  { name: 'upright first', turned: false, boxes: false, score: topEdge, prefer: 0 },
  { name: 'upright first, turned sheet', turned: true, boxes: false, score: topEdge, prefer: 0 },
  { name: 'quarter-turned first', turned: false, boxes: false, score: topEdge, prefer: 1 },
  { name: 'quarter-turned first, turned sheet', turned: true, boxes: false, score: topEdge, prefer: 1 },
];

/** Fewer sheets wins; then the emptier last sheet (its leftover is worth more). */
function better(a: readonly SheetState[], b: readonly SheetState[]): boolean {
  if (a.length !== b.length) return a.length < b.length;
  return a[a.length - 1].partAreaMm2 < b[b.length - 1].partAreaMm2 - 1e-6;
}

/** A placement made on the turned sheet (width H, height W), mapped back onto the W × H sheet. */
function turnSheet(t: Transform, widthMm: number): Transform {
  return { rotateRad: t.rotateRad + Math.PI / 2, translate: [widthMm - t.translate[1], t.translate[0]] };
}

function nestGroup(items: readonly NestItem[], rasters: readonly (readonly Raster[])[], members: readonly number[], g: Grid, score: Score, tick: () => void): SheetState[] | null {
  const { gw, gh, origin, cell } = g;
  const order: number[] = [];
  for (const i of members) for (let k = 0; k < items[i].count; k++) order.push(i);
  const areaOf = (i: number) => Math.max(...rasters[i].map((r) => r.areaCells));
  order.sort((a, b) => areaOf(b) - areaOf(a) || a - b);
  const sheets: SheetState[] = [];
  const copies = new Map<number, number>();
  for (const i of order) {
    let done = false;
    for (const sh of sheets) {
      if (sh.full.has(i)) continue;
      if (placeOn(sh, i)) { done = true; break; }
      sh.full.add(i);
    }
    if (!done) {
      const part = items[i].part;
      const sh: SheetState = {
        thicknessMm: part.thicknessMm,
        material: part.material.name,
        prevOcc: Array.from({ length: gh }, () => new Int32Array(Math.max(gw, 0)).fill(-1)),
        placements: [],
        partAreaMm2: 0,
        resume: new Map(),
        full: new Set(),
      };
      sheets.push(sh);
      // A part that fits only the other way round cannot go on this orientation of the sheet.
      if (!placeOn(sh, i)) return null;
    }
    tick();
  }
  return sheets;

  function placeOn(sh: SheetState, i: number): boolean {
    let best: { r: Raster; x: number; y: number; score: number } | null = null;
    rasters[i].forEach((r, k) => {
      const resumeKey = `${i}/${k}`;
      const from = sh.resume.get(resumeKey) ?? 0;
      const pos = firstFit(sh.prevOcc, r, gw, gh, from);
      sh.resume.set(resumeKey, pos === null ? gw * gh : pos.y * gw + pos.x);
      if (pos === null) return;
      const sc = score(pos.x, pos.y, r, k);
      if (!best || sc < best.score) best = { r, x: pos.x, y: pos.y, score: sc };
    });
    if (!best) return false;
    const { r, x, y } = best as { r: Raster; x: number; y: number };
    occupy(sh.prevOcc, r, x, y, gw);
    const part = items[i].part;
    const copy = copies.get(i) ?? 0;
    copies.set(i, copy + 1);
    const transform: Transform = { rotateRad: r.rotRad, translate: [origin[0] + x * cell - r.originMm[0], origin[1] + y * cell - r.originMm[1]] };
    sh.placements.push({ item: i, partName: part.name, copy, transform, rotationDeg: normDeg((r.rotRad * 180) / Math.PI) });
    sh.partAreaMm2 += partArea(part);
    return true;
  }
}

const groupKey = (p: Part): string => `${p.thicknessMm.toFixed(3).padStart(8, '0')}|${p.material.name}`;

const normDeg = (d: number): number => {
  const r = Math.round(d * 1e6) / 1e6;
  return ((r % 360) + 360) % 360;
};

/** Rotations that put the part's weave on the sheet axes: −weaveRad + k·90°, k = 0..3. */
export function allowedRotations(part: Part): number[] {
  return [0, 1, 2, 3].map((k) => -part.weaveRad + (k * Math.PI) / 2);
}

function rasterise(part: Part, rotRad: number, halfSpacingMm: number, cell: number): Raster {
  const t: Transform = { rotateRad: rotRad, translate: [0, 0] };
  const pts = flattenLoop(part.outline, NEST_CHORD_MM).map((p) => {
    const q = transformPoint(p, t);
    return { x: q[0], y: q[1] };
  });
  // Dilate by half the spacing, plus half a cell diagonal (so sampling cell centres is conservative)
  // plus the chord tolerance (chords lie inside the arcs they replace).
  const grow = halfSpacingMm + cell * Math.SQRT1_2 + NEST_CHORD_MM;
  const paths: PathsD = inflatePathsD([pts], grow, JoinType.Round, EndType.Polygon, 2, 6, NEST_CHORD_MM / 2);
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const p of paths) for (const q of p) {
    x0 = Math.min(x0, q.x); y0 = Math.min(y0, q.y); x1 = Math.max(x1, q.x); y1 = Math.max(y1, q.y);
  }
  const w = Math.ceil((x1 - x0) / cell);
  const h = Math.ceil((y1 - y0) / cell);
  const rows: Int32Array[] = [];
  let areaCells = 0;
  for (let j = 0; j < h; j++) {
    const yc = y0 + (j + 0.5) * cell;
    // Crossings with their winding direction; the filled set is nonzero winding. Gaps between spans
    // are real free space (a concave bay of the outline), where another part may go.
    const xs: Array<[number, number]> = [];
    for (const p of paths) {
      for (let k = 0; k < p.length; k++) {
        const a = p[k];
        const b = p[(k + 1) % p.length];
        if ((a.y <= yc && b.y > yc) || (b.y <= yc && a.y > yc)) {
          xs.push([a.x + ((yc - a.y) / (b.y - a.y)) * (b.x - a.x), b.y > a.y ? 1 : -1]);
        }
      }
    }
    xs.sort((p, q) => p[0] - q[0]);
    const spans: Array<[number, number]> = [];
    let wind = 0;
    let startX = 0;
    for (const [x, dir] of xs) {
      const was = wind;
      wind += dir;
      if (was === 0 && wind !== 0) startX = x;
      else if (was !== 0 && wind === 0) spans.push([startX, x]);
    }
    if (spans.length) {
      const a = Math.max(0, Math.ceil((spans[0][0] - x0) / cell - 0.5));
      const b = Math.min(w - 1, Math.floor((spans[spans.length - 1][1] - x0) / cell - 0.5));
      const cells: number[] = [];
      for (const [sa, sb] of spans) {
        const ia = Math.max(a, Math.ceil((sa - x0) / cell - 0.5));
        const ib = Math.min(b, Math.floor((sb - x0) / cell - 0.5));
        if (ib >= ia) cells.push(ia, ib);
      }
      rows.push(Int32Array.from(cells));
      for (let k = 0; k < cells.length; k += 2) areaCells += cells[k + 1] - cells[k] + 1;
    } else rows.push(new Int32Array(0));
  }
  return { rotRad, w, h, rows, originMm: [x0, y0], areaCells };
}

/** The raster's bounding box, every row full: shape-blind placement. */
function boxRaster(r: Raster): Raster {
  const full = Int32Array.from([0, r.w - 1]);
  return { ...r, rows: r.rows.map(() => full), areaCells: r.w * r.h };
}

/** First position (row-major from `from`) where the raster fits, skipping past each collision. */
function firstFit(prevOcc: Int32Array[], r: Raster, gw: number, gh: number, from: number): { x: number; y: number } | null {
  const maxX = gw - r.w;
  const maxY = gh - r.h;
  if (maxX < 0 || maxY < 0) return null;
  let y = Math.floor(from / gw);
  let x = from % gw;
  for (; y <= maxY; y++, x = 0) {
    while (x <= maxX) {
      let skipTo = -1;
      for (let j = 0; j < r.h && skipTo < 0; j++) {
        const row = r.rows[j];
        const occ = prevOcc[y + j];
        for (let k = 0; k < row.length; k += 2) {
          const last = occ[x + row[k + 1]];
          if (last >= x + row[k]) {
            skipTo = last - row[k] + 1;
            break;
          }
        }
      }
      if (skipTo < 0) return { x, y };
      x = skipTo;
    }
  }
  return null;
}

function occupy(prevOcc: Int32Array[], r: Raster, x: number, y: number, gw: number): void {
  for (let j = 0; j < r.h; j++) {
    const row = r.rows[j];
    if (row.length === 0) continue;
    const occ = prevOcc[y + j];
    for (let k = 0; k < row.length; k += 2) {
      for (let c = x + row[k]; c <= x + row[k + 1]; c++) occ[c] = c;
    }
    // Re-propagate "last occupied" to the right of what changed.
    for (let c = x + row[0] + 1; c < gw; c++) {
      const v = occ[c] === c ? c : occ[c - 1];
      if (occ[c] === v && c > x + row[row.length - 1]) break;
      occ[c] = v;
    }
  }
}
