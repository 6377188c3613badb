import { loopBBox, transformLoop } from '../geometry/loop.js';
import type { Part } from '../geometry/part.js';
import { assertNever, type Vec2 } from '../geometry/types.js';
import { type NestedSheet, type PaperItem, type PaperSheet, type Stroke } from '../quote/index.js';
import { fmt, xmlEscape } from './format.js';
import { loopPathData } from './svgPath.js';

const LINE_MM: Record<Stroke, number> = { outline: 0.35, thin: 0.18, frame: 0.5 };

/**
 * The drawing sheets as SVG files, one per sheet (A4 landscape, 1 user unit = 1 mm), the same
 * sheets (laid out by src/quote's layoutDrawing) as the PDF. Deterministic text.
 */
export function drawingToSvgs(sheets: readonly PaperSheet[]): string[] {
  return sheets.map(sheetSvg);
}

function sheetSvg(sheet: PaperSheet): string {
  const flip = (p: Vec2): Vec2 => [p[0], sheet.heightMm - p[1]];
  const body = sheet.items.map((i) => item(i, flip));
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(sheet.widthMm)}mm" height="${fmt(sheet.heightMm)}mm" viewBox="0 0 ${fmt(sheet.widthMm)} ${fmt(sheet.heightMm)}">`,
    `<title>${xmlEscape(sheet.title)}</title>`,
    `<rect x="0" y="0" width="${fmt(sheet.widthMm)}" height="${fmt(sheet.heightMm)}" fill="#ffffff"/>`,
    '<g font-family="sans-serif" fill="none" stroke="#000000" stroke-linecap="round" stroke-linejoin="round">',
    ...body,
    '</g>',
    '</svg>',
    '',
  ].join('\n');
}

const pt = (p: Vec2): string => `${fmt(p[0], 4)} ${fmt(p[1], 4)}`;

function item(i: PaperItem, flip: (p: Vec2) => Vec2): string {
  switch (i.kind) {
    case 'loop':
      return `<path stroke-width="${fmt(LINE_MM[i.stroke])}" d="${loopPathData(i.loop, flip)}"/>`;
    case 'line': {
      const a = flip(i.a);
      const b = flip(i.b);
      return `<line x1="${fmt(a[0], 4)}" y1="${fmt(a[1], 4)}" x2="${fmt(b[0], 4)}" y2="${fmt(b[1], 4)}" stroke-width="${fmt(LINE_MM[i.stroke])}"/>`;
    }
    case 'triangle':
      return `<polygon points="${i.points.map((p) => pt(flip(p)).replace(' ', ',')).join(' ')}" fill="#000000" stroke="none"/>`;
    case 'text': {
      const at = flip(i.at);
      const anchor = i.anchor === 'start' ? '' : ` text-anchor="${i.anchor}"`;
      const rot = i.rotateDeg ? ` transform="rotate(${fmt(-i.rotateDeg)} ${fmt(at[0], 4)} ${fmt(at[1], 4)})"` : '';
      const weight = i.bold ? ' font-weight="bold"' : '';
      return `<text x="${fmt(at[0], 4)}" y="${fmt(at[1], 4)}" font-size="${fmt(i.sizeMm, 3)}"${anchor}${weight}${rot} fill="#000000" stroke="none">${xmlEscape(i.text)}</text>`;
    }
    default:
      return assertNever(i);
  }
}

export type SheetLayoutSvgOptions = Readonly<{ title?: string; marginMm?: number; note?: string }>;

/**
 * One nested sheet as SVG, 1 user unit = 1 mm, y flipped so the sheet's origin is at the lower left:
 * the sheet edge, the margin (dashed), every placed part with its inner contours, and a note line.
 */
export function sheetLayoutToSvg(sheet: NestedSheet, parts: readonly Part[], options: SheetLayoutSvgOptions = {}): string {
  const W = sheet.widthMm;
  const H = sheet.heightMm;
  const flip = (p: Vec2): Vec2 => [p[0], H - p[1]];
  const m = options.marginMm ?? 0;
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(W)}mm" height="${fmt(H)}mm" viewBox="0 0 ${fmt(W)} ${fmt(H)}">`,
    `<title>${xmlEscape(options.title ?? 'sheet')}</title>`,
    `<rect x="0" y="0" width="${fmt(W)}" height="${fmt(H)}" fill="#f4f1ea" stroke="#000000" stroke-width="0.3"/>`,
    ...(m > 0 ? [`<rect x="${fmt(m)}" y="${fmt(m)}" width="${fmt(W - 2 * m)}" height="${fmt(H - 2 * m)}" fill="none" stroke="#888888" stroke-width="0.2" stroke-dasharray="2 2"/>`] : []),
    '<g fill="none" stroke-width="0.2">',
  ];
  for (const pl of sheet.placements) {
    const part = parts[pl.item];
    const outline = transformLoop(part.outline, pl.transform);
    out.push(`<path stroke="#000000" fill="#3a3f47" fill-opacity="0.15" d="${loopPathData(outline, flip)}"/>`);
    for (const f of part.features) out.push(`<path stroke="#d00000" d="${loopPathData(transformLoop(f.loop, pl.transform), flip)}"/>`);
    const b = loopBBox(outline);
    const c = flip([(b[0] + b[2]) / 2, (b[1] + b[3]) / 2]);
    out.push(`<text x="${fmt(c[0], 3)}" y="${fmt(c[1], 3)}" font-size="3" font-family="sans-serif" text-anchor="middle" fill="#000000" stroke="none">${xmlEscape(`${pl.partName} ${pl.copy + 1}`)}</text>`);
  }
  out.push('</g>');
  if (options.note) out.push(`<text x="2" y="${fmt(H - 2)}" font-size="3.5" font-family="sans-serif" fill="#000000">${xmlEscape(options.note)}</text>`);
  out.push('</svg>', '');
  return out.join('\n');
}
