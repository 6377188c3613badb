import type { Part } from '../geometry/part.js';
import { partBBox } from '../geometry/metrics.js';
import type { Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { loopPathData } from './svgPath.js';

export type SvgPartOptions = Readonly<{
  /** Space around the part. mm. */
  marginMm?: number;
  outlineColor?: string;
  innerColor?: string;
  strokeMm?: number;
  /** Extra SVG elements drawn over the part, in part coordinates (y up); e.g. check markers. */
  overlay?: string;
  /** A note in the file's description (`<desc>`, e.g. the finding count of a forced build). */
  comment?: string;
}>;

/**
 * One part as SVG, one user unit = 1 mm, width and height in mm equal to the bounding box
 * plus the margin. The part keeps y up inside a flipping group, so overlays use part coordinates.
 */
export function partToSvg(part: Part, options: SvgPartOptions = {}): string {
  const m = options.marginMm ?? 0;
  const [x0, y0, x1, y1] = partBBox(part);
  const w = x1 - x0 + 2 * m;
  const h = y1 - y0 + 2 * m;
  const map = (p: Vec2): Vec2 => [p[0] - x0 + m, y1 + m - p[1]];
  const stroke = fmt(options.strokeMm ?? 0.2, 3);
  const outline = options.outlineColor ?? '#000000';
  const inner = options.innerColor ?? '#d00000';
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(w, 4)}mm" height="${fmt(h, 4)}mm" viewBox="0 0 ${fmt(w, 4)} ${fmt(h, 4)}">`,
    `<title>${xmlEscape(part.name)}</title>`,
    // A description, not an XML comment: a comment may not hold "--" (XML 1.0, 2.5), and notes say "--force".
    ...(options.comment ? [`<desc>${xmlEscape(options.comment)}</desc>`] : []),
    `<g fill="none" stroke-width="${stroke}">`,
    `<path id="outline" stroke="${outline}" d="${loopPathData(part.outline, map)}"/>`,
    ...part.features.map((f, i) => `<path id="${f.purpose}-${i}" stroke="${inner}" d="${loopPathData(f.loop, map)}"/>`),
    '</g>',
    ...(options.overlay
      ? [`<g transform="translate(${fmt(m - x0, 4)} ${fmt(y1 + m, 4)}) scale(1 -1)">`, options.overlay, '</g>']
      : []),
    '</svg>',
    '',
  ];
  return lines.join('\n');
}
