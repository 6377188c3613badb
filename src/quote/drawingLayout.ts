import { arc, assertNever, line, type Loop, type Segment, type Vec2 } from '../geometry/index.js';
import { DRAWING_VIEW_MM, type DrawingSet, type DrawingSheet, type HardwareSheet, type PartSheet, type SummarySheet, type Table } from './drawing.js';

/**
 * Paper layout of the drawing sheets: A4 landscape, millimetres, origin at the lower-left corner,
 * y up (the writers flip y). The PDF and SVG writers serialise these items and compute nothing.
 */

export const SHEET_MM = { width: 297, height: 210 } as const;

export type Stroke = 'outline' | 'thin' | 'frame';
export type PaperItem =
  | Readonly<{ kind: 'loop'; loop: Loop; stroke: Stroke }>
  | Readonly<{ kind: 'line'; a: Vec2; b: Vec2; stroke: Stroke }>
  /** Filled triangle (arrowheads). */
  | Readonly<{ kind: 'triangle'; points: readonly [Vec2, Vec2, Vec2] }>
  /** Text with its baseline at `at`; rotation counter-clockwise in degrees. Size is the cap-to-baseline em, mm. */
  | Readonly<{ kind: 'text'; at: Vec2; text: string; sizeMm: number; anchor: 'start' | 'middle' | 'end'; bold?: boolean; rotateDeg?: number }>;

export type PaperSheet = Readonly<{ widthMm: number; heightMm: number; title: string; items: readonly PaperItem[] }>;

const FRAME = { x0: 10, y0: 10, x1: 287, y1: 200 };
/** The part view: the scaled part's extent is centred in this box (room for dimensions around it). */
const VIEW = { x: 24, y: 56, w: DRAWING_VIEW_MM.width, h: DRAWING_VIEW_MM.height };
const DIM_STEP_MM = 5;
const ARROW_MM = 2.2;
const TEXT_MM = 2.5;
/** Average Helvetica advance, em per character: used only to size table columns. */
const CHAR_EM = 0.55;

/** Lay out every sheet of the set; sheet n of m numbers follow the set's order. */
export function layoutDrawing(set: DrawingSet): PaperSheet[] {
  return set.sheets.map((s, i) => layoutSheet(set, s, i + 1, set.sheets.length));
}

function layoutSheet(set: DrawingSet, sheet: DrawingSheet, n: number, m: number): PaperSheet {
  const items: PaperItem[] = [];
  items.push(rect(FRAME.x0, FRAME.y0, FRAME.x1 - FRAME.x0, FRAME.y1 - FRAME.y0, 'frame'));
  switch (sheet.kind) {
    case 'part':
      partView(sheet, items);
      break;
    case 'summary':
      summaryView(sheet, items);
      break;
    case 'hardware':
      hardwareView(sheet, items);
      break;
    default:
      assertNever(sheet);
  }
  notesBlock(set, items);
  titleBlock(set, sheet, n, m, items);
  return { widthMm: SHEET_MM.width, heightMm: SHEET_MM.height, title: `${set.design} - ${sheet.title}`, items };
}

function rect(x: number, y: number, w: number, h: number, stroke: Stroke): PaperItem {
  return { kind: 'loop', stroke, loop: [line([x, y], [x + w, y]), line([x + w, y], [x + w, y + h]), line([x + w, y + h], [x, y + h]), line([x, y + h], [x, y])] };
}

const text = (at: Vec2, s: string, sizeMm = TEXT_MM, anchor: 'start' | 'middle' | 'end' = 'start', bold = false, rotateDeg = 0): PaperItem => ({
  kind: 'text',
  at,
  text: s,
  sizeMm,
  anchor,
  ...(bold ? { bold } : {}),
  ...(rotateDeg ? { rotateDeg } : {}),
});

function partView(sheet: PartSheet, items: PaperItem[]): void {
  const [x0, y0, x1, y1] = sheet.bboxMm;
  const k = sheet.scale.factor;
  // Centre the scaled extent in the view box.
  const ox = VIEW.x + (VIEW.w - (x1 - x0) * k) / 2;
  const oy = VIEW.y + (VIEW.h - (y1 - y0) * k) / 2;
  const map = (p: Vec2): Vec2 => [ox + (p[0] - x0) * k, oy + (p[1] - y0) * k];
  const mapLoop = (loop: Loop): Loop => loop.map((s) => mapSegment(s, map, k));
  items.push({ kind: 'loop', loop: mapLoop(sheet.part.outline), stroke: 'outline' });
  for (const f of sheet.part.features) {
    items.push({ kind: 'loop', loop: mapLoop(f.loop), stroke: 'outline' });
    if (f.centerMm && f.diameterMm) {
      // Centre mark: a cross a little larger than the hole.
      const c = map(f.centerMm);
      const r = (f.diameterMm / 2) * k + 1;
      items.push({ kind: 'line', a: [c[0] - r, c[1]], b: [c[0] + r, c[1]], stroke: 'thin' });
      items.push({ kind: 'line', a: [c[0], c[1] - r], b: [c[0], c[1] + r], stroke: 'thin' });
    }
  }
  const top = oy + (y1 - y0) * k;
  const right = ox + (x1 - x0) * k;
  for (const d of sheet.dimensions) dimension(d.axis, map(d.fromMm), map(d.toMm), d.level, d.text, { bottom: oy, top, left: ox, right }, items);
  // Weave: an arrow along the 0° fibres beside the view.
  const wr = (sheet.weaveDeg * Math.PI) / 180;
  const wc: Vec2 = [207, 50];
  const tip: Vec2 = [wc[0] + 12 * Math.cos(wr), wc[1] + 12 * Math.sin(wr)];
  items.push({ kind: 'line', a: wc, b: tip, stroke: 'thin' });
  items.push(arrowHead(tip, [Math.cos(wr), Math.sin(wr)]));
  items.push(text([wc[0], wc[1] - 4], '0 deg fibre direction', 2.2));
  items.push(text([VIEW.x, FRAME.y1 - 7], `${sheet.title}`, 5, 'start', true));
  items.push(text([VIEW.x, FRAME.y1 - 12], `scale ${sheet.scale.label}   dimensions in mm from the lower-left corner of the part's extent`, 2.4));
  // Right column: facts, hole table, cut data.
  let y = FRAME.y1 - 8;
  const colX = 205;
  y = table({ title: 'Part', header: ['item', 'value'], rows: sheet.facts.map(([a, b]) => [a, b]) }, colX, y, items);
  y = table(sheet.holeTable, colX, y - 4, items);
  table(sheet.cutTable, colX, y - 4, items);
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

type Box = { bottom: number; top: number; left: number; right: number };

/**
 * A linear dimension: extension lines from both points to a dimension line `level` steps outside the
 * view (positive levels below / left, negative above / right), arrows at both ends, value centred.
 */
function dimension(axis: 'x' | 'y', a: Vec2, b: Vec2, level: number, label: string, box: Box, items: PaperItem[]): void {
  const step = DIM_STEP_MM * Math.abs(level);
  if (axis === 'x') {
    const y = level > 0 ? box.bottom - step : box.top + step;
    items.push({ kind: 'line', a: [a[0], a[1] + (level > 0 ? -1 : 1)], b: [a[0], y + (level > 0 ? -1.5 : 1.5)], stroke: 'thin' });
    items.push({ kind: 'line', a: [b[0], b[1] + (level > 0 ? -1 : 1)], b: [b[0], y + (level > 0 ? -1.5 : 1.5)], stroke: 'thin' });
    items.push({ kind: 'line', a: [a[0], y], b: [b[0], y], stroke: 'thin' });
    if (Math.abs(b[0] - a[0]) > 2 * ARROW_MM) {
      items.push(arrowHead([a[0], y], [-1, 0]));
      items.push(arrowHead([b[0], y], [1, 0]));
    }
    items.push(text([(a[0] + b[0]) / 2, y + 0.8], label, TEXT_MM * 0.9, 'middle'));
  } else {
    const x = level > 0 ? box.left - step : box.right + step;
    items.push({ kind: 'line', a: [a[0] + (level > 0 ? -1 : 1), a[1]], b: [x + (level > 0 ? -1.5 : 1.5), a[1]], stroke: 'thin' });
    items.push({ kind: 'line', a: [b[0] + (level > 0 ? -1 : 1), b[1]], b: [x + (level > 0 ? -1.5 : 1.5), b[1]], stroke: 'thin' });
    items.push({ kind: 'line', a: [x, a[1]], b: [x, b[1]], stroke: 'thin' });
    if (Math.abs(b[1] - a[1]) > 2 * ARROW_MM) {
      items.push(arrowHead([x, a[1]], [0, -1]));
      items.push(arrowHead([x, b[1]], [0, 1]));
    }
    items.push(text([x - 0.8, (a[1] + b[1]) / 2], label, TEXT_MM * 0.9, 'middle', false, 90));
  }
}

/** Arrowhead with its tip at `tip`, pointing along unit vector dir. */
function arrowHead(tip: Vec2, dir: Vec2): PaperItem {
  const back: Vec2 = [tip[0] - dir[0] * ARROW_MM, tip[1] - dir[1] * ARROW_MM];
  const n: Vec2 = [-dir[1] * ARROW_MM * 0.3, dir[0] * ARROW_MM * 0.3];
  return { kind: 'triangle', points: [tip, [back[0] + n[0], back[1] + n[1]], [back[0] - n[0], back[1] - n[1]]] };
}

/** A table whose top-left corner is at (x, yTop); returns the y of its bottom edge. */
function table(t: Table, x: number, yTop: number, items: PaperItem[], sizeMm = 2.3, maxWidthMm = 80): number {
  const rowH = sizeMm * 1.6;
  const cols = t.header.length;
  const widths = t.header.map((h, i) => Math.max(h.length, ...t.rows.map((r) => (r[i] ?? '').length)) * sizeMm * CHAR_EM + 2);
  const total = widths.reduce((a, b) => a + b, 0);
  const k = total > maxWidthMm ? maxWidthMm / total : 1;
  const size = sizeMm * Math.min(1, Math.max(k, 0.6));
  const w = widths.map((v) => v * k);
  items.push(text([x, yTop - size], t.title, size * 1.05, 'start', true));
  let y = yTop - size - 1.5;
  const rowLine = (cells: readonly string[], bold: boolean) => {
    let cx = x;
    for (let i = 0; i < cols; i++) {
      items.push(text([cx + 1, y - rowH + 1.1], cells[i] ?? '', size, 'start', bold));
      cx += w[i];
    }
    y -= rowH;
    items.push({ kind: 'line', a: [x, y], b: [x + w.reduce((a, b) => a + b, 0), y], stroke: 'thin' });
  };
  items.push({ kind: 'line', a: [x, y], b: [x + w.reduce((a, b) => a + b, 0), y], stroke: 'thin' });
  rowLine(t.header, true);
  for (const r of t.rows) rowLine(r, false);
  return y;
}

function summaryView(sheet: SummarySheet, items: PaperItem[]): void {
  items.push(text([16, FRAME.y1 - 8], 'Quote summary', 5, 'start', true));
  let y = FRAME.y1 - 14;
  const [parts, sheets, batch] = sheet.tables;
  y = table(parts, 16, y, items, 2.3, 180);
  const y2 = table(sheets, 16, y - 5, items, 2.3, 180);
  const yb = table(batch, 205, FRAME.y1 - 14, items, 2.3, 78);
  // Per-sheet utilisation below the batch table, as many rows as fit above the title block.
  const room = Math.max(1, Math.floor((yb - 8 - 45) / (2.3 * 1.6)) - 2);
  const rows = sheet.sheetRows.rows;
  const shown = rows.length <= room ? rows : [...rows.slice(0, room - 1), [`+ ${rows.length - room + 1} more`, '', '', '']];
  table({ ...sheet.sheetRows, rows: shown }, 205, yb - 6, items, 2.3, 78);
  let ly = y2 - 6;
  for (const l of sheet.lines) {
    items.push(text([16, ly], l, 2.3));
    ly -= 3.6;
  }
}

function hardwareView(sheet: HardwareSheet, items: PaperItem[]): void {
  items.push(text([16, FRAME.y1 - 8], 'Hardware list', 5, 'start', true));
  const y = table(sheet.table, 16, FRAME.y1 - 14, items, 2.3, 260);
  let ly = y - 6;
  for (const l of sheet.lines) {
    items.push(text([16, ly], l, 2.3));
    ly -= 3.6;
  }
}

function notesBlock(set: DrawingSet, items: PaperItem[]): void {
  const x = 16;
  let y = 40;
  const checks = set.checks
    ? `Design-rule checks: ${set.checks.errors} error${set.checks.errors === 1 ? '' : 's'}, ${set.checks.warnings} warning${set.checks.warnings === 1 ? '' : 's'}.`
    : 'Design-rule checks: NOT RUN in this build - run the checks before cutting.';
  items.push(text([x, y], checks, 2.4, 'start', true));
  y -= 4;
  items.push(text([x, y], `General tolerance: ${set.generalTolerance}.`, 2.4));
  y -= 4;
  items.push(text([x, y], 'Safety:', 2.4, 'start', true));
  for (const n of set.safetyNotes) {
    for (const l of wrap(n, 110)) {
      y -= 3.2;
      items.push(text([x + 2, y], l, 2.2));
    }
  }
}

function titleBlock(set: DrawingSet, sheet: DrawingSheet, n: number, m: number, items: PaperItem[]): void {
  const x = 200;
  const y = FRAME.y0;
  const w = FRAME.x1 - x;
  const h = 30;
  items.push(rect(x, y, w, h, 'frame'));
  items.push({ kind: 'line', a: [x, y + 20], b: [x + w, y + 20], stroke: 'thin' });
  items.push({ kind: 'line', a: [x, y + 10], b: [x + w, y + 10], stroke: 'thin' });
  items.push({ kind: 'line', a: [x + w / 2, y], b: [x + w / 2, y + 20], stroke: 'thin' });
  items.push(text([x + 2, y + 23.5], `${set.design}`, 4, 'start', true));
  items.push(text([x + w - 2, y + 23.5], `rev ${set.revision}`, 3, 'end', true));
  items.push(text([x + 2, y + 13.5], `part: ${sheet.kind === 'part' ? sheet.title : sheet.kind}`, 2.6));
  items.push(text([x + w / 2 + 2, y + 13.5], `scale: ${sheet.kind === 'part' ? sheet.scale.label : '-'}`, 2.6));
  items.push(text([x + 2, y + 3.5], `date: ${set.date ?? 'not given'}`, 2.6));
  items.push(text([x + w / 2 + 2, y + 3.5], `sheet ${n} of ${m}`, 2.6, 'start', true));
  items.push(text([x + w - 2, y + 27.5], `quoted for ${set.shop}`, 2, 'end'));
}

/** Greedy word wrap to about `chars` characters per line. */
function wrap(s: string, chars: number): string[] {
  const out: string[] = [];
  let cur = '';
  for (const w of s.split(' ')) {
    if (cur && cur.length + 1 + w.length > chars) {
      out.push(cur);
      cur = w;
    } else cur = cur ? `${cur} ${w}` : w;
  }
  if (cur) out.push(cur);
  return out;
}
