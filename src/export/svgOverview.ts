import type { Frame } from '../geometry/frame.js';
import { loopBBox, transformLoop, unionBBox } from '../geometry/loop.js';
import type { Part, Placement } from '../geometry/part.js';
import type { BBox, Loop, Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { loopPathData } from './svgPath.js';

export type OverviewOptions = Readonly<{
  marginMm?: number;
  /** Extra SVG elements in frame coordinates (x forward, y left), drawn on top. */
  overlay?: string;
  /** Extra area the overlay needs in view, frame coordinates. */
  extraBBox?: BBox;
}>;

const ROLE_FILL: Record<Part['role'], string> = {
  bottom: '#3a3f47',
  arm: '#23272e',
  top: '#566070',
  brace: '#2f343c',
  'camera-side': '#7a5c3c',
  imported: '#3a3f47',
};

/** A plate copy as it lies in plan view (vertical plates as their footprint). */
export function planLoops(part: Part, pl: Placement): Loop[] {
  if (pl.vertical) {
    const [x0, , x1] = loopBBox(part.outline);
    const y = pl.translateMm[1];
    const t = part.thicknessMm;
    return [[
      { kind: 'line', start: [x0, y - t], end: [x1, y - t] },
      { kind: 'line', start: [x1, y - t], end: [x1, y] },
      { kind: 'line', start: [x1, y], end: [x0, y] },
      { kind: 'line', start: [x0, y], end: [x0, y - t] },
    ]];
  }
  const tf = { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY };
  return [transformLoop(part.outline, tf), ...part.features.map((f) => transformLoop(f.loop, tf))];
}

/**
 * The assembled frame seen from above, for a person to look at: every plate copy at its place
 * (lowest first), prop discs, motor centres and the forward direction. Drawn with forward up.
 */
export function frameOverviewSvg(frame: Frame, options: OverviewOptions = {}): string {
  const m = options.marginMm ?? 10;
  const copies: Array<{ part: Part; pl: Placement; loops: Loop[] }> = [];
  for (const part of frame.parts) for (const pl of part.placements) copies.push({ part, pl, loops: planLoops(part, pl) });
  copies.sort((a, b) => a.pl.zMm - b.pl.zMm || a.part.name.localeCompare(b.part.name));
  const propR = frame.propDiameterMm / 2;
  let bb: BBox = [Infinity, Infinity, -Infinity, -Infinity];
  for (const c of copies) bb = unionBBox(bb, loopBBox(c.loops[0]));
  for (const s of frame.sites) bb = unionBBox(bb, [s.motorMm[0] - propR, s.motorMm[1] - propR, s.motorMm[0] + propR, s.motorMm[1] + propR]);
  if (options.extraBBox) bb = unionBBox(bb, options.extraBBox);
  // Screen: forward (x) is up, left (y) is left. Screen X = −y, screen Y = −x.
  const w = bb[3] - bb[1] + 2 * m;
  const h = bb[2] - bb[0] + 2 * m;
  const map = (p: Vec2): Vec2 => [bb[3] + m - p[1], bb[2] + m - p[0]];
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(w, 3)}mm" height="${fmt(h, 3)}mm" viewBox="0 0 ${fmt(w, 3)} ${fmt(h, 3)}">`,
    `<title>${xmlEscape(`${frame.name} rev ${frame.revision}: plan view`)}</title>`,
    `<rect width="${fmt(w, 3)}" height="${fmt(h, 3)}" fill="#ffffff"/>`,
  ];
  for (const s of frame.sites) {
    const c = map(s.motorMm);
    out.push(`<circle cx="${fmt(c[0], 3)}" cy="${fmt(c[1], 3)}" r="${fmt(propR, 3)}" fill="#9ecbff" fill-opacity="0.25" stroke="#3b82c4" stroke-width="0.4" stroke-dasharray="3 2"/>`);
  }
  for (const c of copies) {
    const d = c.loops.map((l) => loopPathData(l, map)).join(' ');
    out.push(`<path d="${d}" fill="${ROLE_FILL[c.part.role]}" fill-opacity="0.85" fill-rule="evenodd" stroke="#000000" stroke-width="0.25"><title>${xmlEscape(c.part.name)}</title></path>`);
  }
  for (const s of frame.sites) {
    const c = map(s.motorMm);
    out.push(`<circle cx="${fmt(c[0], 3)}" cy="${fmt(c[1], 3)}" r="1.2" fill="#d00000"/>`);
  }
  if (frame.cameraPlanMm) {
    out.push(`<path d="${loopPathData(frame.cameraPlanMm, map)}" fill="#1f6f5c" fill-opacity="0.9" stroke="#000000" stroke-width="0.25"><title>camera</title></path>`);
  }
  if (options.overlay) {
    // Frame coordinates → screen: (x, y) ↦ (bb[3] + m − y, bb[2] + m − x).
    out.push(`<g transform="matrix(0 -1 -1 0 ${fmt(bb[3] + m, 4)} ${fmt(bb[2] + m, 4)})">`, options.overlay, '</g>');
  }
  const arrowX = fmt(w - m / 2 - 2, 3);
  out.push(`<path d="M${arrowX} ${fmt(m, 3)} l-2 5 h4 z" fill="#000000"/>`);
  out.push(`<text x="${arrowX}" y="${fmt(m + 9, 3)}" font-size="3.5" text-anchor="middle" font-family="sans-serif">front</text>`);
  out.push(`<text x="${fmt(m / 2, 3)}" y="${fmt(h - m / 3, 3)}" font-size="4" font-family="sans-serif">${xmlEscape(`${frame.name} rev ${frame.revision} — props ${fmt(frame.propDiameterMm, 1)} mm`)}</text>`);
  out.push('</svg>', '');
  return out.join('\n');
}
