import type { AssemblyView, ViewItemKind } from '../assembly/views.js';
import type { Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { EMPTY_BOX, padBox, pictureSvg, placeLabels, PLAN_VIEW, unionBox, type Box, type LabelRequest, type LegendEntry } from './picture.js';

const STYLE: Record<ViewItemKind, { fill: string; opacity: number; stroke: string; width: number; word: string }> = {
  plate: { fill: '#3a3f47', opacity: 0.85, stroke: '#000000', width: 0.2, word: 'plate' },
  standoff: { fill: '#b8bec8', opacity: 1, stroke: '#4a4f57', width: 0.2, word: 'standoff' },
  spacer: { fill: '#b8bec8', opacity: 1, stroke: '#4a4f57', width: 0.2, word: 'spacer' },
  screw: { fill: '#8a8f98', opacity: 1, stroke: '#2a2f37', width: 0.15, word: 'screw or nut' },
  motor: { fill: '#c9a227', opacity: 0.8, stroke: '#5a4a10', width: 0.2, word: 'motor' },
  prop: { fill: '#9ecbff', opacity: 0.3, stroke: '#3b82c4', width: 0.3, word: 'prop' },
  component: { fill: '#1f6f5c', opacity: 0.75, stroke: '#0c3b30', width: 0.2, word: 'component' },
  'camera-range': { fill: 'none', opacity: 0, stroke: '#1f6f5c', width: 0.3, word: 'camera tilt range' },
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
 * height in mm), in the picture convention (src/export/picture.ts): items in order, a dimension
 * chain of the stack-up heights at the left, markers with placed labels, a front arrow (pointing
 * right in the side view; the front view looks at the front), a scale bar and a legend. Pure: the
 * view data is computed in `src/assembly/views.ts`.
 */
export function assemblyViewSvg(view: AssemblyView, options: AssemblyViewSvgOptions): string {
  const [x0, , , y1] = view.bbox;
  const dimLeft = x0 - 6 - view.dimensions.length * DIM_STEP_MM;
  // View coordinates to screen (y down): elevations keep z up; the plan view turns the front up.
  const map = view.view === 'plan' ? PLAN_VIEW.map : (p: Vec2): Vec2 => [p[0], -p[1]];
  const pts = (poly: readonly Vec2[]): string => poly.map((p) => map(p).map((v) => fmt(v, 3)).join(',')).join(' ');
  const body: string[] = [];
  let box: Box = EMPTY_BOX;
  const kinds = new Set<ViewItemKind>();
  for (const it of view.items) {
    const s = STYLE[it.kind];
    kinds.add(it.kind);
    body.push(`<polygon points="${pts(it.polygon)}" fill="${s.fill}"${s.fill === 'none' ? '' : ` fill-opacity="${s.opacity}"`} stroke="${s.stroke}" stroke-width="${s.width}"${it.dashed ? ' stroke-dasharray="1.5 1"' : ''}><title>${xmlEscape(it.id)}</title></polygon>`);
    for (const p of it.polygon) {
      const q = map(p);
      box = unionBox(box, padBox({ x0: q[0], y0: q[1], x1: q[0], y1: q[1] }, s.width / 2));
    }
  }
  const labels: LabelRequest[] = [];
  view.dimensions.forEach((d, i) => {
    const x = dimLeft + i * DIM_STEP_MM;
    const a = map([x0, d.fromMm])[1];
    const b = map([x0, d.toMm])[1];
    body.push(`<line x1="${fmt(x, 3)}" y1="${fmt(a, 3)}" x2="${fmt(x, 3)}" y2="${fmt(b, 3)}" stroke="#c00000" stroke-width="0.25"/>`);
    for (const y of [a, b]) body.push(`<line x1="${fmt(x - 1.5, 3)}" y1="${fmt(y, 3)}" x2="${fmt(x + 1.5, 3)}" y2="${fmt(y, 3)}" stroke="#c00000" stroke-width="0.25"/>`);
    box = unionBox(box, { x0: x - 1.7, y0: Math.min(a, b) - 0.2, x1: x + 1.7, y1: Math.max(a, b) + 0.2 });
    labels.push({ anchor: [x, (a + b) / 2], text: fmt(d.toMm - d.fromMm, 1), sizeMm: 2.6, fill: '#c00000', clearMm: 1 });
  });
  const obstacles: Box[] = [];
  for (const mk of options.markers ?? []) {
    const c = map(mk.atMm);
    body.push(`<g><title>${xmlEscape(mk.title)}</title><circle cx="${fmt(c[0], 3)}" cy="${fmt(c[1], 3)}" r="2.2" fill="#d00000" fill-opacity="0.85"/></g>`);
    const ring = padBox({ x0: c[0], y0: c[1], x1: c[0], y1: c[1] }, 2.3);
    obstacles.push(ring);
    box = unionBox(box, ring);
    labels.push({ anchor: c, text: mk.label, sizeMm: 2.8, fill: '#d00000', clearMm: 2.5 });
  }
  const legend = viewLegend(kinds, view.dimensions.length > 0);
  if (options.markers?.length) legend.push({ symbol: 'dot', colour: '#d00000', label: 'finding (number as in the report)' });
  const side = view.view === 'side';
  return pictureSvg({
    title: options.title,
    heading: `${options.title} (1:1, mm)`,
    body,
    contentBox: box.x1 >= box.x0 ? box : { x0: x0, y0: -y1, x1: x0 + 10, y1: -y1 + 10 },
    labels: placeLabels(labels, obstacles),
    front: view.view === 'front' ? null : 'front',
    frontDirection: side ? 'right' : 'up',
    legend,
    notes: [...(view.view === 'front' ? ['Seen from the front: the frame\'s front faces you.'] : []), ...(options.notes ?? [])],
    marginMm: options.marginMm ?? 4,
  });
}

/** Legend rows of an assembly view: one per kind of item drawn, and the stack-up dimension chain if drawn. */
export function viewLegend(kinds: Iterable<ViewItemKind>, dimensions: boolean): LegendEntry[] {
  const out: LegendEntry[] = [...kinds].map((k) => {
    const s = STYLE[k];
    return s.fill === 'none' ? { symbol: 'line', colour: s.stroke, label: s.word } : { symbol: 'fill', colour: s.fill, opacity: s.opacity, label: s.word };
  });
  if (dimensions) out.push({ symbol: 'line', colour: '#c00000', label: 'stack-up heights, mm' });
  return out;
}
