import { assemblyView, projectPoint } from '../assembly/views.js';
import type { Assembly } from '../assembly/types.js';
import type { Finding } from '../checks/types.js';
import type { FrameAnnotation } from '../checks/annotate.js';
import { FRAME_PART } from '../checks/props.js';
import { fmt, xmlEscape } from '../export/format.js';
import { planLoops } from '../export/svgOverview.js';
import { loopPathData } from '../export/svgPath.js';
import type { Frame } from '../geometry/frame.js';
import { loopBBox, transformPoint, unionBBox } from '../geometry/loop.js';
import { partBBox } from '../geometry/metrics.js';
import type { Part, Placement } from '../geometry/part.js';
import type { BBox, Vec2 } from '../geometry/types.js';

/**
 * The pictures of the live page as SVG markup (the inside of an `<svg>` element) with a view box in
 * screen units (1 unit = 1 mm). Colours come from the page's style sheet through class names, and
 * every plate carries `data-part` so the page can name it on hover. Pure.
 */
export type SvgView = Readonly<{ viewBox: readonly [x: number, y: number, w: number, h: number]; markup: string }>;

/** A place a finding can be shown: which view, and where in that view's units. */
export type FindingTarget = Readonly<{ view: string; at: Vec2 }>;

/** View id of a part's own picture. */
export const partViewId = (name: string): string => `part:${name}`;

/** Plan view, front up: frame x (forward) points up the screen, frame y (left) to the left. */
export const planPoint = (p: Vec2): Vec2 => [-p[1], -p[0]];

/** A part's own picture: part coordinates, y up. */
const partPoint = (p: Vec2): Vec2 => [p[0], -p[1]];

const n3 = (x: number): string => fmt(x, 3);

function viewBoxOf(bb: BBox, marginMm: number): SvgView['viewBox'] {
  return [bb[0] - marginMm, bb[1] - marginMm, bb[2] - bb[0] + 2 * marginMm, bb[3] - bb[1] + 2 * marginMm];
}

function screenBBox(points: readonly Vec2[]): BBox {
  let bb: BBox = [Infinity, Infinity, -Infinity, -Infinity];
  for (const p of points) bb = unionBBox(bb, [p[0], p[1], p[0], p[1]]);
  return bb;
}

/** Where a point of a part lands in plan view, for one of its copies. */
function placedPoint(part: Part, pl: Placement, p: Vec2): Vec2 {
  if (pl.vertical) return [p[0], pl.translateMm[1] - part.thicknessMm / 2];
  return transformPoint(p, { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY });
}

/**
 * The assembled frame from above, front up: prop discs (those the camera sees marked), the camera's
 * view in the prop plane, every plate copy at its height (lowest first), motors, the camera body,
 * the adjacent tip gaps with their values, and a front arrow.
 */
export function planView(frame: Frame, a: FrameAnnotation): SvgView {
  const out: string[] = [];
  const corners: Vec2[] = [];
  const copies = frame.parts.flatMap((part) => part.placements.map((pl, copy) => ({ part, pl, copy, loops: planLoops(part, pl) })));
  copies.sort((x, y) => x.pl.zMm - y.pl.zMm || x.part.name.localeCompare(y.part.name) || x.copy - y.copy);
  if (a.viewRegion && a.viewRegion.length > 2) {
    const pts = a.viewRegion.map(planPoint);
    out.push(`<polygon class="camera-view" points="${pts.map((p) => `${n3(p[0])},${n3(p[1])}`).join(' ')}"><title>camera view in the prop plane</title></polygon>`);
  }
  out.push('<g class="props">');
  for (const d of a.discs) {
    const c = planPoint(d.centerMm);
    corners.push([c[0] - d.radiusMm, c[1] - d.radiusMm], [c[0] + d.radiusMm, c[1] + d.radiusMm]);
    out.push(`<circle class="prop${d.visible ? ' seen' : ''}" data-site="${d.id}" cx="${n3(c[0])}" cy="${n3(c[1])}" r="${n3(d.radiusMm)}"><title>${xmlEscape(`prop ${d.id}, Ø${(d.radiusMm * 2).toFixed(1)} mm${d.visible ? ', in the camera view' : ''}`)}</title></circle>`);
  }
  out.push('</g>', '<g class="plates">');
  for (const c of copies) {
    const bb = loopBBox(c.loops[0]);
    corners.push(planPoint([bb[0], bb[1]]), planPoint([bb[2], bb[3]]));
    const d = c.loops.map((l) => loopPathData(l, planPoint)).join(' ');
    out.push(`<path class="plate role-${c.part.role}" data-part="${xmlEscape(c.part.name)}" data-copy="${c.copy}" d="${d}"/>`);
  }
  out.push('</g>');
  if (frame.cameraPlanMm) out.push(`<path class="camera" d="${loopPathData(frame.cameraPlanMm, planPoint)}"><title>camera</title></path>`);
  out.push('<g class="motors">');
  for (const s of frame.sites) {
    const c = planPoint(s.motorMm);
    out.push(`<circle class="motor" cx="${n3(c[0])}" cy="${n3(c[1])}" r="1.5"/>`);
  }
  out.push('</g>', '<g class="tip-gaps">');
  for (const g of a.tipGaps) {
    const p = planPoint(g.a);
    const q = planPoint(g.b);
    const mid: Vec2 = [(p[0] + q[0]) / 2, (p[1] + q[1]) / 2];
    out.push(`<line x1="${n3(p[0])}" y1="${n3(p[1])}" x2="${n3(q[0])}" y2="${n3(q[1])}"/><text x="${n3(mid[0])}" y="${n3(mid[1] - 1.5)}">${g.gapMm.toFixed(1)}</text>`);
  }
  out.push('</g>');
  const bb = screenBBox(corners);
  // Front arrow beside the frame, pointing up the screen (frame +x).
  const ax = bb[2] + 8;
  const ay = bb[1] + 4;
  out.push(`<g class="front-arrow"><path d="M${n3(ax)} ${n3(ay)} l-3 7 h6 z"/><line x1="${n3(ax)}" y1="${n3(ay + 6)}" x2="${n3(ax)}" y2="${n3(ay + 18)}"/><text x="${n3(ax)}" y="${n3(ay + 24)}">front</text></g>`);
  return { viewBox: viewBoxOf([bb[0], bb[1], bb[2] + 14, bb[3]], 6), markup: out.join('') };
}

/** One part on its own, as cut (part coordinates, y up): outline, holes, slots and cut-outs, struts. */
export function partView(part: Part): SvgView {
  const [x0, y0, x1, y1] = partBBox(part);
  const out: string[] = [`<path class="outline" data-part="${xmlEscape(part.name)}" d="${loopPathData(part.outline, partPoint)}"/>`];
  for (const f of part.features) out.push(`<path class="feature ${f.kind}" d="${loopPathData(f.loop, partPoint)}"><title>${xmlEscape(`${f.purpose}${f.diameterMm ? ` Ø${f.diameterMm.toFixed(2)}` : ''}${f.screw ? ` (${f.screw})` : ''}`)}</title></path>`);
  for (const m of part.members) {
    const a = partPoint(m.startMm);
    const b = partPoint(m.endMm);
    out.push(`<line class="member" x1="${n3(a[0])}" y1="${n3(a[1])}" x2="${n3(b[0])}" y2="${n3(b[1])}"/>`);
  }
  const margin = Math.max(2, 0.04 * Math.max(x1 - x0, y1 - y0));
  return { viewBox: viewBoxOf([x0, -y1, x1, -y0], margin), markup: out.join('') };
}

/** Side view, front to the right: frame x to the right, z up the screen. */
const sidePoint = (p: Vec2): Vec2 => [p[0], -p[1]];

/**
 * The assembled frame seen from the left (the assembly's side-view data): plates, standoffs and
 * spacers, proud screw heads and nuts, motors, prop bands, components and the camera's tilt range,
 * with the stack-up heights as a dimension chain at the left.
 */
export function sideView(a: Assembly): SvgView {
  const v = assemblyView(a, 'side');
  const partOf = new Map(a.plates.map((p) => [p.id, p.part.name]));
  const out: string[] = [];
  for (const it of v.items) {
    const pts = it.polygon.map((p) => sidePoint(p)).map((p) => `${n3(p[0])},${n3(p[1])}`).join(' ');
    const part = partOf.get(it.id);
    out.push(`<polygon class="item kind-${it.kind}${it.dashed ? ' dashed' : ''}"${part ? ` data-part="${xmlEscape(part)}"` : ''} points="${pts}"><title>${xmlEscape(it.id)}</title></polygon>`);
  }
  const [x0, y0, x1, y1] = v.bbox;
  const step = Math.max(4, (x1 - x0) / 40);
  v.dimensions.forEach((d, i) => {
    const x = x0 - step * (i + 1.5);
    out.push(`<g class="dimension"><line x1="${n3(x)}" y1="${n3(-d.fromMm)}" x2="${n3(x)}" y2="${n3(-d.toMm)}"/><text x="${n3(x - 0.6)}" y="${n3(-(d.fromMm + d.toMm) / 2)}"><title>${xmlEscape(d.label)}</title>${(d.toMm - d.fromMm).toFixed(1)}</text></g>`);
  });
  const left = x0 - step * (v.dimensions.length + 2.5);
  // Front arrow pointing right (frame +x) above the frame.
  const ay = -y1 - step * 2;
  out.push(`<g class="front-arrow side"><line x1="${n3(x1 - 18)}" y1="${n3(ay)}" x2="${n3(x1 - 3)}" y2="${n3(ay)}"/><path d="M${n3(x1)} ${n3(ay)} l-7 -3 v6 z"/><text x="${n3(x1 - 12)}" y="${n3(ay - 2)}">front</text></g>`);
  return { viewBox: viewBoxOf([left, ay - step * 2, x1, -y0], 4), markup: out.join('') };
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
  return [{ view: partViewId(part.name), at: partPoint(at) }, ...part.placements.map((pl) => ({ view: 'plan', at: planPoint(placedPoint(part, pl, at)) }))];
}
