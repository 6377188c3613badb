import type { AssemblyView, ViewItemKind } from '../assembly/views.js';
import type { Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';

const STYLE: Record<ViewItemKind, string> = {
  plate: 'fill="#3a3f47" fill-opacity="0.85" stroke="#000000" stroke-width="0.2"',
  standoff: 'fill="#b8bec8" stroke="#4a4f57" stroke-width="0.2"',
  spacer: 'fill="#b8bec8" stroke="#4a4f57" stroke-width="0.2"',
  screw: 'fill="#8a8f98" stroke="#2a2f37" stroke-width="0.15"',
  motor: 'fill="#c9a227" fill-opacity="0.8" stroke="#5a4a10" stroke-width="0.2"',
  prop: 'fill="#9ecbff" fill-opacity="0.3" stroke="#3b82c4" stroke-width="0.3"',
  component: 'fill="#1f6f5c" fill-opacity="0.75" stroke="#0c3b30" stroke-width="0.2"',
  'camera-range': 'fill="none" stroke="#1f6f5c" stroke-width="0.3"',
};

/** Spacing of the dimension lines at the left. mm. */
const DIM_STEP_MM = 8;

export type AssemblyViewSvgOptions = Readonly<{
  title: string;
  /** Marked points (view coordinates) with their labels, e.g. interference findings. */
  markers?: readonly Readonly<{ atMm: Vec2; label: string; title: string }>[];
  marginMm?: number;
  /** Notes printed under the drawing (cautions). */
  notes?: readonly string[];
}>;

/**
 * One orthographic view of the assembly as SVG at 1:1 (one user unit is one millimetre; width and
 * height in mm): items in order, a dimension chain of the stack-up heights at the left, markers on
 * top. Pure: the view data is computed in `src/assembly/views.ts`.
 */
export function assemblyViewSvg(view: AssemblyView, options: AssemblyViewSvgOptions): string {
  const m = options.marginMm ?? 12;
  const dimRoom = view.dimensions.length * DIM_STEP_MM + 4;
  const notes = options.notes ?? [];
  const noteRoom = 4 + notes.length * 4;
  const [x0, y0, x1, y1] = view.bbox;
  const w = x1 - x0 + 2 * m + dimRoom;
  const h = y1 - y0 + 2 * m + 6 + noteRoom;
  const map = (p: Vec2): Vec2 => [p[0] - x0 + m + dimRoom, y1 - p[1] + m + 6];
  const pts = (poly: readonly Vec2[]): string => poly.map((p) => map(p).map((v) => fmt(v, 3)).join(',')).join(' ');
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(w, 3)}mm" height="${fmt(h, 3)}mm" viewBox="0 0 ${fmt(w, 3)} ${fmt(h, 3)}">`,
    `<title>${xmlEscape(options.title)}</title>`,
    `<rect width="${fmt(w, 3)}" height="${fmt(h, 3)}" fill="#ffffff"/>`,
    `<text x="${fmt(m, 3)}" y="${fmt(m - 2, 3)}" font-family="sans-serif" font-size="4">${xmlEscape(options.title)} (1:1, mm)</text>`,
  ];
  for (const it of view.items) {
    out.push(`<polygon points="${pts(it.polygon)}" ${STYLE[it.kind]}${it.dashed ? ' stroke-dasharray="1.5 1"' : ''}><title>${xmlEscape(it.id)}</title></polygon>`);
  }
  // Dimension chain: one vertical line per height with ticks and the value.
  const dx = m + 4;
  view.dimensions.forEach((d, i) => {
    const x = dx + i * DIM_STEP_MM;
    const a = map([x0, d.fromMm])[1];
    const b = map([x0, d.toMm])[1];
    out.push(`<line x1="${fmt(x, 3)}" y1="${fmt(a, 3)}" x2="${fmt(x, 3)}" y2="${fmt(b, 3)}" stroke="#c00000" stroke-width="0.25"/>`);
    for (const y of [a, b]) out.push(`<line x1="${fmt(x - 1.5, 3)}" y1="${fmt(y, 3)}" x2="${fmt(x + 1.5, 3)}" y2="${fmt(y, 3)}" stroke="#c00000" stroke-width="0.25"/>`);
    out.push(`<text x="${fmt(x + 1, 3)}" y="${fmt((a + b) / 2 + 1, 3)}" font-family="sans-serif" font-size="2.6" fill="#c00000"><title>${xmlEscape(d.label)}</title>${fmt(d.toMm - d.fromMm, 1)}</text>`);
  });
  for (const mk of options.markers ?? []) {
    const c = map(mk.atMm);
    out.push(`<g><title>${xmlEscape(mk.title)}</title><circle cx="${fmt(c[0], 3)}" cy="${fmt(c[1], 3)}" r="2.2" fill="#d00000" fill-opacity="0.85"/><text x="${fmt(c[0], 3)}" y="${fmt(c[1] + 1, 3)}" text-anchor="middle" font-family="sans-serif" font-size="2.8" fill="#ffffff">${xmlEscape(mk.label)}</text></g>`);
  }
  notes.forEach((n, i) => out.push(`<text x="${fmt(m, 3)}" y="${fmt(h - noteRoom + 4 + i * 4, 3)}" font-family="sans-serif" font-size="2.6">${xmlEscape(n)}</text>`));
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}
