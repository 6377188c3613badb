import type { FrameAnnotation, Marker } from '../checks/annotate.js';
import type { Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { EMPTY_BOX, padBox, PLAN_VIEW, unionBox, type Box, type LabelRequest, type LegendEntry } from './picture.js';
import type { Annotation } from './svgPart.js';

const COLOR = { error: '#d00000', warning: '#e08a00', info: '#2a6fb0' } as const;
const SEVERITIES = ['error', 'warning', 'info'] as const;
const MARKER_LABEL_MM = 3;

/**
 * Check findings as an annotation in the plan-view convention: a ring per marker (the finding as a
 * tooltip), its number placed by the label placer, and a legend row per severity present. The
 * markers are in model coordinates (part, or frame: x forward, y left).
 */
export function markersAnnotation(markers: readonly Marker[], radiusMm = 2.5): Annotation {
  const map = PLAN_VIEW.map;
  const body: string[] = [];
  const labels: LabelRequest[] = [];
  const obstacles: Box[] = [];
  let box: Box = EMPTY_BOX;
  for (const m of markers) {
    const [x, y] = map(m.atMm);
    const c = COLOR[m.severity];
    body.push(`<g class="finding ${m.severity}"><title>${xmlEscape(m.title)}</title><circle cx="${fmt(x, 3)}" cy="${fmt(y, 3)}" r="${fmt(radiusMm, 3)}" fill="${c}" fill-opacity="0.15" stroke="${c}" stroke-width="0.5"/></g>`);
    const ring = padBox({ x0: x, y0: y, x1: x, y1: y }, radiusMm + 0.25);
    box = unionBox(box, ring);
    obstacles.push(ring);
    labels.push({ anchor: [x, y], text: m.label, sizeMm: MARKER_LABEL_MM, fill: c, cls: `label ${m.severity}`, clearMm: radiusMm + 0.3 });
  }
  const present = SEVERITIES.filter((s) => markers.some((m) => m.severity === s));
  const legend: LegendEntry[] = present.map((s) => ({ symbol: 'ring', colour: COLOR[s], label: `${s} (number = place in the report)` }));
  return { body, labels, legend, box, obstacles };
}

const path = (pts: readonly Vec2[]): string => pts.map((p, i) => `${i ? 'L' : 'M'}${fmt(p[0], 3)} ${fmt(p[1], 3)}`).join(' ') + ' Z';

/**
 * The overview's check annotation (frame coordinates → plan view): the camera's view in the prop
 * plane, prop discs that show in it, adjacent tip-gap lines with their gaps, the frame findings, a
 * legend for all of them and the safety cautions as notes.
 */
export function frameFindingsAnnotation(a: FrameAnnotation): Annotation {
  const map = PLAN_VIEW.map;
  const body: string[] = [];
  const labels: LabelRequest[] = [];
  const legend: LegendEntry[] = [];
  let box: Box = EMPTY_BOX;
  if (a.viewRegion && a.viewRegion.length >= 3) {
    const pts = a.viewRegion.map(map);
    body.push(`<path d="${path(pts)}" fill="#ffd400" fill-opacity="0.18" stroke="#b89800" stroke-width="0.4"><title>camera view in the prop plane</title></path>`);
    for (const p of pts) box = unionBox(box, padBox({ x0: p[0], y0: p[1], x1: p[0], y1: p[1] }, 0.2));
    legend.push({ symbol: 'fill', colour: '#ffd400', opacity: 0.4, label: 'camera view in the prop plane' });
  }
  if (a.eyeMm) {
    const e = map(a.eyeMm);
    body.push(`<circle cx="${fmt(e[0], 3)}" cy="${fmt(e[1], 3)}" r="1.5" fill="#b89800"><title>camera</title></circle>`);
    legend.push({ symbol: 'dot', colour: '#b89800', label: 'camera' });
  }
  const visible = a.discs.filter((d) => d.visible);
  for (const d of visible) {
    const c = map(d.centerMm);
    body.push(`<circle cx="${fmt(c[0], 3)}" cy="${fmt(c[1], 3)}" r="${fmt(d.radiusMm, 3)}" fill="#d00000" fill-opacity="0.12" stroke="#d00000" stroke-width="0.5"><title>${xmlEscape(`${d.id} prop visible to the camera`)}</title></circle>`);
    box = unionBox(box, padBox({ x0: c[0], y0: c[1], x1: c[0], y1: c[1] }, d.radiusMm + 0.25));
  }
  if (visible.length) legend.push({ symbol: 'fill', colour: '#d00000', opacity: 0.25, label: 'prop seen by the camera' });
  for (const g of a.tipGaps) {
    const p = map(g.a);
    const q = map(g.b);
    body.push(`<line x1="${fmt(p[0], 3)}" y1="${fmt(p[1], 3)}" x2="${fmt(q[0], 3)}" y2="${fmt(q[1], 3)}" stroke="#3b82c4" stroke-width="0.4"/>`);
    labels.push({ anchor: [(p[0] + q[0]) / 2, (p[1] + q[1]) / 2], text: `${fmt(g.gapMm, 1)} mm`, sizeMm: 3.2, fill: '#3b82c4', cls: 'label gap' });
  }
  if (a.tipGaps.length) legend.push({ symbol: 'line', colour: '#3b82c4', label: 'prop tip gap' });
  const m = markersAnnotation(a.markers, 3);
  return {
    body: [...body, ...m.body],
    labels: [...m.labels, ...labels],
    legend: [...legend, ...m.legend],
    box: unionBox(box, m.box),
    obstacles: m.obstacles,
    notes: a.cautions.lines,
  };
}
