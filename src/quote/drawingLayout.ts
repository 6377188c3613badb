import { arc, assertNever, line, type Loop, type Segment, type Vec2 } from '../geometry/index.js';
import { TEXT_ASCENT_EM, TEXT_DESCENT_EM, textWidthMm, wrapText } from '../params/textWidth.js';
import { DRAWING_VIEW_MM, type DrawingSet, type DrawingSheet, type PartSheet, type SummarySheet, type Table, type TableRow } from './drawing.js';

/**
 * Paper layout of the drawing sheets: A4 landscape, millimetres, origin at the lower-left corner,
 * y up (the writers flip y). The PDF and SVG writers serialise these items and compute nothing.
 * Text is measured with the advance widths of the font the PDF embeds (src/params/textWidth.ts).
 */

export const SHEET_MM = { width: 297, height: 210 } as const;

/**
 * Smallest text on a sheet, as an em size: its capital height (0.729 em in the drawing font) is the
 * smallest nominal lettering height of ISO 3098-0, 1.8 mm, so an A4 print stays readable.
 */
export const MIN_TEXT_MM = 2.5;
/** Capital height of the drawing font as a fraction of the em (1493/2048 units in the font file). */
export const CAP_HEIGHT_EM = 0.729;

export type Stroke = 'outline' | 'thin' | 'frame';
export type PaperItem =
  | Readonly<{ kind: 'loop'; loop: Loop; stroke: Stroke }>
  | Readonly<{ kind: 'line'; a: Vec2; b: Vec2; stroke: Stroke }>
  /** Filled triangle (arrowheads). */
  | Readonly<{ kind: 'triangle'; points: readonly [Vec2, Vec2, Vec2] }>
  /** Text with its baseline at `at`; rotation counter-clockwise in degrees. Size is the em, mm. */
  | Readonly<{ kind: 'text'; at: Vec2; text: string; sizeMm: number; anchor: 'start' | 'middle' | 'end'; bold?: boolean; rotateDeg?: number }>;

export type PaperSheet = Readonly<{ widthMm: number; heightMm: number; title: string; items: readonly PaperItem[] }>;

const FRAME = { x0: 10, y0: 10, x1: 287, y1: 200 };
/** The part view: the scaled part's extent is centred in this box; ordinates go below and left of it. */
const VIEW = { x: 34, y: 70, w: DRAWING_VIEW_MM.width, h: DRAWING_VIEW_MM.height };
/** Right-hand column for the facts and tables, above the title block. */
const COLUMN = { x: 201, top: 193, bottom: 43, width: 85 };
const TITLE_BLOCK_TOP = 40;
const ARROW_MM = 2.2;
const T = MIN_TEXT_MM;
const ROW_MM = T * 1.45;
const ORDINATE_GAP_MM = T * (TEXT_ASCENT_EM + TEXT_DESCENT_EM) + 0.5;

/** Lay out every sheet of the set; a part whose tables overflow gets continuation sheets. */
export function layoutDrawing(set: DrawingSet): PaperSheet[] {
  const pages: Array<{ sheet: DrawingSheet; items: PaperItem[]; title: string }> = [];
  for (const sheet of set.sheets) {
    switch (sheet.kind) {
      case 'part':
        pages.push(...partPages(sheet));
        break;
      case 'summary':
        pages.push(...summaryPages(set, sheet));
        break;
      default:
        assertNever(sheet);
    }
  }
  return pages.map((p, i) => {
    const items: PaperItem[] = [rect(FRAME.x0, FRAME.y0, FRAME.x1 - FRAME.x0, FRAME.y1 - FRAME.y0, 'frame'), ...p.items];
    notesBlock(set, items);
    titleBlock(set, p.sheet, p.title, i + 1, pages.length, items);
    return { widthMm: SHEET_MM.width, heightMm: SHEET_MM.height, title: `${set.design} - ${p.title}`, items };
  });
}

function rect(x: number, y: number, w: number, h: number, stroke: Stroke): PaperItem {
  return { kind: 'loop', stroke, loop: [line([x, y], [x + w, y]), line([x + w, y], [x + w, y + h]), line([x + w, y + h], [x, y + h]), line([x, y + h], [x, y])] };
}

const text = (at: Vec2, s: string, sizeMm = T, anchor: 'start' | 'middle' | 'end' = 'start', bold = false, rotateDeg = 0): PaperItem => ({
  kind: 'text',
  at,
  text: s,
  sizeMm,
  anchor,
  ...(bold ? { bold } : {}),
  ...(rotateDeg ? { rotateDeg } : {}),
});

/** A paper box, y up. */
type PBox = { x0: number; y0: number; x1: number; y1: number };
const overlaps = (a: PBox, b: PBox, gap = 0.3): boolean => a.x0 < b.x1 + gap && b.x0 < a.x1 + gap && a.y0 < b.y1 + gap && b.y0 < a.y1 + gap;

/** The box of a horizontal text (y up): baseline at y. */
function textBoxUp(at: Vec2, s: string, size: number, anchor: 'start' | 'middle' | 'end'): PBox {
  const w = textWidthMm(s, size);
  const x0 = anchor === 'start' ? at[0] : anchor === 'middle' ? at[0] - w / 2 : at[0] - w;
  return { x0, y0: at[1] - TEXT_DESCENT_EM * size, x1: x0 + w, y1: at[1] + TEXT_ASCENT_EM * size };
}

/** The part sheet and, when its tables do not fit the column, continuation sheets. */
function partPages(sheet: PartSheet): Array<{ sheet: DrawingSheet; items: PaperItem[]; title: string }> {
  const items: PaperItem[] = [];
  partView(sheet, items);
  const tables = partTables(sheet);
  const rest = flowTables(tables, [{ x: COLUMN.x, top: COLUMN.top, bottom: COLUMN.bottom, width: COLUMN.width }], items);
  const pages = [{ sheet: sheet as DrawingSheet, items, title: sheet.title }];
  let left = rest;
  while (left.length) {
    const more: PaperItem[] = [text([16, FRAME.y1 - 9], `${sheet.title} (continued)`, 5, 'start', true)];
    left = flowTables(left, [
      { x: 16, top: FRAME.y1 - 14, bottom: 52, width: 128 },
      { x: 150, top: FRAME.y1 - 14, bottom: TITLE_BLOCK_TOP + 3, width: 134 },
    ], more);
    pages.push({ sheet, items: more, title: `${sheet.title} (continued)` });
  }
  return pages;
}

const letter = (tag: string): string => tag.replace(/\d+$/, '');

function partTables(sheet: PartSheet): Table[] {
  const f = (x: number): string => x.toFixed(2);
  const holes: Table = {
    title: `Holes (${sheet.holes.length}); x, y from the datum`,
    header: ['tag', 'x', 'y', 'size', 'screw', 'n'],
    // The count of a type stands on its first row.
    rows: sheet.holes.map((h, i) => [h.tag, f(h.centerMm[0]), f(h.centerMm[1]), h.size, h.screw, i === 0 || letter(sheet.holes[i - 1].tag) !== letter(h.tag) ? `${h.typeCount}` : '']),
  };
  const cut: Table = {
    title: `Slots and windows (${sheet.cutouts.length}); centre of extent`,
    header: ['tag', 'x', 'y', 'extent x by y', 'what'],
    rows: sheet.cutouts.flatMap((c) => [[c.tag, f(c.centerMm[0]), f(c.centerMm[1]), `${f(c.extentMm[0])} x ${f(c.extentMm[1])}`, c.what], ['', c.size]]),
  };
  return [
    { title: 'Part', header: ['item', 'value'], rows: sheet.facts.map(([a, b]) => [a, b]) },
    ...(sheet.holes.length ? [holes] : []),
    ...(sheet.cutouts.length ? [cut] : []),
  ];
}

type Column = { x: number; top: number; bottom: number; width: number };

/**
 * Places tables top-down in the columns, splitting a table between columns (its title and header
 * repeated) where it runs out of room. Returns what did not fit. A row of one cell after the first
 * (a size description) spans the remaining columns.
 */
function flowTables(tables: readonly Table[], columns: readonly Column[], items: PaperItem[]): Table[] {
  let ci = 0;
  let y = columns[0].top;
  const queue = [...tables];
  while (queue.length && ci < columns.length) {
    const t = queue[0];
    const col = columns[ci];
    const room = Math.floor((y - col.bottom - T * 1.2 - 1.5 - ROW_MM) / ROW_MM);
    if (room < 2) {
      ci++;
      if (ci < columns.length) y = columns[ci].top;
      continue;
    }
    // Keep a size line with its row.
    let n = Math.min(room, t.rows.length);
    if (n < t.rows.length && n > 0 && t.rows[n][0] === '' && n > 1) n--;
    const part: Table = { ...t, rows: t.rows.slice(0, n) };
    y = table(part, col.x, y, col.width, items) - 4;
    if (n < t.rows.length) {
      queue[0] = { ...t, title: `${t.title.replace(/ \(continued\)$/, '')} (continued)`, rows: t.rows.slice(n) };
      ci++;
      if (ci < columns.length) y = columns[ci].top;
    } else queue.shift();
  }
  return queue;
}

/**
 * A table whose top-left corner is at (x, yTop); returns the y of its bottom edge. Columns are as
 * wide as their widest cell in the drawing font; a row whose first cell is empty and whose second is
 * its only other cell is a spanning note line.
 */
function table(t: Table, x: number, yTop: number, maxWidthMm: number, items: PaperItem[]): number {
  const cols = t.header.length;
  const spanning = (r: TableRow): boolean => r.length === 2 && cols > 2 && r[0] === '';
  const widths = t.header.map((h, i) => Math.max(textWidthMm(h, T, true), ...t.rows.filter((r) => !spanning(r)).map((r) => textWidthMm(r[i] ?? '', T))) + 2);
  const total = Math.min(maxWidthMm, widths.reduce((a, b) => a + b, 0));
  items.push(text([x, yTop - T], t.title, T, 'start', true));
  let y = yTop - T - 1.5;
  const rowLine = (cells: TableRow, bold: boolean): void => {
    if (spanning(cells)) {
      items.push(text([x + widths[0] + 1, y - ROW_MM + 1.1], cells[1], T));
    } else {
      let cx = x;
      for (let i = 0; i < cols; i++) {
        items.push(text([cx + 1, y - ROW_MM + 1.1], cells[i] ?? '', T, 'start', bold));
        cx += widths[i];
      }
    }
    y -= ROW_MM;
    items.push({ kind: 'line', a: [x, y], b: [x + total, y], stroke: 'thin' });
  };
  items.push({ kind: 'line', a: [x, y], b: [x + total, y], stroke: 'thin' });
  rowLine(t.header, true);
  for (const r of t.rows) rowLine(r, false);
  return y;
}

/** Natural width of a table (for tests and for choosing a column): widest cells plus padding. */
export function tableWidthMm(t: Table): number {
  return t.header.map((h, i) => Math.max(textWidthMm(h, T, true), ...t.rows.map((r) => textWidthMm(r[i] ?? '', T))) + 2).reduce((a, b) => a + b, 0);
}

function partView(sheet: PartSheet, items: PaperItem[]): void {
  const [x0, y0, x1, y1] = sheet.bboxMm;
  const k = sheet.scale.factor;
  const ox = VIEW.x + (VIEW.w - (x1 - x0) * k) / 2;
  const oy = VIEW.y + (VIEW.h - (y1 - y0) * k) / 2;
  const map = (p: Vec2): Vec2 => [ox + (p[0] - x0) * k, oy + (p[1] - y0) * k];
  const mapLoop = (loop: Loop): Loop => loop.map((s) => mapSegment(s, map, k));
  items.push({ kind: 'loop', loop: mapLoop(sheet.part.outline), stroke: 'outline' });
  for (const f of sheet.part.features) {
    items.push({ kind: 'loop', loop: mapLoop(f.loop), stroke: 'outline' });
    if (f.centerMm && f.diameterMm) {
      const c = map(f.centerMm);
      const r = (f.diameterMm / 2) * k + 0.8;
      items.push({ kind: 'line', a: [c[0] - r, c[1]], b: [c[0] + r, c[1]], stroke: 'thin' });
      items.push({ kind: 'line', a: [c[0], c[1] - r], b: [c[0], c[1] + r], stroke: 'thin' });
    }
  }
  const left = ox;
  const bottom = oy;
  const right = ox + (x1 - x0) * k;
  const top = oy + (y1 - y0) * k;
  const taken: PBox[] = [];
  ordinateRow(sheet.ordinates.filter((o) => o.axis === 'x').map((o) => ({ value: o.valueMm, at: map([o.valueMm, y0])[0] })), 'x', bottom, items, taken);
  ordinateRow(sheet.ordinates.filter((o) => o.axis === 'y').map((o) => ({ value: o.valueMm, at: map([x0, o.valueMm])[1] })), 'y', left, items, taken);
  // Datum: the part origin, marked where it falls on the view.
  const d = map([0, 0]);
  if (d[0] >= left - 8 && d[0] <= right + 8 && d[1] >= bottom - 8 && d[1] <= top + 8) {
    items.push({ kind: 'loop', loop: [arc(d, 1.2, 0, 2 * Math.PI)], stroke: 'thin' });
    items.push({ kind: 'line', a: [d[0] - 2, d[1]], b: [d[0] + 2, d[1]], stroke: 'thin' });
    items.push({ kind: 'line', a: [d[0], d[1] - 2], b: [d[0], d[1] + 2], stroke: 'thin' });
    taken.push({ x0: d[0] - 2, y0: d[1] - 2, x1: d[0] + 2, y1: d[1] + 2 });
  }
  // Tags beside their holes and cut-outs, placed clear of each other and of the ordinates.
  const tags = [...sheet.holes.map((h) => ({ tag: h.tag, at: map(h.centerMm), r: (h.diameterMm / 2) * k })), ...sheet.cutouts.map((c) => ({ tag: c.tag, at: map(c.centerMm), r: 0 }))];
  for (const t of tags) taken.push({ x0: t.at[0] - t.r, y0: t.at[1] - t.r, x1: t.at[0] + t.r, y1: t.at[1] + t.r });
  for (const t of tags) placeTag(t.tag, t.at, t.r, items, taken);
  // Heading, scale and datum; weave and front arrows at the top right of the view.
  items.push(text([16, FRAME.y1 - 9], sheet.title, 5, 'start', true));
  items.push(text([16, FRAME.y1 - 15], `scale ${sheet.scale.label}   dimensions in mm   ${sheet.datumText}`, T));
  const wr = (sheet.weaveDeg * Math.PI) / 180;
  arrow([150, FRAME.y1 - 9], [Math.cos(wr), Math.sin(wr)], 10, `weave 0°`, items);
  arrow([175, FRAME.y1 - 9], [1, 0], 10, `${sheet.plusX} (+x)`, items);
}

/** An arrow of length len from `from` along unit dir, its word after it. */
function arrow(from: Vec2, dir: Vec2, len: number, word: string, items: PaperItem[]): void {
  const tip: Vec2 = [from[0] + dir[0] * len, from[1] + dir[1] * len];
  items.push({ kind: 'line', a: from, b: tip, stroke: 'thin' });
  items.push(arrowHead(tip, dir));
  items.push(text([from[0], from[1] - 5], word, T));
}

/**
 * Ordinate dimensions along one edge: a short extension from the edge of the extent, a jogged
 * leader to the value, values spread so none overlap (x values written upward below the view, y
 * values to the left of it).
 */
function ordinateRow(values: ReadonlyArray<{ value: number; at: number }>, axis: 'x' | 'y', edge: number, items: PaperItem[], taken: PBox[]): void {
  if (!values.length) return;
  const pos = spread(values.map((v) => v.at), ORDINATE_GAP_MM);
  values.forEach((v, i) => {
    const s = v.value.toFixed(2);
    const w = textWidthMm(s, T);
    if (axis === 'x') {
      const yJog = edge - 5;
      items.push({ kind: 'line', a: [v.at, edge - 1], b: [v.at, yJog], stroke: 'thin' });
      items.push({ kind: 'line', a: [v.at, yJog], b: [pos[i], yJog - 2.5], stroke: 'thin' });
      // Upward text: its baseline runs along x = pos + half the text height; it ends at the jog.
      const bx = pos[i] + (T * (TEXT_ASCENT_EM - TEXT_DESCENT_EM)) / 2;
      items.push(text([bx, yJog - 3 - w], s, T, 'start', false, 90));
      taken.push({ x0: bx - TEXT_ASCENT_EM * T, y0: yJog - 3 - w, x1: bx + TEXT_DESCENT_EM * T, y1: yJog - 3 });
    } else {
      const xJog = edge - 5;
      items.push({ kind: 'line', a: [edge - 1, v.at], b: [xJog, v.at], stroke: 'thin' });
      items.push({ kind: 'line', a: [xJog, v.at], b: [xJog - 2.5, pos[i]], stroke: 'thin' });
      const base: Vec2 = [xJog - 3, pos[i] - (T * (TEXT_ASCENT_EM - TEXT_DESCENT_EM)) / 2];
      items.push(text(base, s, T, 'end'));
      taken.push(textBoxUp(base, s, T, 'end'));
    }
  });
}

/**
 * Positions as near the wanted ones as possible, in the same order, at least `gap` apart: each
 * cluster that would overlap is centred on its members' mean (a 1-D label spread).
 */
export function spread(wanted: readonly number[], gap: number): number[] {
  const order = wanted.map((v, i) => [v, i] as const).sort((a, b) => a[0] - b[0]);
  type Cluster = { start: number; n: number; sum: number };
  const clusters: Cluster[] = [];
  for (const [v] of order) {
    clusters.push({ start: v, n: 1, sum: v });
    for (;;) {
      const c = clusters[clusters.length - 1];
      c.start = c.sum / c.n - ((c.n - 1) * gap) / 2;
      const p = clusters[clusters.length - 2];
      if (!p || p.start + p.n * gap <= c.start) break;
      p.n += c.n;
      p.sum += c.sum;
      clusters.pop();
    }
  }
  const out = new Array<number>(wanted.length);
  let k = 0;
  for (const c of clusters) for (let j = 0; j < c.n; j++) out[order[k++][1]] = c.start + j * gap;
  return out;
}

/** A tag beside its feature: the first of 8 directions and growing distances clear of `taken`. */
function placeTag(tag: string, at: Vec2, r: number, items: PaperItem[], taken: PBox[]): void {
  const w = textWidthMm(tag, T);
  const h = T * (TEXT_ASCENT_EM + TEXT_DESCENT_EM);
  for (let ring = 0; ring < 30; ring++) {
    const d = r + 0.6 + ring * 1.2;
    for (let k = 0; k < 8; k++) {
      const a = (k * Math.PI) / 4 + Math.PI / 4;
      const cx = at[0] + Math.cos(a) * (d + w / 2);
      const cy = at[1] + Math.sin(a) * (d + h / 2);
      const box: PBox = { x0: cx - w / 2, y0: cy - h / 2, x1: cx + w / 2, y1: cy + h / 2 };
      if (taken.some((t) => overlaps(box, t))) continue;
      taken.push(box);
      if (ring > 1) {
        const nx = Math.min(Math.max(at[0], box.x0), box.x1);
        const ny = Math.min(Math.max(at[1], box.y0), box.y1);
        items.push({ kind: 'line', a: at, b: [nx, ny], stroke: 'thin' });
      }
      items.push(text([box.x0, box.y0 + TEXT_DESCENT_EM * T], tag, T));
      return;
    }
  }
}

/** Scale a segment by k about the part origin and move it with `map` (which already includes k). */
function mapSegment(s: Segment, map: (p: Vec2) => Vec2, k: number): Segment {
  switch (s.kind) {
    case 'line':
      return line(map(s.start), map(s.end));
    case 'arc':
      return arc(map(s.center), s.radius * k, s.startRad, s.sweepRad);
    default:
      return assertNever(s);
  }
}

/** Arrowhead with its tip at `tip`, pointing along unit vector dir. */
function arrowHead(tip: Vec2, dir: Vec2): PaperItem {
  const back: Vec2 = [tip[0] - dir[0] * ARROW_MM, tip[1] - dir[1] * ARROW_MM];
  const n: Vec2 = [-dir[1] * ARROW_MM * 0.3, dir[0] * ARROW_MM * 0.3];
  return { kind: 'triangle', points: [tip, [back[0] + n[0], back[1] + n[1]], [back[0] - n[0], back[1] - n[1]]] };
}

/** The summary sheet; the parts, sheets and hardware tables flow onto continuation sheets when long. */
function summaryPages(set: DrawingSet, sheet: SummarySheet): Array<{ sheet: DrawingSheet; items: PaperItem[]; title: string }> {
  const items: PaperItem[] = [text([16, FRAME.y1 - 9], 'Quote summary', 5, 'start', true)];
  const [parts, sheets, batch] = sheet.tables;
  // The notes under the tables need room: the tables stop that far above the notes block.
  const notesRoom = sheet.lines.reduce((n, l) => n + wrap(l, 180).length, 0) * T * 1.35 + 4;
  const tables = [parts, sheets, ...(set.hardware ? [set.hardware] : [])];
  const placed: PaperItem[] = [];
  let left = flowTables(tables, [{ x: 16, top: FRAME.y1 - 14, bottom: 52 + notesRoom, width: 180 }], placed);
  items.push(...placed);
  const lowest = Math.min(FRAME.y1 - 14, ...placed.filter((i): i is Extract<PaperItem, { kind: 'line' }> => i.kind === 'line').map((i) => i.a[1]));
  summaryRight(sheet, batch, items);
  let ly = lowest - 6;
  for (const l of sheet.lines) {
    for (const w of wrap(l, 180)) {
      items.push(text([16, ly], w, T));
      ly -= T * 1.35;
    }
  }
  const pages = [{ sheet: sheet as DrawingSheet, items, title: sheet.title }];
  while (left.length) {
    const more: PaperItem[] = [text([16, FRAME.y1 - 9], 'Quote summary (continued)', 5, 'start', true)];
    left = flowTables(left, [{ x: 16, top: FRAME.y1 - 14, bottom: 52, width: 180 }, { x: 201, top: FRAME.y1 - 14, bottom: TITLE_BLOCK_TOP + 3, width: 85 }], more);
    pages.push({ sheet, items: more, title: `${sheet.title} (continued)` });
  }
  return pages;
}

/** The batch time and cost table, and the per-sheet utilisation below it. */
function summaryRight(sheet: SummarySheet, batch: Table, items: PaperItem[]): void {
  const yb = table(batch, 201, FRAME.y1 - 14, 85, items);
  // Per-sheet utilisation below the batch table, as many rows as fit above the title block.
  const room = Math.max(1, Math.floor((yb - 6 - TITLE_BLOCK_TOP - T * 1.2 - 1.5 - 2) / ROW_MM) - 1);
  const rows = sheet.sheetRows.rows;
  const shown = rows.length <= room ? rows : [...rows.slice(0, room - 1), [`+ ${rows.length - room + 1} more`, '', '', '']];
  table({ ...sheet.sheetRows, rows: shown }, 201, yb - 6, 85, items);
}

function notesBlock(set: DrawingSet, items: PaperItem[]): void {
  const x = 16;
  const width = 180;
  let y = 46;
  const checks = set.checks
    ? `Design-rule checks: ${set.checks.errors} error${set.checks.errors === 1 ? '' : 's'}, ${set.checks.warnings} warning${set.checks.warnings === 1 ? '' : 's'}.`
    : 'Design-rule checks: NOT RUN in this build - run the checks before cutting.';
  const lines: Array<{ s: string; bold?: boolean }> = [
    { s: `General tolerance: ${set.generalTolerance}.  ${checks}`, bold: true },
    ...set.edgeNotes.flatMap((n) => wrap(n, width).map((s) => ({ s }))),
    ...set.safetyNotes.flatMap((n, i) => wrap(`${i === 0 ? 'Safety: ' : ''}${n}`, width).map((s) => ({ s }))),
  ];
  for (const l of lines) {
    items.push(text([x, y], l.s, T, 'start', l.bold ?? false));
    y -= T * 1.3;
  }
}

function titleBlock(set: DrawingSet, sheet: DrawingSheet, title: string, n: number, m: number, items: PaperItem[]): void {
  const x = 201;
  const y = FRAME.y0;
  const w = FRAME.x1 - x;
  const h = TITLE_BLOCK_TOP - FRAME.y0;
  items.push(rect(x, y, w, h, 'frame'));
  items.push({ kind: 'line', a: [x, y + 20], b: [x + w, y + 20], stroke: 'thin' });
  items.push({ kind: 'line', a: [x, y + 10], b: [x + w, y + 10], stroke: 'thin' });
  items.push({ kind: 'line', a: [x + w / 2, y], b: [x + w / 2, y + 20], stroke: 'thin' });
  items.push(text([x + 2, y + 23.5], `${set.design}`, 4, 'start', true));
  items.push(text([x + w - 2, y + 23.5], `rev ${set.revision}`, 3, 'end', true));
  items.push(text([x + 2, y + 13.5], `part: ${sheet.kind === 'part' ? title : 'summary'}`, T));
  items.push(text([x + w / 2 + 2, y + 13.5], `scale: ${sheet.kind === 'part' ? sheet.scale.label : '-'}`, T));
  items.push(text([x + 2, y + 3.5], `date: ${set.date ?? 'not given'}`, T));
  items.push(text([x + w / 2 + 2, y + 3.5], `sheet ${n} of ${m}`, T, 'start', true));
  items.push(text([x + w - 2, y + 27], `for ${set.shop}`, T, 'end'));
}

/** Greedy word wrap to a width in mm at the body text size. */
const wrap = (s: string, widthMm: number): string[] => wrapText(s, widthMm, T);
