import type { Frame } from '../geometry/frame.js';
import { loopBBox, transformLoop, unionBBox } from '../geometry/loop.js';
import type { Part, Placement } from '../geometry/part.js';
import type { BBox, Loop, Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { EMPTY_BOX, padBox, pictureSvg, placeLabels, PLAN_VIEW, unionBox, type Box, type LegendEntry } from './picture.js';
import type { Annotation } from './svgPart.js';
import { loopPathData } from './svgPath.js';

export type OverviewOptions = Readonly<{
  /** Check markers, view region, tip gaps … (see svgFindings), drawn on top. */
  annotation?: Annotation;
}>;

/** Fill colour of each plate role in plan views; exported so other plan pictures use the same key. */
export const ROLE_FILL: Record<Part['role'], string> = {
  bottom: '#3a3f47',
  arm: '#23272e',
  top: '#566070',
  brace: '#2f343c',
  'camera-side': '#7a5c3c',
  imported: '#3a3f47',
};

const ROLE_WORD: Record<Part['role'], string> = {
  bottom: 'bottom plate',
  arm: 'arm',
  top: 'top plate',
  brace: 'brace',
  'camera-side': 'camera side plate',
  imported: 'plate',
};

export const PROP_DISC_STYLE = { fill: '#9ecbff', stroke: '#3b82c4', dash: '3 2' } as const;

/** A plate copy as it lies in plan view (vertical plates as their footprint), frame coordinates. */
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

/** The assembled frame in plan view, as drawn: SVG elements, the screen box they cover (strokes included) and their legend rows. */
export type FramePlan = Readonly<{ body: readonly string[]; box: Box; legend: readonly LegendEntry[] }>;

/** Widest stroke of a plan drawing (the prop discs' dashed rims). mm. */
const PLAN_STROKE_MM = 0.4;

/**
 * Every plate copy of the assembled frame at its place (lowest first), prop discs, motor centres and
 * the camera, mapped to screen by `map` (PLAN_VIEW's map, moved where the picture wants it: front up).
 * The overview and the range sheet draw frames with it, so one frame looks the same in both.
 */
export function framePlan(frame: Frame, map: (p: Vec2) => Vec2 = PLAN_VIEW.map): FramePlan {
  const copies: Array<{ part: Part; pl: Placement; loops: Loop[] }> = [];
  for (const part of frame.parts) for (const pl of part.placements) copies.push({ part, pl, loops: planLoops(part, pl) });
  copies.sort((a, b) => a.pl.zMm - b.pl.zMm || a.part.name.localeCompare(b.part.name));
  const propR = frame.propDiameterMm / 2;
  let bb: BBox = [Infinity, Infinity, -Infinity, -Infinity];
  for (const c of copies) bb = unionBBox(bb, loopBBox(c.loops[0]));
  for (const s of frame.sites) bb = unionBBox(bb, [s.motorMm[0] - propR, s.motorMm[1] - propR, s.motorMm[0] + propR, s.motorMm[1] + propR]);
  if (frame.cameraPlanMm) bb = unionBBox(bb, loopBBox(frame.cameraPlanMm));
  const body: string[] = [];
  for (const s of frame.sites) {
    const c = map(s.motorMm);
    body.push(`<circle cx="${fmt(c[0], 3)}" cy="${fmt(c[1], 3)}" r="${fmt(propR, 3)}" fill="${PROP_DISC_STYLE.fill}" fill-opacity="0.25" stroke="${PROP_DISC_STYLE.stroke}" stroke-width="${PLAN_STROKE_MM}" stroke-dasharray="${PROP_DISC_STYLE.dash}"/>`);
  }
  for (const c of copies) {
    const d = c.loops.map((l) => loopPathData(l, map)).join(' ');
    body.push(`<path d="${d}" fill="${ROLE_FILL[c.part.role]}" fill-opacity="0.85" fill-rule="evenodd" stroke="#000000" stroke-width="0.25"><title>${xmlEscape(c.part.name)}</title></path>`);
  }
  for (const s of frame.sites) {
    const c = map(s.motorMm);
    body.push(`<circle cx="${fmt(c[0], 3)}" cy="${fmt(c[1], 3)}" r="1.2" fill="#d00000"/>`);
  }
  if (frame.cameraPlanMm) {
    body.push(`<path d="${loopPathData(frame.cameraPlanMm, map)}" fill="#1f6f5c" fill-opacity="0.9" stroke="#000000" stroke-width="0.25"><title>camera</title></path>`);
  }
  return { body, box: padBox(mappedBox(bb, map), PLAN_STROKE_MM / 2), legend: planLegend(frame) };
}

/** Legend rows of a frame's plan view: the plate roles it has (lowest first), prop discs, motor centres, the camera. */
export function planLegend(frame: Frame): LegendEntry[] {
  const placed = frame.parts.flatMap((part) => part.placements.map((pl) => ({ role: part.role, z: pl.zMm })));
  const roles = [...new Set(placed.sort((a, b) => a.z - b.z).map((c) => c.role))];
  return [
    ...roles.map((r) => ({ symbol: 'fill' as const, colour: ROLE_FILL[r], opacity: 0.85, label: ROLE_WORD[r] })),
    { symbol: 'fill', colour: PROP_DISC_STYLE.fill, opacity: 0.4, dash: '1 0.6', label: 'prop disc' },
    { symbol: 'dot', colour: '#d00000', label: 'motor centre' },
    ...(frame.cameraPlanMm ? [{ symbol: 'fill' as const, colour: '#1f6f5c', label: 'camera' }] : []),
  ];
}

/** The screen box of a frame-coordinate box under an affine map (its four corners). */
export function mappedBox(bb: BBox, map: (p: Vec2) => Vec2): Box {
  let box = EMPTY_BOX;
  for (const p of [[bb[0], bb[1]], [bb[2], bb[1]], [bb[2], bb[3]], [bb[0], bb[3]]] as Vec2[]) {
    const q = map(p);
    box = unionBox(box, { x0: q[0], y0: q[1], x1: q[0], y1: q[1] });
  }
  return box;
}

/** Legend rows of several pictures in first-seen order, each label once. */
export function mergedLegend(lists: readonly (readonly LegendEntry[])[]): LegendEntry[] {
  const seen = new Map<string, LegendEntry>();
  for (const l of lists) for (const e of l) if (!seen.has(e.label)) seen.set(e.label, e);
  return [...seen.values()];
}

/**
 * The assembled frame seen from above, for a person to look at: every plate copy at its place
 * (lowest first), prop discs, motor centres, the camera; front up, with arrow, scale bar and legend.
 */
export function frameOverviewSvg(frame: Frame, options: OverviewOptions = {}): string {
  const plan = framePlan(frame);
  const a = options.annotation;
  return pictureSvg({
    title: `${frame.name} rev ${frame.revision}: plan view`,
    heading: `${frame.name} rev ${frame.revision} — plan view, props ${fmt(frame.propDiameterMm, 1)} mm`,
    body: [...plan.body, ...(a?.body ?? [])],
    contentBox: a ? unionBox(plan.box, a.box) : plan.box,
    labels: placeLabels(a?.labels ?? [], a?.obstacles ?? []),
    front: 'front',
    legend: [...plan.legend, ...(a?.legend ?? [])],
    notes: a?.notes ?? [],
  });
}
