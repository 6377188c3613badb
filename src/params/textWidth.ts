import { ADVANCE_BOLD, ADVANCE_REGULAR, METRIC_CHARS } from './fontMetrics.js';

/**
 * Text measurement for layouts (drawing sheets, picture labels): the advance widths of the font the
 * PDF embeds, which is also what the generic `sans-serif` family resolves to on Debian. Kept in the
 * lowest layer, like the screw tables, so the drawing layout and the SVG helpers measure alike.
 */

const INDEX = new Map([...METRIC_CHARS].map((c, i) => [c, i]));
/** A character outside the table counts as this wide (1/1000 em): wider than most, so boxes err large. */
const UNKNOWN_ADVANCE = 900;

/** Ascent and descent of the font's line box as fractions of the em (what a renderer's text box spans). */
export const TEXT_ASCENT_EM = 0.93;
export const TEXT_DESCENT_EM = 0.24;

/**
 * Advance width of a single-line text. mm.
 * @param sizeMm the em size (SVG font-size) in mm
 * @example textWidthMm('M3', 2.5) // ≈ 3.4
 */
export function textWidthMm(text: string, sizeMm: number, bold = false): number {
  const table = bold ? ADVANCE_BOLD : ADVANCE_REGULAR;
  let w = 0;
  for (const c of text) {
    const i = INDEX.get(c);
    w += i === undefined ? UNKNOWN_ADVANCE : table[i];
  }
  return (w / 1000) * sizeMm;
}

/**
 * Break text at spaces into lines no wider than `widthMm` at `fontMm`, measured with the drawing
 * font's advance widths (`textWidthMm`); a word longer than a line keeps its own line.
 */
export function wrapText(text: string, widthMm: number, fontMm: number): string[] {
  const out: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter((w) => w.length)) {
    const next = line ? `${line} ${word}` : word;
    if (line && textWidthMm(next, fontMm) > widthMm) {
      out.push(line);
      line = word;
    } else line = next;
  }
  if (line) out.push(line);
  return out;
}
