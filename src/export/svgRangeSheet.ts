import type { Frame } from '../geometry/frame.js';
import { partBBox } from '../geometry/metrics.js';
import type { Part } from '../geometry/part.js';
import type { Vec2 } from '../geometry/types.js';
import { textWidthMm } from '../params/textWidth.js';
import { fmt, xmlEscape } from './format.js';
import { EMPTY_BOX, padBox, pictureSvg, PLAN_VIEW, svgText, textBox, unionBox, type Box, type LegendEntry } from './picture.js';
import { framePlan, mappedBox, mergedLegend, ROLE_FILL, type FramePlan } from './svgOverview.js';
import { loopPathData } from './svgPath.js';

/** One column of the range sheet: a frame and the text printed under its plan view. */
export type RangeSheetMember = Readonly<{ label: string; notes: readonly string[]; frame: Frame }>;

export type RangeSheetOptions = Readonly<{
  title: string;
  /** Gap between columns and rows. mm. */
  gapMm?: number;
  /** Lines printed at the foot of the sheet (cautions). */
  footer?: readonly string[];
}>;

/** Text sizes and line pitch: the size's name, its notes, a part's caption. mm. */
const LABEL_MM = 5;
const NOTE_MM = 3.5;
const CAPTION_MM = 3;
const LINE = 1.35;
/** Widest stroke of a flat part (its outline). mm. */
const PART_STROKE_MM = 0.2;

const ORIENTATION_NOTE = 'Plan views with the front up; flat plates in their own coordinates, +x up (an arm\u2019s motor end up). One scale: 1 unit = 1 mm.';

/** One flat plate in a column: its caption, and its size on screen in the plan-view convention (part +x up). */
type Cell = Readonly<{ part: Part; caption: string; w: number; h: number; cellW: number }>;

const captionOf = (p: Part): string => `${p.name} \u00d7${p.quantity}, ${fmt(p.thicknessMm, 2)} mm`;

function cellOf(part: Part): Cell {
  const bb = PLAN_VIEW.mapBox(partBBox(part));
  const w = bb.x1 - bb.x0;
  const h = bb.y1 - bb.y0;
  const caption = captionOf(part);
  return { part, caption, w, h, cellW: Math.max(w + PART_STROKE_MM, textWidthMm(caption, CAPTION_MM)) };
}

/** Cells flowed left to right in rows no wider than `widthMm`. */
function rowsOf(cells: readonly Cell[], widthMm: number, gap: number): Cell[][] {
  const rows: Cell[][] = [];
  let row: Cell[] = [];
  let used = 0;
  for (const c of cells) {
    if (row.length && used + gap + c.cellW > widthMm) {
      rows.push(row);
      row = [];
      used = 0;
    }
    used += (row.length ? gap : 0) + c.cellW;
    row.push(c);
  }
  if (row.length) rows.push(row);
  return rows;
}

const rowWidth = (row: readonly Cell[], gap: number): number => row.reduce((a, c) => a + c.cellW, 0) + gap * (row.length - 1);

/**
 * The range sheet: every size of a size range side by side at one scale (one user unit = 1 mm), in the
 * picture convention (src/export/picture.ts): each column holds the plan view of the assembled frame
 * (front up, prop discs dashed, plates by role), its name and notes, and every plate flat in its own
 * coordinates (+x up) under it; a front arrow, a scale bar, a legend and the cautions at the foot.
 * Data in, SVG text out; deterministic.
 */
export function rangeSheetSvg(members: readonly RangeSheetMember[], options: RangeSheetOptions): string {
  const gap = options.gapMm ?? 15;
  const body: string[] = [];
  const legends: LegendEntry[][] = [];
  let content: Box = EMPTY_BOX;
  let x = 0;
  for (const m of members) {
    // Where the plan lands at the origin tells its size; it is then moved into its column.
    const probe = framePlan(m.frame).box;
    const cells = m.frame.parts.map(cellOf);
    const texts = [textWidthMm(m.label, LABEL_MM, true), ...m.notes.map((n) => textWidthMm(n, NOTE_MM))];
    // The column is as wide as its plan, its widest text, and its widest plate.
    const colW = Math.max(probe.x1 - probe.x0, ...texts, ...cells.map((c) => c.cellW));
    const cx = x + colW / 2;
    const shift: Vec2 = [cx - (probe.x0 + probe.x1) / 2, -probe.y0];
    const map = (p: Vec2): Vec2 => {
      const q = PLAN_VIEW.map(p);
      return [q[0] + shift[0], q[1] + shift[1]];
    };
    const plan: FramePlan = framePlan(m.frame, map);
    legends.push([...plan.legend]);
    body.push(`<g id="${xmlEscape(slugId(m.label))}">`, ...plan.body);
    let box = plan.box;
    let y = plan.box.y1 + LABEL_MM * LINE;
    body.push(svgText(cx, y, m.label, LABEL_MM, { anchor: 'middle', bold: true }));
    box = unionBox(box, textBox(cx, y, m.label, LABEL_MM, 'middle', true));
    for (const n of m.notes) {
      y += NOTE_MM * LINE;
      body.push(svgText(cx, y, n, NOTE_MM, { anchor: 'middle' }));
      box = unionBox(box, textBox(cx, y, n, NOTE_MM, 'middle'));
    }
    y += gap / 2;
    for (const row of rowsOf(cells, colW, gap / 2)) {
      let px = cx - rowWidth(row, gap / 2) / 2;
      const captionY = y + CAPTION_MM;
      const top = captionY + CAPTION_MM * 0.6;
      for (const c of row) {
        const mid = px + c.cellW / 2;
        body.push(svgText(mid, captionY, c.caption, CAPTION_MM, { anchor: 'middle' }));
        box = unionBox(box, textBox(mid, captionY, c.caption, CAPTION_MM, 'middle'));
        const bb = PLAN_VIEW.mapBox(partBBox(c.part));
        const at: Vec2 = [mid - (bb.x0 + bb.x1) / 2, top - bb.y0];
        const pmap = (p: Vec2): Vec2 => {
          const q = PLAN_VIEW.map(p);
          return [q[0] + at[0], q[1] + at[1]];
        };
        const d = [c.part.outline, ...c.part.features.map((f) => f.loop)].map((l) => loopPathData(l, pmap)).join(' ');
        body.push(`<path d="${d}" fill="${ROLE_FILL[c.part.role]}" fill-opacity="0.85" fill-rule="evenodd" stroke="#000000" stroke-width="${PART_STROKE_MM}"><title>${xmlEscape(c.part.name)}</title></path>`);
        box = unionBox(box, padBox(mappedBox(partBBox(c.part), pmap), PART_STROKE_MM / 2));
        px += c.cellW + gap / 2;
      }
      y = top + Math.max(...row.map((c) => c.h)) + gap / 2;
    }
    body.push('</g>');
    content = unionBox(content, box);
    x += colW + gap;
  }
  return pictureSvg({
    title: options.title,
    heading: `${options.title} \u2014 one scale, 1 unit = 1 mm`,
    body,
    contentBox: content,
    front: 'front',
    legend: mergedLegend(legends),
    notes: [ORIENTATION_NOTE, ...(options.footer ?? [])],
  });
}

const slugId = (s: string): string => `size-${s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '')}`;
