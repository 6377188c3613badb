import type { Loop, Vec2 } from '../geometry/types.js';
import { fmt } from './format.js';
import { EMPTY_BOX, padBox, pictureSvg, PLAN_VIEW, unionBox, type LegendEntry } from './picture.js';
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
  /** Word under the up arrow (where the part's +x points); default "front". */
  front?: string;
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
 * A mode shape as SVG in the plan-view convention (part +x up): each mesh triangle filled with the
 * colour of its mean out-of-plane displacement (blue down, red up, white still), the exact outline
 * on top, a colour bar, front arrow and scale bar, the frequency and description, and a caution.
 * One user unit = 1 mm; deterministic output.
 */
export function modeShapeSvg(plot: ModePlot): string {
  const { xy, triangles, w } = plot;
  const map = PLAN_VIEW.map;
  const words = plot.legend ?? ['down', 'still', 'up'];
  let box = EMPTY_BOX;
  for (let i = 0; i < xy.length; i += 2) {
    const p = map([xy[i], xy[i + 1]]);
    box = unionBox(box, { x0: p[0], y0: p[1], x1: p[0], y1: p[1] });
  }
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
  const body = [`<g id="shape" stroke-width="0.05">`, ...tris, '</g>', `<g id="outline" fill="none" stroke="#000000" stroke-width="0.25">`, ...plot.loops.map((l) => `<path d="${loopPathData(l, map)}"/>`), '</g>'];
  const legend: LegendEntry[] = [{ symbol: 'line', colour: '#000000', label: 'outline and holes' }];
  if (plot.markerMm) {
    const p = map(plot.markerMm);
    body.push(`<g id="stack" fill="none" stroke="#000000" stroke-width="0.3"><circle cx="${fmt(p[0], 3)}" cy="${fmt(p[1], 3)}" r="1.5"/><path d="M${fmt(p[0] - 2.5, 3)} ${fmt(p[1], 3)}H${fmt(p[0] + 2.5, 3)}M${fmt(p[0], 3)} ${fmt(p[1] - 2.5, 3)}V${fmt(p[1] + 2.5, 3)}"/></g>`);
    box = unionBox(box, padBox({ x0: p[0], y0: p[1], x1: p[0], y1: p[1] }, 2.7));
    legend.push({ symbol: 'cross', colour: '#000000', label: 'flight-controller stack' });
  }
  return pictureSvg({
    title: `${plot.title}: ${fmt(plot.frequencyHz, 1)} Hz`,
    heading: `${fmt(plot.frequencyHz, 1)} Hz — ${plot.title}`,
    body,
    contentBox: padBox(box, 0.2),
    front: plot.front ?? 'front',
    colourBar: {
      colours: Array.from({ length: 20 }, (_, i) => divergingColour(-1 + (2 * (i + 0.5)) / 20)),
      words: [words[0], words[1], words[2]],
      caption: plot.legendCaption ?? 'out-of-plane displacement, relative to the largest',
    },
    legend,
    notes: [plot.description, ...(plot.subtitle ? [plot.subtitle] : []), CAUTION],
  });
}
