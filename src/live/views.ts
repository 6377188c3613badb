import { assemblyView, projectPoint, type ViewItemKind } from '../assembly/views.js';
import type { Assembly } from '../assembly/types.js';
import type { Finding } from '../checks/types.js';
import type { FrameAnnotation } from '../checks/annotate.js';
import { FRAME_PART } from '../checks/props.js';
import { fmt, xmlEscape } from '../export/format.js';
import { EMPTY_BOX, padBox, pictureContent, placeLabels, PLAN_VIEW, unionBox, type Box, type LabelRequest, type LegendEntry, type PictureOptions } from '../export/picture.js';
import { viewLegend } from '../export/svgAssemblyView.js';
import { mappedBox, planLegend, planLoops } from '../export/svgOverview.js';
import { frontWord } from '../export/svgPart.js';
import { loopPathData } from '../export/svgPath.js';
import type { Frame } from '../geometry/frame.js';
import { loopBBox, transformPoint } from '../geometry/loop.js';
import { partBBox } from '../geometry/metrics.js';
import type { Part, Placement } from '../geometry/part.js';
import type { Vec2 } from '../geometry/types.js';

/**
 * The pictures of the live page as SVG markup (the inside of an `<svg>` element) with a view box in
 * screen units (1 unit = 1 mm), in the picture convention of every exported SVG
 * (src/export/picture.ts): plan views front up, a front arrow, a scale bar, a legend, labels placed
 * without overlap, the view box from the drawn extent. Colours of the drawn items come from the
 * page's style sheet through class names, and every plate carries `data-part` so the page can name
 * it on hover. Pure.
 */
export type SvgView = Readonly<{ viewBox: readonly [x: number, y: number, w: number, h: number]; markup: string }>;

/** A place a finding can be shown: which view, and where in that view's units. */
export type FindingTarget = Readonly<{ view: string; at: Vec2 }>;

/** View id of a part's own picture. */
export const partViewId = (name: string): string => `part:${name}`;

/** Plan view and a part's own picture, front (a part's +x) up: the shared plan-view map. */
const planPoint = PLAN_VIEW.map;

/** Side view, front to the right: frame x to the right, z up the screen. */
const sidePoint = (p: Vec2): Vec2 => [p[0], -p[1]];

const n3 = (x: number): string => fmt(x, 3);

/** Widest stroke the page draws, in mm of the picture (plates 0.8 px scale with the view; this bounds them). */
const STROKE_MM = 0.5;

type Decoration = Omit<PictureOptions, 'title' | 'comment' | 'background'>;

/** The drawn items with the shared foot band (front arrow, scale bar, legend) and placed labels. */
function view(o: Decoration): SvgView {
  const c = pictureContent(o);
  const vb = c.viewBox;
  return { viewBox: [vb.x0, vb.y0, vb.x1 - vb.x0, vb.y1 - vb.y0], markup: c.markup.join('') };
}

const pointBox = (p: Vec2, r: number): Box => ({ x0: p[0] - r, y0: p[1] - r, x1: p[0] + r, y1: p[1] + r });

/** Where a point of a part lands in plan view, for one of its copies. */
function placedPoint(part: Part, pl: Placement, p: Vec2): Vec2 {
  if (pl.vertical) return [p[0], pl.translateMm[1] - part.thicknessMm / 2];
  return transformPoint(p, { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY });
}

/** Legend rows the live plan view adds to the frame's own: what the camera sees, and the tip gaps. */
const CAMERA_LEGEND: readonly LegendEntry[] = [
  { symbol: 'fill', colour: '#ffe08a', opacity: 0.4, label: 'camera view in the prop plane' },
  { symbol: 'fill', colour: '#ffb3a8', opacity: 0.6, label: 'prop in the camera view' },
];
const TIP_GAP_LEGEND: LegendEntry = { symbol: 'line', colour: '#3b82c4', label: 'tip gap, mm' };

/**
 * The assembled frame from above, front up: prop discs (those the camera sees marked), the camera's
 * view in the prop plane, every plate copy at its height (lowest first), motors, the camera body,
 * the adjacent tip gaps with their values, a front arrow, a scale bar and a legend.
 */
export function planView(frame: Frame, a: FrameAnnotation): SvgView {
  const out: string[] = [];
  let box: Box = EMPTY_BOX;
  const copies = frame.parts.flatMap((part) => part.placements.map((pl, copy) => ({ part, pl, copy, loops: planLoops(part, pl) })));
  copies.sort((x, y) => x.pl.zMm - y.pl.zMm || x.part.name.localeCompare(y.part.name) || x.copy - y.copy);
  const seen = a.viewRegion && a.viewRegion.length > 2;
  if (a.viewRegion && seen) {
    const pts = a.viewRegion.map(planPoint);
    out.push(`<polygon class="camera-view" points="${pts.map((p) => `${n3(p[0])},${n3(p[1])}`).join(' ')}"><title>camera view in the prop plane</title></polygon>`);
    for (const p of pts) box = unionBox(box, pointBox(p, STROKE_MM / 2));
  }
  out.push('<g class="props">');
  for (const d of a.discs) {
    const c = planPoint(d.centerMm);
    box = unionBox(box, pointBox(c, d.radiusMm + STROKE_MM / 2));
    out.push(`<circle class="prop${d.visible ? ' seen' : ''}" data-site="${d.id}" cx="${n3(c[0])}" cy="${n3(c[1])}" r="${n3(d.radiusMm)}"><title>${xmlEscape(`prop ${d.id}, Ø${(d.radiusMm * 2).toFixed(1)} mm${d.visible ? ', in the camera view' : ''}`)}</title></circle>`);
  }
  out.push('</g>', '<g class="plates">');
  for (const c of copies) {
    box = unionBox(box, padBox(mappedBox(loopBBox(c.loops[0]), planPoint), STROKE_MM / 2));
    const d = c.loops.map((l) => loopPathData(l, planPoint)).join(' ');
    out.push(`<path class="plate role-${c.part.role}" data-part="${xmlEscape(c.part.name)}" data-copy="${c.copy}" d="${d}"/>`);
  }
  out.push('</g>');
  if (frame.cameraPlanMm) out.push(`<path class="camera" d="${loopPathData(frame.cameraPlanMm, planPoint)}"><title>camera</title></path>`);
  out.push('<g class="motors">');
  const obstacles: Box[] = [];
  for (const s of frame.sites) {
    const c = planPoint(s.motorMm);
    out.push(`<circle class="motor" cx="${n3(c[0])}" cy="${n3(c[1])}" r="1.5"/>`);
    obstacles.push(pointBox(c, 1.5));
  }
  out.push('</g>', '<g class="tip-gaps">');
  const labels: LabelRequest[] = [];
  for (const g of a.tipGaps) {
    const p = planPoint(g.a);
    const q = planPoint(g.b);
    out.push(`<line x1="${n3(p[0])}" y1="${n3(p[1])}" x2="${n3(q[0])}" y2="${n3(q[1])}"/>`);
    labels.push({ anchor: [(p[0] + q[0]) / 2, (p[1] + q[1]) / 2], text: g.gapMm.toFixed(1), sizeMm: 3, fill: '#1d4f80', cls: 'tip-gap' });
  }
  out.push('</g>');
  return view({
    body: out,
    contentBox: box,
    labels: placeLabels(labels, obstacles),
    legend: [...planLegend(frame), ...(seen ? CAMERA_LEGEND : []), ...(a.tipGaps.length ? [TIP_GAP_LEGEND] : [])],
  });
}

const PART_LEGEND: readonly LegendEntry[] = [
  { symbol: 'fill', colour: '#e3e7ec', label: 'plate' },
  { symbol: 'line', colour: '#c0261b', label: 'holes, slots, cut-outs' },
  { symbol: 'line', colour: '#8a97a6', dash: '1 1', label: 'member centreline' },
];

/** One part on its own, as cut, +x up like its exported picture: outline, holes, slots and cut-outs, struts. */
export function partView(part: Part): SvgView {
  const out: string[] = [`<path class="outline" data-part="${xmlEscape(part.name)}" d="${loopPathData(part.outline, planPoint)}"/>`];
  for (const f of part.features) out.push(`<path class="feature ${f.kind}" d="${loopPathData(f.loop, planPoint)}"><title>${xmlEscape(`${f.purpose}${f.diameterMm ? ` Ø${f.diameterMm.toFixed(2)}` : ''}${f.screw ? ` (${f.screw})` : ''}`)}</title></path>`);
  for (const m of part.members) {
    const a = planPoint(m.startMm);
    const b = planPoint(m.endMm);
    out.push(`<line class="member" x1="${n3(a[0])}" y1="${n3(a[1])}" x2="${n3(b[0])}" y2="${n3(b[1])}"/>`);
  }
  const legend = PART_LEGEND.filter((_, i) => i === 0 || (i === 1 ? part.features.length > 0 : part.members.length > 0));
  return view({ body: out, contentBox: padBox(PLAN_VIEW.mapBox(partBBox(part)), STROKE_MM / 2), front: frontWord(part), legend, marginMm: 2 });
}

/**
 * The assembled frame seen from the left (the assembly's side-view data): plates, standoffs and
 * spacers, proud screw heads and nuts, motors, prop bands, components and the camera's tilt range,
 * with the stack-up heights as a dimension chain at the left; a front arrow pointing right.
 */
export function sideView(a: Assembly): SvgView {
  const v = assemblyView(a, 'side');
  const partOf = new Map(a.plates.map((p) => [p.id, p.part.name]));
  const out: string[] = [];
  let box: Box = EMPTY_BOX;
  const kinds = new Set<ViewItemKind>();
  for (const it of v.items) {
    kinds.add(it.kind);
    const screen = it.polygon.map(sidePoint);
    for (const p of screen) box = unionBox(box, pointBox(p, STROKE_MM / 2));
    const part = partOf.get(it.id);
    out.push(`<polygon class="item kind-${it.kind}${it.dashed ? ' dashed' : ''}"${part ? ` data-part="${xmlEscape(part)}"` : ''} points="${screen.map((p) => `${n3(p[0])},${n3(p[1])}`).join(' ')}"><title>${xmlEscape(it.id)}</title></polygon>`);
  }
  const [x0, y0, x1] = v.bbox;
  const step = Math.max(4, (x1 - x0) / 40);
  const labels: LabelRequest[] = [];
  v.dimensions.forEach((d, i) => {
    const x = x0 - step * (i + 1.5);
    out.push(`<g class="dimension"><title>${xmlEscape(d.label)}</title><line x1="${n3(x)}" y1="${n3(-d.fromMm)}" x2="${n3(x)}" y2="${n3(-d.toMm)}"/></g>`);
    box = unionBox(box, { x0: x - STROKE_MM, y0: -d.toMm, x1: x + STROKE_MM, y1: -d.fromMm });
    labels.push({ anchor: [x, -(d.fromMm + d.toMm) / 2], text: (d.toMm - d.fromMm).toFixed(1), sizeMm: 2.6, fill: '#c00000', cls: 'dimension-label', clearMm: 0.5 });
  });
  if (!Number.isFinite(box.x0)) box = { x0, y0: -y0, x1, y1: -y0 };
  return view({ body: out, contentBox: box, labels: placeLabels(labels), front: 'front', frontDirection: 'right', legend: viewLegend(kinds, v.dimensions.length > 0) });
}

/**
 * Where a finding shows: frame findings in plan view (and, for fit findings with a place in space,
 * in side view); part findings on the part and on each copy in plan.
 */
export function findingTargets(frame: Frame, f: Finding): FindingTarget[] {
  if (f.where) {
    const w = f.where;
    return [{ view: 'plan', at: planPoint([w[0], w[1]]) }, { view: 'side', at: sidePoint(projectPoint('side', w)) }];
  }
  if (!f.atMm) return [];
  const at: Vec2 = [f.atMm[0], f.atMm[1]];
  if (f.part === FRAME_PART) return [{ view: 'plan', at: planPoint(at) }];
  const part = frame.parts.find((p) => p.name === f.part);
  if (!part) return [];
  return [{ view: partViewId(part.name), at: planPoint(at) }, ...part.placements.map((pl) => ({ view: 'plan', at: planPoint(placedPoint(part, pl, at)) }))];
}
