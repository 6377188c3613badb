import { loopBBox } from '../geometry/loop.js';
import { flattenLoop } from '../geometry/loop.js';
import { convexHull } from '../geometry/primitives.js';
import type { Vec2 } from '../geometry/types.js';
import { jointStandsProud } from './joints.js';
import type { Assembly, OrientedBox, Vec3 } from './types.js';

/**
 * Orthographic views of the assembly as plain 2D data for drawings and the live page: every item a
 * closed polygon in view coordinates (mm; page x to the right, page y up), drawn in list order.
 * Side view: seen from the left (+y), frame x to the right, z up. Front view: seen from ahead,
 * frame −y to the right (the frame's left appears on the viewer's right), z up. Plan: x up the
 * page is not used here; plan is x to the right, y up.
 */
export type ViewName = 'side' | 'front' | 'plan';

export type ViewItemKind = 'plate' | 'standoff' | 'spacer' | 'screw' | 'motor' | 'prop' | 'component' | 'camera-range';

export type ViewItem = Readonly<{ id: string; kind: ViewItemKind; polygon: readonly Vec2[]; dashed?: boolean }>;

/** A height dimension at the side of the view: from z = fromMm to z = toMm, with its label. */
export type HeightDimension = Readonly<{ fromMm: number; toMm: number; label: string }>;

export type AssemblyView = Readonly<{
  view: ViewName;
  items: readonly ViewItem[];
  dimensions: readonly HeightDimension[];
  /** [minX, minY, maxX, maxY] of the items, view coordinates. */
  bbox: readonly [number, number, number, number];
}>;

const CHORD_MM = 0.05;

/** Frame point → view point. */
export function projectPoint(view: ViewName, p: Vec3): Vec2 {
  if (view === 'side') return [p[0], p[2]];
  if (view === 'front') return [-p[1], p[2]];
  return [p[0], p[1]];
}

const rect = (x0: number, y0: number, x1: number, y1: number): Vec2[] => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];

function boxCorners(b: OrientedBox): Vec3[] {
  const out: Vec3[] = [];
  for (const i of [-1, 1]) for (const j of [-1, 1]) for (const k of [-1, 1]) {
    const h = b.halfSizeMm;
    out.push([0, 1, 2].map((n) => b.centreMm[n] + i * h[0] * b.axes[0][n] + j * h[1] * b.axes[1][n] + k * h[2] * b.axes[2][n]) as unknown as Vec3);
  }
  return out;
}

const boxOutline = (view: ViewName, b: OrientedBox): Vec2[] => convexHull(boxCorners(b).map((c) => projectPoint(view, c)));

/** A cylinder along an axis through `at` (length along +axis), projected. */
function cylinderOutline(view: ViewName, at: Vec3, axis: Vec3, diameter: number, length: number): Vec2[] {
  const r = diameter / 2;
  const ends = [at, [at[0] + axis[0] * length, at[1] + axis[1] * length, at[2] + axis[2] * length] as Vec3];
  const pts: Vec2[] = [];
  // Seen along its axis a cylinder is a circle; across, a rectangle: the hull of both end discs covers both.
  for (const e of ends) {
    for (let k = 0; k < 24; k++) {
      const a = (k * Math.PI) / 12;
      const off = perpendicularCircle(axis, r, a);
      pts.push(projectPoint(view, [e[0] + off[0], e[1] + off[1], e[2] + off[2]]));
    }
  }
  return convexHull(pts);
}

function perpendicularCircle(axis: Vec3, r: number, a: number): Vec3 {
  const u: Vec3 = Math.abs(axis[2]) > 0.5 ? [1, 0, 0] : [0, 0, 1];
  const v: Vec3 = [axis[1] * u[2] - axis[2] * u[1], axis[2] * u[0] - axis[0] * u[2], axis[0] * u[1] - axis[1] * u[0]];
  return [0, 1, 2].map((n) => r * (Math.cos(a) * u[n] + Math.sin(a) * v[n])) as unknown as Vec3;
}

/**
 * One view of the assembly: plates, standoffs and spacers, screw heads and nuts that stand proud,
 * motors, prop discs (their swept band, seen edge on), components, and the camera at both ends of
 * its tilt range (dashed). Side and front views carry the stack-up heights as dimensions.
 * @example assemblyView(a, 'side').dimensions.map((d) => d.label)
 */
export function assemblyView(a: Assembly, view: ViewName): AssemblyView {
  const items: ViewItem[] = [];
  for (const p of a.plates) {
    if (view === 'plan' || (p.orientation === 'vertical' && view === 'side')) {
      const pts = p.planOutline ? flattenLoop(p.planOutline, CHORD_MM) : flattenLoop(p.part.outline, CHORD_MM).map(([x, z]) => projectPoint(view, [x + p.placement.translateMm[0], p.placement.translateMm[1], z + p.placement.zMm]));
      items.push({ id: p.id, kind: 'plate', polygon: view === 'plan' && p.orientation === 'vertical' ? rect(p.bounds.minMm[0], p.bounds.minMm[1], p.bounds.maxMm[0], p.bounds.maxMm[1]) : pts });
      continue;
    }
    if (p.planOutline) {
      const b = loopBBox(p.planOutline);
      items.push({ id: p.id, kind: 'plate', polygon: view === 'side' ? rect(b[0], p.zLowMm, b[2], p.zLowMm + p.thicknessMm) : rect(-b[3], p.zLowMm, -b[1], p.zLowMm + p.thicknessMm) });
    } else {
      items.push({ id: p.id, kind: 'plate', polygon: rect(-p.bounds.maxMm[1], p.bounds.minMm[2], -p.bounds.minMm[1], p.bounds.maxMm[2]) });
    }
  }
  for (const s of [...a.standoffs, ...a.cameraSpacers]) items.push({ id: s.id, kind: s.axis[2] !== 0 ? 'standoff' : 'spacer', polygon: cylinderOutline(view, s.startMm, s.axis, s.acrossFlatsMm, s.lengthMm) });
  for (const j of a.joints) {
    if (!jointStandsProud(j)) continue;
    const back: Vec3 = [j.headAtMm[0] - j.axis[0] * j.headHeightMm, j.headAtMm[1] - j.axis[1] * j.headHeightMm, j.headAtMm[2] - j.axis[2] * j.headHeightMm];
    items.push({ id: `${j.id} head`, kind: 'screw', polygon: cylinderOutline(view, back, j.axis, j.headDiameterMm, j.headHeightMm) });
    if (j.nut && j.nutAtMm) items.push({ id: `${j.id} nut`, kind: 'screw', polygon: cylinderOutline(view, j.nutAtMm, j.axis, j.nut.acrossFlatsMm, j.nut.heightMm) });
  }
  for (const m of a.motors) items.push({ id: `motor ${m.site}`, kind: 'motor', polygon: cylinderOutline(view, m.baseCentreMm, [0, 0, 1], m.bellDiameterMm, m.heightMm) });
  for (const c of a.components) {
    for (const b of c.boxes) items.push({ id: c.id, kind: 'component', polygon: boxOutline(view, b) });
    if (c.sweep && c.sweep.length > 1 && view === 'side') {
      for (const pose of [c.sweep[0], c.sweep[c.sweep.length - 1]]) for (const b of pose) items.push({ id: `${c.id} tilt range`, kind: 'camera-range', polygon: boxOutline(view, b), dashed: true });
    }
  }
  for (const p of a.props) {
    const base: Vec3 = [p.centreMm[0], p.centreMm[1], p.centreMm[2] - p.bandMm / 2];
    items.push({ id: `prop ${p.site}`, kind: 'prop', polygon: cylinderOutline(view, base, [0, 0, 1], p.diameterMm, p.bandMm), dashed: true });
  }
  let bb: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const it of items) for (const q of it.polygon) bb = [Math.min(bb[0], q[0]), Math.min(bb[1], q[1]), Math.max(bb[2], q[0]), Math.max(bb[3], q[1])];
  const s = a.stackUp;
  const dimensions: HeightDimension[] = view === 'plan' ? [] : [
    { fromMm: s.bottomMm, toMm: 0, label: 'under the bottom plate' },
    { fromMm: 0, toMm: s.bottomPlateTopMm, label: 'bottom plate' },
    { fromMm: s.bottomPlateTopMm, toMm: s.topPlateLowMm, label: 'plate gap' },
    { fromMm: s.topPlateLowMm, toMm: s.topPlateTopMm, label: 'top plate' },
    { fromMm: s.armTopMm, toMm: s.propPlaneMm, label: 'prop plane above arm' },
  ].filter((d) => d.toMm - d.fromMm > 1e-9);
  return { view, items, dimensions, bbox: bb };
}
