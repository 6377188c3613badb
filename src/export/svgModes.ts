import type { Loop, Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { loopPathData } from './svgPath.js';

/** What a mode-shape picture shows: computed data only (the analysis made the mesh and the shape). */
export type ModePlot = Readonly<{
  title: string;
  /** A second line under the title (e.g. the supports). */
  subtitle?: string;
  frequencyHz: number;
  description: string;
  /** x, y per mesh node, mm (part coordinates, y up). */
  xy: Float64Array;
  /** Three node indices per triangle. */
  triangles: Uint32Array;
  /** Value coloured per node: out-of-plane displacement (signed), or for an in-plane mode the in-plane displacement size. */
  w: Float64Array;
  /** What the colour bar measures. */
  legendCaption?: string;
  /** Legend words for the low, middle and high end. Default down / still / up. */
  legend?: readonly [string, string, string];
  /** The exact part outline and holes, drawn over the colours. */
  loops: readonly Loop[];
  /** A marked point (the flight-controller stack), part coordinates. */
  markerMm?: Vec2;
}>;

const CAUTION = 'Estimate from a plate model, not a certification. Test a new frame with props off first.';

/** Diverging blue–white–red colour for t ∈ [−1, 1]. */
export function divergingColour(t: number): string {
  const c = Math.max(-1, Math.min(1, t));
  const mix = (a: number, b: number, f: number) => Math.round(a + (b - a) * f);
  const [r, g, b] = c < 0 ? [mix(255, 33, -c), mix(255, 102, -c), mix(255, 172, -c)] : [mix(255, 178, c), mix(255, 24, c), mix(255, 43, c)];
  return `#${[r, g, b].map((v) => v.toString(16).padStart(2, '0')).join('')}`;
}

/**
 * A mode shape as SVG: each mesh triangle filled with the colour of its mean out-of-plane
 * displacement (blue down, red up, white still), the exact outline on top, a legend bar, the
 * frequency and description, and a caution line. One user unit = 1 mm; deterministic output.
 */
export function modeShapeSvg(plot: ModePlot): string {
  const { xy, triangles, w } = plot;
  const words = plot.legend ?? ['down', 'still', 'up'];
  let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity];
  for (let i = 0; i < xy.length; i += 2) {
    x0 = Math.min(x0, xy[i]);
    x1 = Math.max(x1, xy[i]);
    y0 = Math.min(y0, xy[i + 1]);
    y1 = Math.max(y1, xy[i + 1]);
  }
  const m = 5;
  const text = 4;
  const legend = 8;
  const width = Math.max(x1 - x0 + 2 * m, 100);
  const height = y1 - y0 + 2 * m + 4 * text + legend + 6;
  const top = 3 * text + 2;
  const map = (p: Vec2): Vec2 => [p[0] - x0 + m, top + (y1 - p[1]) + m];
  let big = 0;
  for (const v of w) big = Math.max(big, Math.abs(v));
  const scale = big > 0 ? 1 / big : 1;
  const tris: string[] = [];
  for (let t = 0; t < triangles.length; t += 3) {
    const ids = [triangles[t], triangles[t + 1], triangles[t + 2]];
    const mean = (w[ids[0]] + w[ids[1]] + w[ids[2]]) / 3;
    const pts = ids.map((i) => map([xy[2 * i], xy[2 * i + 1]])).map((p) => `${fmt(p[0], 3)},${fmt(p[1], 3)}`);
    const colour = divergingColour(mean * scale);
    // A hairline stroke of the same colour hides the anti-aliasing seams between triangles.
    tris.push(`<polygon points="${pts.join(' ')}" fill="${colour}" stroke="${colour}"/>`);
  }
  const barY = height - legend - text - 2;
  const barX = m;
  const barW = Math.min(60, width - 2 * m);
  const steps = 20;
  const bar = Array.from({ length: steps }, (_, i) => {
    const t = -1 + (2 * (i + 0.5)) / steps;
    return `<rect x="${fmt(barX + (i * barW) / steps, 3)}" y="${fmt(barY, 3)}" width="${fmt(barW / steps + 0.01, 3)}" height="3" fill="${divergingColour(t)}"/>`;
  });
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(width, 3)}mm" height="${fmt(height, 3)}mm" viewBox="0 0 ${fmt(width, 3)} ${fmt(height, 3)}" font-family="sans-serif">`,
    `<title>${xmlEscape(`${plot.title}: ${fmt(plot.frequencyHz, 1)} Hz`)}</title>`,
    `<text x="${m}" y="${text}" font-size="3.5">${xmlEscape(`${fmt(plot.frequencyHz, 1)} Hz — ${plot.title}`)}</text>`,
    `<text x="${m}" y="${2 * text}" font-size="2.8">${xmlEscape(plot.description)}</text>`,
    ...(plot.subtitle ? [`<text x="${m}" y="${3 * text}" font-size="2.5">${xmlEscape(plot.subtitle)}</text>`] : []),
    `<g id="shape" stroke-width="0.05">`,
    ...tris,
    '</g>',
    `<g id="outline" fill="none" stroke="#000000" stroke-width="0.25">`,
    ...plot.loops.map((l) => `<path d="${loopPathData(l, map)}"/>`),
    '</g>',
    ...(plot.markerMm
      ? (() => {
          const p = map(plot.markerMm!);
          return [`<g id="stack" fill="none" stroke="#000000" stroke-width="0.3"><circle cx="${fmt(p[0], 3)}" cy="${fmt(p[1], 3)}" r="1.5"/><path d="M${fmt(p[0] - 2.5, 3)} ${fmt(p[1], 3)}H${fmt(p[0] + 2.5, 3)}M${fmt(p[0], 3)} ${fmt(p[1] - 2.5, 3)}V${fmt(p[1] + 2.5, 3)}"/></g>`];
        })()
      : []),
    `<g id="legend">`,
    ...bar,
    `<text x="${fmt(barX, 3)}" y="${fmt(barY + 6, 3)}" font-size="2.5">${xmlEscape(words[0])}</text>`,
    `<text x="${fmt(barX + barW / 2, 3)}" y="${fmt(barY + 6, 3)}" font-size="2.5" text-anchor="middle">${xmlEscape(words[1])}</text>`,
    `<text x="${fmt(barX + barW, 3)}" y="${fmt(barY + 6, 3)}" font-size="2.5" text-anchor="end">${xmlEscape(words[2])}</text>`,
    `<text x="${fmt(barX, 3)}" y="${fmt(barY - 1.2, 3)}" font-size="2.5">${xmlEscape(plot.legendCaption ?? 'out-of-plane displacement, relative to the largest')}</text>`,
    '</g>',
    `<text x="${m}" y="${fmt(height - 1.5, 3)}" font-size="2.3">${xmlEscape(CAUTION)}</text>`,
    '</svg>',
    '',
  ];
  return lines.join('\n');
}
