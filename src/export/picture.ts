import type { BBox, Vec2 } from '../geometry/types.js';
import { TEXT_ASCENT_EM, TEXT_DESCENT_EM, textWidthMm } from '../params/textWidth.js';
import { fmt, xmlEscape } from './format.js';

/**
 * The one picture convention every SVG writer follows (see DEVELOPERS.md, "Pictures"):
 * - plan views put the frame's front (+x; a part's own +x) UP and its left (+y) to the LEFT;
 * - one user unit is one millimetre, so a scale bar stays true whatever the print size;
 * - every picture has a front arrow and a scale bar, and a legend for every colour and symbol it uses;
 * - labels never overlap (`placeLabels`, leader lines when a label has to move away);
 * - the viewBox holds every stroke (`padBox` by half the widest stroke) and every label;
 * - text uses the generic family `sans-serif`, never a named font.
 * Screen coordinates here are SVG user units, y down.
 */

export const FONT_FAMILY = 'sans-serif';

/** A screen-space box, y down. */
export type Box = Readonly<{ x0: number; y0: number; x1: number; y1: number }>;

export const EMPTY_BOX: Box = { x0: Infinity, y0: Infinity, x1: -Infinity, y1: -Infinity };
export const unionBox = (a: Box, b: Box): Box => ({ x0: Math.min(a.x0, b.x0), y0: Math.min(a.y0, b.y0), x1: Math.max(a.x1, b.x1), y1: Math.max(a.y1, b.y1) });
export const padBox = (b: Box, d: number): Box => ({ x0: b.x0 - d, y0: b.y0 - d, x1: b.x1 + d, y1: b.y1 + d });
export const boxesOverlap = (a: Box, b: Box): boolean => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
const isEmpty = (b: Box): boolean => !(b.x1 >= b.x0 && b.y1 >= b.y0);

/**
 * Model coordinates (x forward, y left, y up on paper; or a part's own x, y) to screen with front up:
 * screen x = −y, screen y = −x. A reflection, so text is never drawn through it: writers map points
 * with `map` and draw text in screen space. `matrix` is the same map as an SVG transform, for paths.
 */
export type PlanView = Readonly<{ map: (p: Vec2) => Vec2; mapBox: (b: BBox) => Box; matrix: string }>;

export const PLAN_VIEW: PlanView = {
  map: (p) => [-p[1] + 0, -p[0] + 0],
  mapBox: (b) => ({ x0: -b[3], y0: -b[2], x1: -b[1], y1: -b[0] }),
  matrix: 'matrix(0 -1 -1 0 0 0)',
};

/** Where a text's box lies, from its baseline point and anchor (the renderer's ascent-to-descent box). */
export function textBox(x: number, y: number, text: string, sizeMm: number, anchor: 'start' | 'middle' | 'end' = 'start', bold = false): Box {
  const w = textWidthMm(text, sizeMm, bold);
  const left = anchor === 'start' ? x : anchor === 'middle' ? x - w / 2 : x - w;
  return { x0: left, y0: y - TEXT_ASCENT_EM * sizeMm, x1: left + w, y1: y + TEXT_DESCENT_EM * sizeMm };
}

export type TextOptions = Readonly<{ anchor?: 'start' | 'middle' | 'end'; bold?: boolean; fill?: string; cls?: string }>;

/** One `<text>` element in screen space. */
export function svgText(x: number, y: number, text: string, sizeMm: number, o: TextOptions = {}): string {
  const anchor = o.anchor && o.anchor !== 'start' ? ` text-anchor="${o.anchor}"` : '';
  const weight = o.bold ? ' font-weight="bold"' : '';
  const cls = o.cls ? ` class="${o.cls}"` : '';
  return `<text${cls} x="${fmt(x, 3)}" y="${fmt(y, 3)}" font-size="${fmt(sizeMm, 3)}"${anchor}${weight} fill="${o.fill ?? '#000000'}" stroke="none">${xmlEscape(text)}</text>`;
}

/** A drawn piece of annotation and the box it covers. */
export type Drawn = Readonly<{ svg: string; box: Box }>;

/**
 * An arrow pointing up (the frame's front in a plan view) with its word under it; (x, y) is the tip.
 * @example frontArrow(5, 5).svg
 */
export function frontArrow(x: number, y: number, label = 'front', sizeMm = 3, direction: 'up' | 'right' = 'up'): Drawn {
  if (direction === 'right') return rightArrow(x, y, label, sizeMm);
  const len = 10;
  const head = 3;
  const svg = [
    `<g class="front-arrow">`,
    `<line x1="${fmt(x, 3)}" y1="${fmt(y + head, 3)}" x2="${fmt(x, 3)}" y2="${fmt(y + len, 3)}" stroke="#000000" stroke-width="0.5"/>`,
    `<path d="M${fmt(x, 3)} ${fmt(y, 3)} l-1.6 ${head} h3.2 z" fill="#000000" stroke="none"/>`,
    svgText(x, y + len + sizeMm * 1.1, label, sizeMm, { anchor: 'middle' }),
    '</g>',
  ].join('');
  const tb = textBox(x, y + len + sizeMm * 1.1, label, sizeMm, 'middle');
  return { svg, box: unionBox({ x0: x - 1.6, y0: y, x1: x + 1.6, y1: y + len }, tb) };
}

/** The same arrow pointing right (the front in a side view); (x, y) is its tail, the word under it. */
function rightArrow(x: number, y: number, label: string, sizeMm: number): Drawn {
  const len = 10;
  const head = 3;
  const cy = y + 2;
  const svg = [
    `<g class="front-arrow">`,
    `<line x1="${fmt(x, 3)}" y1="${fmt(cy, 3)}" x2="${fmt(x + len - head, 3)}" y2="${fmt(cy, 3)}" stroke="#000000" stroke-width="0.5"/>`,
    `<path d="M${fmt(x + len, 3)} ${fmt(cy, 3)} l-${head} -1.6 v3.2 z" fill="#000000" stroke="none"/>`,
    svgText(x + len / 2, cy + 2 + sizeMm * 1.1, label, sizeMm, { anchor: 'middle' }),
    '</g>',
  ].join('');
  return { svg, box: unionBox({ x0: x, y0: cy - 1.6, x1: x + len, y1: cy + 1.6 }, textBox(x + len / 2, cy + 2 + sizeMm * 1.1, label, sizeMm, 'middle')) };
}

/** The longest "nice" length (1, 2, 5 × 10^k mm) not above maxMm. */
export function niceLengthMm(maxMm: number): number {
  if (!(maxMm > 0)) throw new RangeError(`scale bar length must be positive, got ${maxMm}`);
  const k = Math.floor(Math.log10(maxMm));
  for (const m of [5, 2, 1]) if (m * 10 ** k <= maxMm + 1e-9) return m * 10 ** k;
  return 10 ** k;
}

/**
 * A scale bar `lengthMm` long (in user units, 1 unit = 1 mm) starting at (x, y), black and white
 * halves, its length written under it.
 */
export function scaleBar(x: number, y: number, lengthMm: number, sizeMm = 3): Drawn {
  const h = 1.5;
  const half = lengthMm / 2;
  const label = `${fmt(lengthMm, 3)} mm`;
  const svg = [
    `<g class="scale-bar">`,
    `<rect x="${fmt(x, 3)}" y="${fmt(y, 3)}" width="${fmt(half, 3)}" height="${h}" fill="#000000" stroke="#000000" stroke-width="0.2"/>`,
    `<rect x="${fmt(x + half, 3)}" y="${fmt(y, 3)}" width="${fmt(half, 3)}" height="${h}" fill="#ffffff" stroke="#000000" stroke-width="0.2"/>`,
    svgText(x, y + h + sizeMm * 1.1, '0', sizeMm, { anchor: 'middle' }),
    svgText(x + lengthMm, y + h + sizeMm * 1.1, label, sizeMm, { anchor: 'middle' }),
    '</g>',
  ].join('');
  const box = unionBox(
    { x0: x - 0.1, y0: y - 0.1, x1: x + lengthMm + 0.1, y1: y + h + 0.1 },
    unionBox(textBox(x, y + h + sizeMm * 1.1, '0', sizeMm, 'middle'), textBox(x + lengthMm, y + h + sizeMm * 1.1, label, sizeMm, 'middle')),
  );
  return { svg, box };
}

/** What a legend row shows: a filled swatch, a line (dashed or not), a ring marker, or a cross. */
export type LegendEntry = Readonly<{
  symbol: 'fill' | 'line' | 'ring' | 'cross' | 'dot';
  colour: string;
  label: string;
  dash?: string;
  /** Fill opacity of a swatch or ring. */
  opacity?: number;
}>;

const SWATCH_MM = 4;

function swatch(e: LegendEntry, x: number, y: number): string {
  const c = e.colour;
  const cx = x + SWATCH_MM / 2;
  const cy = y + SWATCH_MM / 2;
  switch (e.symbol) {
    case 'fill':
      return `<rect x="${fmt(x, 3)}" y="${fmt(y, 3)}" width="${SWATCH_MM}" height="${SWATCH_MM}" fill="${c}" fill-opacity="${fmt(e.opacity ?? 1, 3)}" stroke="#000000" stroke-width="0.2"${e.dash ? ` stroke-dasharray="${e.dash}"` : ''}/>`;
    case 'line':
      return `<line x1="${fmt(x, 3)}" y1="${fmt(cy, 3)}" x2="${fmt(x + SWATCH_MM, 3)}" y2="${fmt(cy, 3)}" stroke="${c}" stroke-width="0.6"${e.dash ? ` stroke-dasharray="${e.dash}"` : ''}/>`;
    case 'ring':
      return `<circle cx="${fmt(cx, 3)}" cy="${fmt(cy, 3)}" r="1.7" fill="${c}" fill-opacity="${fmt(e.opacity ?? 0.15, 3)}" stroke="${c}" stroke-width="0.5"/>`;
    case 'cross':
      return `<path d="M${fmt(x, 3)} ${fmt(cy, 3)}H${fmt(x + SWATCH_MM, 3)}M${fmt(cx, 3)} ${fmt(y, 3)}V${fmt(y + SWATCH_MM, 3)}" stroke="${c}" stroke-width="0.3" fill="none"/>`;
    case 'dot':
      return `<circle cx="${fmt(cx, 3)}" cy="${fmt(cy, 3)}" r="1.2" fill="${c}" stroke="none"/>`;
  }
}

/**
 * A legend: rows of symbol and words, flowing left to right and wrapping at maxWidthMm, from the
 * top-left corner (x, y).
 */
export function legend(x: number, y: number, entries: readonly LegendEntry[], maxWidthMm: number, sizeMm = 3): Drawn {
  const rowH = Math.max(SWATCH_MM, sizeMm * 1.2) + 1.5;
  const gap = 5;
  let cx = x;
  let cy = y;
  let box = EMPTY_BOX;
  const out: string[] = ['<g class="legend">'];
  for (const e of entries) {
    const w = SWATCH_MM + 1.5 + textWidthMm(e.label, sizeMm);
    if (cx > x && cx + w > x + maxWidthMm) {
      cx = x;
      cy += rowH;
    }
    out.push(swatch(e, cx, cy));
    const tx = cx + SWATCH_MM + 1.5;
    const ty = cy + SWATCH_MM / 2 + sizeMm * 0.35;
    out.push(svgText(tx, ty, e.label, sizeMm));
    box = unionBox(box, unionBox({ x0: cx - 0.3, y0: cy - 0.3, x1: cx + SWATCH_MM + 0.3, y1: cy + SWATCH_MM + 0.3 }, textBox(tx, ty, e.label, sizeMm)));
    cx += w + gap;
  }
  out.push('</g>');
  return { svg: entries.length ? out.join('') : '', box: entries.length ? box : { x0: x, y0: y, x1: x, y1: y } };
}

/** A label to place near a point (screen space). */
export type LabelRequest = Readonly<{
  anchor: Vec2;
  text: string;
  sizeMm: number;
  fill?: string;
  bold?: boolean;
  cls?: string;
  /** Radius of the symbol at the anchor: the label starts beyond it. mm. */
  clearMm?: number;
}>;

/** A placed label: its baseline point, the box it covers, and a leader from the anchor when it moved away. */
export type PlacedLabel = LabelRequest & Readonly<{ at: Vec2; box: Box; leader: readonly [Vec2, Vec2] | null }>;

const DIRECTIONS: readonly Vec2[] = Array.from({ length: 16 }, (_, k) => {
  // Right, upper right, up ... in 22.5° steps, starting to the right of the anchor.
  const a = (-k * Math.PI) / 8;
  return [Math.cos(a), Math.sin(a)] as Vec2;
});

/**
 * Places labels one by one, each at the first spot (rings of growing radius around its anchor, 16
 * directions each) whose box overlaps no label placed before and no obstacle box. Labels beyond the
 * first ring get a leader line from the anchor to the nearest point of their box. Deterministic.
 * @param obstacles boxes labels must keep off (markers, the legend, other text)
 * @param gapMm clearance kept between label boxes
 */
export function placeLabels(requests: readonly LabelRequest[], obstacles: readonly Box[] = [], gapMm = 0.6): PlacedLabel[] {
  const taken: Box[] = [...obstacles];
  const out: PlacedLabel[] = [];
  for (const r of requests) {
    const w = textWidthMm(r.text, r.sizeMm, r.bold);
    const asc = TEXT_ASCENT_EM * r.sizeMm;
    const desc = TEXT_DESCENT_EM * r.sizeMm;
    const h = asc + desc;
    let chosen: { box: Box; ring: number } | null = null;
    const first = (r.clearMm ?? 0) + r.sizeMm * 0.3;
    for (let ring = 0; ring < 40 && !chosen; ring++) {
      const rad = first + ring * r.sizeMm * 1.2;
      for (const d of DIRECTIONS) {
        // The box's centre sits on the ray so that the box edge nearest the anchor is `rad` away.
        const cx = r.anchor[0] + d[0] * (rad + w / 2 * Math.abs(d[0]));
        const cy = r.anchor[1] + d[1] * (rad + h / 2 * Math.abs(d[1]));
        const box: Box = { x0: cx - w / 2, y0: cy - h / 2, x1: cx + w / 2, y1: cy + h / 2 };
        const grown = padBox(box, gapMm);
        if (taken.some((t) => boxesOverlap(grown, t))) continue;
        chosen = { box, ring };
        break;
      }
    }
    const box = chosen ? chosen.box : { x0: r.anchor[0], y0: r.anchor[1] - asc, x1: r.anchor[0] + w, y1: r.anchor[1] + desc };
    taken.push(box);
    const at: Vec2 = [box.x0, box.y0 + asc];
    const near: Vec2 = [Math.min(Math.max(r.anchor[0], box.x0), box.x1), Math.min(Math.max(r.anchor[1], box.y0), box.y1)];
    const leader = chosen && chosen.ring > 0 ? ([r.anchor, near] as const) : null;
    out.push({ ...r, at, box, leader });
  }
  return out;
}

/** The SVG of placed labels: leaders first (thin, the label's colour), then the texts. */
export function labelsSvg(labels: readonly PlacedLabel[]): string {
  const out: string[] = [];
  for (const l of labels) {
    if (l.leader) {
      const [a, b] = l.leader;
      out.push(`<line class="leader" x1="${fmt(a[0], 3)}" y1="${fmt(a[1], 3)}" x2="${fmt(b[0], 3)}" y2="${fmt(b[1], 3)}" stroke="${l.fill ?? '#000000'}" stroke-width="0.2"/>`);
    }
  }
  for (const l of labels) out.push(svgText(l.at[0], l.at[1], l.text, l.sizeMm, { fill: l.fill, bold: l.bold, cls: l.cls ?? 'label' }));
  return out.join('\n');
}

export type PictureOptions = Readonly<{
  title: string;
  /** Drawn content (screen space, y down). */
  body: readonly string[];
  /** The box of the drawn content including half the widest stroke. */
  contentBox: Box;
  /** Placed labels (their boxes join the view). */
  labels?: readonly PlacedLabel[];
  /** Word under the front arrow; null for no arrow (a view looking at the front). */
  front?: string | null;
  /** Where the front arrow points: up in plan views (the default), right in side views. */
  frontDirection?: 'up' | 'right';
  legend?: readonly LegendEntry[];
  /** Lines of small print at the foot (cautions, notes). */
  notes?: readonly string[];
  /** A heading line above the view. */
  heading?: string;
  marginMm?: number;
  /** A colour bar in the foot band (continuous colour maps), with words under its ends and middle. */
  colourBar?: ColourBar;
  /** A note in the file's description (`<desc>`): a comment may not hold "--" (XML 1.0, 2.5), and notes say "--force". */
  comment?: string;
  background?: string;
}>;

/** A continuous colour key: colours sampled left to right, three words under it and a caption above. */
export type ColourBar = Readonly<{ colours: readonly string[]; words: readonly [string, string, string]; caption: string }>;

/** A colour bar 60 mm wide from its top-left corner (the caption's baseline sits above it). */
export function colourBar(x: number, y: number, bar: ColourBar, sizeMm = 2.8): Drawn {
  const w = 60;
  const h = 3;
  const top = y + sizeMm * 1.2;
  const n = bar.colours.length;
  const out: string[] = ['<g class="colour-bar">', svgText(x, top - 1, bar.caption, sizeMm)];
  bar.colours.forEach((c, i) => out.push(`<rect x="${fmt(x + (i * w) / n, 3)}" y="${fmt(top, 3)}" width="${fmt(w / n + 0.01, 3)}" height="${h}" fill="${c}"/>`));
  out.push(`<rect x="${fmt(x, 3)}" y="${fmt(top, 3)}" width="${w}" height="${h}" fill="none" stroke="#000000" stroke-width="0.15"/>`);
  const ty = top + h + sizeMm * 1.1;
  const anchors = ['start', 'middle', 'end'] as const;
  let box = unionBox(textBox(x, top - 1, bar.caption, sizeMm), { x0: x - 0.1, y0: top - 0.1, x1: x + w + 0.1, y1: top + h + 0.1 });
  bar.words.forEach((word, i) => {
    const wx = x + (i * w) / 2;
    out.push(svgText(wx, ty, word, sizeMm, { anchor: anchors[i] }));
    box = unionBox(box, textBox(wx, ty, word, sizeMm, anchors[i]));
  });
  out.push('</g>');
  return { svg: out.join(''), box };
}

const NOTE_MM = 2.8;
const HEADING_MM = 4;

/**
 * A whole picture: heading, the drawn view, its labels, and a foot band with the front arrow, a
 * scale bar, the legend and notes; the viewBox is the union of everything plus the margin, so no
 * stroke or text is clipped. 1 user unit = 1 mm (width and height are given in mm).
 */
export function pictureSvg(o: PictureOptions): string {
  const c = pictureContent(o);
  return svgDocument(c.viewBox, o.title, c.markup, { comment: o.comment, background: o.background });
}

/**
 * What `pictureSvg` puts inside the file, and the viewBox round it: for pictures embedded in a page
 * (the live page's views), which supplies its own `<svg>` element and title.
 */
export function pictureContent(o: Omit<PictureOptions, 'title' | 'comment' | 'background'>): Readonly<{ markup: string[]; viewBox: Box }> {
  const m = o.marginMm ?? 4;
  let view = o.contentBox;
  for (const l of o.labels ?? []) view = unionBox(view, l.box);
  if (isEmpty(view)) view = { x0: 0, y0: 0, x1: 10, y1: 10 };
  const width = Math.max(view.x1 - view.x0, 60);
  const foot: string[] = [];
  let all = view;
  // Heading above the view.
  const head: string[] = [];
  if (o.heading) {
    const y = view.y0 - 3;
    head.push(svgText(view.x0, y, o.heading, HEADING_MM, { bold: true }));
    all = unionBox(all, textBox(view.x0, y, o.heading, HEADING_MM, 'start', true));
  }
  // Foot band: arrow, scale bar, legend in a row; notes under them.
  let x = view.x0;
  const top = view.y1 + 5;
  let bottom = top;
  if (o.front !== null) {
    const a = o.frontDirection === 'right' ? frontArrow(x, top, o.front ?? 'front', 3, 'right') : frontArrow(x + 3, top, o.front ?? 'front');
    foot.push(a.svg);
    all = unionBox(all, a.box);
    bottom = Math.max(bottom, a.box.y1);
    x = a.box.x1 + 6;
  }
  const bar = scaleBar(x, top + 2, niceLengthMm(Math.max(1, Math.min(width / 3, 100))));
  foot.push(bar.svg);
  all = unionBox(all, bar.box);
  bottom = Math.max(bottom, bar.box.y1);
  x = bar.box.x1 + 6;
  if (o.colourBar) {
    const cb = colourBar(x, top, o.colourBar);
    foot.push(cb.svg);
    all = unionBox(all, cb.box);
    bottom = Math.max(bottom, cb.box.y1);
    x = cb.box.x1 + 6;
  }
  if (o.legend?.length) {
    const lg = legend(x, top, o.legend, Math.max(view.x1 - x, 80));
    foot.push(lg.svg);
    all = unionBox(all, lg.box);
    bottom = Math.max(bottom, lg.box.y1);
  }
  let ny = bottom + 2 + NOTE_MM;
  for (const n of o.notes ?? []) {
    foot.push(svgText(view.x0, ny, n, NOTE_MM, { fill: '#444444' }));
    all = unionBox(all, textBox(view.x0, ny, n, NOTE_MM));
    ny += NOTE_MM * 1.35;
  }
  return { markup: [...head, ...o.body, ...(o.labels?.length ? [`<g class="labels">`, labelsSvg(o.labels), '</g>'] : []), ...foot], viewBox: padBox(all, m) };
}

/**
 * The SVG file round drawn content: the viewBox `vb` (the drawn extent plus its margin), width and
 * height in mm equal to it (1 user unit = 1 mm), the title, an optional description, a background.
 */
export function svgDocument(vb: Box, title: string, body: readonly string[], o: Readonly<{ comment?: string; background?: string }> = {}): string {
  const W = vb.x1 - vb.x0;
  const H = vb.y1 - vb.y0;
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(W, 3)}mm" height="${fmt(H, 3)}mm" viewBox="${fmt(vb.x0, 3)} ${fmt(vb.y0, 3)} ${fmt(W, 3)} ${fmt(H, 3)}" font-family="${FONT_FAMILY}">`,
    `<title>${xmlEscape(title)}</title>`,
    ...(o.comment ? [`<desc>${xmlEscape(o.comment)}</desc>`] : []),
    `<rect class="background" x="${fmt(vb.x0, 3)}" y="${fmt(vb.y0, 3)}" width="${fmt(W, 3)}" height="${fmt(H, 3)}" fill="${o.background ?? '#ffffff'}"/>`,
    ...body,
    '</svg>',
    '',
  ].join('\n');
}
