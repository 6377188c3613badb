import type { FrameAnnotation, Marker } from '../checks/annotate.js';
import { fmt, xmlEscape } from './format.js';

const COLOR = { error: '#d00000', warning: '#e08a00', info: '#2a6fb0' } as const;

/**
 * Check findings as SVG overlay markup in the drawing's own coordinates (y up): a ring and a number
 * per marker, with the finding as a tooltip. `flip` is the linear part of the overlay's transform
 * (an involution), applied again to each label so the text reads upright.
 */
export function markersOverlay(markers: readonly Marker[], options: { radiusMm?: number; flip?: string } = {}): string {
  const r = options.radiusMm ?? 2.5;
  const flip = options.flip ?? 'scale(1 -1)';
  return markers
    .map((m) => {
      const [x, y] = m.atMm;
      const c = COLOR[m.severity];
      return [
        `<g class="finding ${m.severity}"><title>${xmlEscape(m.title)}</title>`,
        `<circle cx="${fmt(x, 3)}" cy="${fmt(y, 3)}" r="${fmt(r, 3)}" fill="${c}" fill-opacity="0.15" stroke="${c}" stroke-width="0.5"/>`,
        `<g transform="translate(${fmt(x + r, 3)} ${fmt(y + r, 3)}) ${flip}"><text font-size="3" font-family="sans-serif" fill="${c}">${xmlEscape(m.label)}</text></g>`,
        '</g>',
      ].join('');
    })
    .join('\n');
}

/**
 * Overlay for the plan-view overview (frame coordinates): the camera's view in the prop plane,
 * prop discs that show in it, adjacent tip-gap lines with their gaps, the frame findings and the
 * safety cautions.
 */
export function frameFindingsOverlay(a: FrameAnnotation): string {
  const flip = 'matrix(0 -1 -1 0 0 0)';
  const out: string[] = [];
  if (a.viewRegion && a.viewRegion.length >= 3) {
    const d = a.viewRegion.map((p, i) => `${i ? 'L' : 'M'}${fmt(p[0], 3)} ${fmt(p[1], 3)}`).join(' ') + ' Z';
    out.push(`<path d="${d}" fill="#ffd400" fill-opacity="0.18" stroke="#b89800" stroke-width="0.4"><title>camera view in the prop plane</title></path>`);
  }
  if (a.eyeMm) out.push(`<circle cx="${fmt(a.eyeMm[0], 3)}" cy="${fmt(a.eyeMm[1], 3)}" r="1.5" fill="#b89800"><title>camera</title></circle>`);
  for (const d of a.discs) {
    if (!d.visible) continue;
    out.push(`<circle cx="${fmt(d.centerMm[0], 3)}" cy="${fmt(d.centerMm[1], 3)}" r="${fmt(d.radiusMm, 3)}" fill="#d00000" fill-opacity="0.12" stroke="#d00000" stroke-width="0.5"><title>${xmlEscape(`${d.id} prop visible to the camera`)}</title></circle>`);
  }
  for (const g of a.tipGaps) {
    out.push(`<line x1="${fmt(g.a[0], 3)}" y1="${fmt(g.a[1], 3)}" x2="${fmt(g.b[0], 3)}" y2="${fmt(g.b[1], 3)}" stroke="#3b82c4" stroke-width="0.4"/>`);
    const m = [(g.a[0] + g.b[0]) / 2, (g.a[1] + g.b[1]) / 2];
    out.push(`<g transform="translate(${fmt(m[0], 3)} ${fmt(m[1], 3)}) ${flip}"><text font-size="3.5" font-family="sans-serif" fill="#3b82c4" text-anchor="middle">${xmlEscape(`${fmt(g.gapMm, 1)} mm`)}</text></g>`);
  }
  out.push(markersOverlay(a.markers, { flip, radiusMm: 3 }));
  a.cautions.lines.forEach((text, i) => {
    // One line every 5 mm towards the rear (down the page).
    const at = [a.cautions.atMm[0] - 5 * i, a.cautions.atMm[1]];
    out.push(`<g transform="translate(${fmt(at[0], 3)} ${fmt(at[1], 3)}) ${flip}"><text font-size="3.2" font-family="sans-serif" fill="#444444">${xmlEscape(text)}</text></g>`);
  });
  return out.join('\n');
}
