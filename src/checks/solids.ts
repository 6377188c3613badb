import { FillRule, areaPathsD, intersectD, rectClip, type PathsD } from 'clipper2-ts';
import type { Assembly, BoltedJoint, Component, OrientedBox, PlacedPlate, Standoff, Vec3 } from '../assembly/types.js';
import { jointStandsProud } from '../assembly/joints.js';
import { flattenLoop, loopBBox, transformLoop } from '../geometry/loop.js';
import { circle, polygon } from '../geometry/primitives.js';
import type { Loop, Vec2 } from '../geometry/types.js';

/**
 * The assembly as prisms for fit checks. Every solid of a plate frame is a prism along z (a plan
 * region between two heights: horizontal plates, standoffs, screw heads, nuts, motors, boards,
 * the battery) or along y (a region in the x–z plane between two y: camera side plates, camera
 * spacers and the camera, which turns about y). Regions keep their exact loops (for distances) and
 * a flattened copy (for overlap areas through clipper2).
 */
export type Prism = Readonly<{
  id: string;
  kind: 'plate' | 'standoff' | 'spacer' | 'head' | 'nut' | 'motor' | 'component';
  axis: 'z' | 'y';
  /** Exact loops: the outline first (counter-clockwise), then any holes (plan for z, x–z for y); plates keep only their outline here. */
  loops: readonly Loop[];
  paths: PathsD;
  /** Extent along the axis. mm. */
  lo: number;
  hi: number;
  /** Bounds in frame coordinates. */
  min: Vec3;
  max: Vec3;
  /** The joint a head or nut belongs to; the component a box belongs to. */
  owner?: string;
}>;

/** Flattening of plate arcs for overlap areas and plan gaps; rule margins (0.5 mm and up) are kept ten times above it. mm. */
export const FIT_CHORD_MM = 0.05;
/** Flattening of the small round solids (heads, nuts, standoffs, motors): 0.25 % of a 3 mm head's area. mm. */
export const SMALL_CHORD_MM = 0.005;
/** Faces closer than this along the axis touch (intended contact), they do not intersect. mm. */
export const CONTACT_MM = 0.01;
/** Overlap areas below this are contact along an edge, not interference. mm². */
export const OVERLAP_AREA_MM2 = 0.05;

const toPaths = (loops: readonly Loop[], chordMm = SMALL_CHORD_MM): PathsD => loops.map((l) => flattenLoop(l, chordMm).map(([x, y]) => ({ x, y })));

const partPaths = new WeakMap<PlacedPlate['part'], PathsD>();

/**
 * A prism whose bounds come from its exact outline (cheap) and whose flattened paths are made only
 * when an overlap test needs them (most pairs are told apart by their bounds).
 */
function prism(id: string, kind: Prism['kind'], axis: 'z' | 'y', loops: readonly Loop[], lo: number, hi: number, owner?: string, given?: () => PathsD): Prism {
  const [a0, b0, a1, b1] = loopBBox(loops[0]);
  const min: Vec3 = axis === 'z' ? [a0, b0, lo] : [a0, lo, b0];
  const max: Vec3 = axis === 'z' ? [a1, b1, hi] : [a1, hi, b1];
  let cache: PathsD | null = null;
  const out = { id, kind, axis, loops, lo, hi, min, max, ...(owner ? { owner } : {}) };
  Object.defineProperty(out, 'paths', {
    enumerable: true,
    get: (): PathsD => (cache ??= given ? given() : toPaths(loops)),
  });
  return out as Prism;
}

/** A regular hexagon of width across flats s about c, corners on the x axis (flats facing ±y). */
export function hexagon(c: Vec2, s: number): Loop {
  const r = s / Math.sqrt(3);
  return polygon(Array.from({ length: 6 }, (_, k) => [c[0] + r * Math.cos((k * Math.PI) / 3), c[1] + r * Math.sin((k * Math.PI) / 3)] as Vec2));
}

/** The plate copy as a prism (outline and holes; vertical plates in x–z). */
export function platePrism(p: PlacedPlate): Prism {
  // Flatten each part once (when first needed), then move the points of every copy.
  const flatOf = (): PathsD => {
    let f = partPaths.get(p.part);
    if (!f) {
      f = toPaths([p.part.outline, ...p.part.features.map((x) => x.loop)], FIT_CHORD_MM);
      partPaths.set(p.part, f);
    }
    return f;
  };
  const pl = p.placement;
  if (p.planOutline) {
    const c = Math.cos(pl.rotateRad);
    const s = Math.sin(pl.rotateRad);
    const m = pl.mirrorY ? -1 : 1;
    const moved = () => flatOf().map((path) => path.map((q) => ({ x: c * q.x - s * m * q.y + pl.translateMm[0], y: s * q.x + c * m * q.y + pl.translateMm[1] })));
    return prism(p.id, 'plate', 'z', [p.planOutline], p.zLowMm, p.zLowMm + p.thicknessMm, undefined, moved);
  }
  const moved = () => flatOf().map((path) => path.map((q) => ({ x: q.x + pl.translateMm[0], y: q.y + pl.zMm })));
  const outline = transformed(p.part.outline, { rotateRad: 0, translateMm: [pl.translateMm[0], pl.zMm], mirrorY: false });
  return prism(p.id, 'plate', 'y', [outline], p.bounds.minMm[1], p.bounds.maxMm[1], undefined, moved);
}

/** The loop moved by a placement's plan transform (mirror, rotate, translate). */
const transformed = (l: Loop, pl: { rotateRad: number; translateMm: Vec2; mirrorY: boolean }): Loop => transformLoop(l, { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY });

/** A standoff (z) or camera spacer (y) as a prism. */
export function standoffPrism(s: Standoff): Prism {
  if (s.axis[2] !== 0) {
    const loop = s.shape === 'hex' ? hexagon(s.planMm, s.acrossFlatsMm) : circle(s.planMm, s.acrossFlatsMm / 2);
    return prism(s.id, 'standoff', 'z', [loop], s.zBottomMm, s.zTopMm);
  }
  const loop = s.shape === 'hex' ? hexagon([s.planMm[0], s.zBottomMm], s.acrossFlatsMm) : circle([s.planMm[0], s.zBottomMm], s.acrossFlatsMm / 2);
  return prism(s.id, 'spacer', 'y', [loop], s.startMm[1], s.startMm[1] + s.lengthMm);
}

/**
 * The parts of a joint that stand proud of its plates: the head (unless countersunk into the first
 * plate) and the nut. Along z or y as the screw runs.
 */
export function jointPrisms(j: BoltedJoint): Prism[] {
  const out: Prism[] = [];
  const axisY = j.axis[1] !== 0;
  const dir = axisY ? j.axis[1] : j.axis[2];
  const along = axisY ? j.headAtMm[1] : j.headAtMm[2];
  const centre: Vec2 = axisY ? [j.headAtMm[0], j.headAtMm[2]] : j.planMm;
  if (jointStandsProud(j)) {
    const [lo, hi] = dir > 0 ? [along - j.headHeightMm, along] : [along, along + j.headHeightMm];
    out.push(prism(`${j.id} head`, 'head', axisY ? 'y' : 'z', [circle(centre, j.headDiameterMm / 2)], lo, hi, j.id));
  }
  if (j.nut && j.nutAtMm) {
    const far = axisY ? j.nutAtMm[1] : j.nutAtMm[2];
    const [lo, hi] = dir > 0 ? [far, far + j.nut.heightMm] : [far - j.nut.heightMm, far];
    out.push(prism(`${j.id} nut`, 'nut', axisY ? 'y' : 'z', [hexagon(centre, j.nut.acrossFlatsMm)], lo, hi, j.id));
    if (j.washer) {
      const h = j.washer.thicknessMm;
      const [wlo, whi] = dir > 0 ? [far - h, far] : [far, far + h];
      out.push(prism(`${j.id} washer`, 'nut', axisY ? 'y' : 'z', [circle(centre, j.washer.outerMm / 2)], wlo, whi, j.id));
    }
  }
  return out;
}

/**
 * An axis-aligned component box (a z-prism), or a box whose width runs along y and which is turned
 * about y (the camera: `axis` 'y'), as a prism.
 */
export function boxPrism(id: string, b: OrientedBox, owner: string, axis: 'z' | 'y' = 'z'): Prism {
  const [f, s, u] = b.axes;
  const h = b.halfSizeMm;
  if (axis === 'y') {
    if (!(Math.abs(s[1]) > 1 - 1e-12 && Math.abs(f[1]) < 1e-12 && Math.abs(u[1]) < 1e-12)) throw new Error(`box ${id} is not turned about y`);
    // Turned about y: a rectangle in x–z.
    const c: Vec2 = [b.centreMm[0], b.centreMm[2]];
    const corners = [[-1, -1], [1, -1], [1, 1], [-1, 1]].map(([a, k]) => [c[0] + a * h[0] * f[0] + k * h[2] * u[0], c[1] + a * h[0] * f[2] + k * h[2] * u[2]] as Vec2);
    return prism(id, 'component', 'y', [polygon(ccw(corners))], b.centreMm[1] - h[1], b.centreMm[1] + h[1], owner);
  }
  // Axis-aligned (or turned about z): a plan polygon between two heights.
  const c: Vec2 = [b.centreMm[0], b.centreMm[1]];
  const corners = [[-1, -1], [1, -1], [1, 1], [-1, 1]].map(([a, k]) => [c[0] + a * h[0] * f[0] + k * h[1] * s[0], c[1] + a * h[0] * f[1] + k * h[1] * s[1]] as Vec2);
  const hz = Math.abs(f[2]) * h[0] + Math.abs(s[2]) * h[1] + Math.abs(u[2]) * h[2];
  return prism(id, 'component', 'z', [polygon(ccw(corners))], b.centreMm[2] - hz, b.centreMm[2] + hz, owner);
}

function ccw(pts: Vec2[]): Vec2[] {
  let a = 0;
  for (let i = 0; i < pts.length; i++) {
    const p = pts[i];
    const q = pts[(i + 1) % pts.length];
    a += p[0] * q[1] - q[0] * p[1];
  }
  return a >= 0 ? pts : [...pts].reverse();
}

/** A motor as a cylinder prism. */
export function motorPrism(m: Assembly['motors'][number]): Prism {
  return prism(`motor ${m.site}`, 'motor', 'z', [circle([m.baseCentreMm[0], m.baseCentreMm[1]], m.bellDiameterMm / 2)], m.baseCentreMm[2], m.baseCentreMm[2] + m.heightMm, m.site);
}

/** The component's boxes as prisms (a multi-box component gets "id body", "id lens"). */
export function componentPrisms(c: Component): Prism[] {
  const names = c.kind === 'camera' ? ['body', 'lens'] : [];
  return c.boxes.map((b, k) => boxPrism(c.boxes.length > 1 ? `${c.id} ${names[k] ?? k + 1}` : c.id, b, c.id, c.kind === 'camera' ? 'y' : 'z'));
}

/** Every solid of the assembly except props, antennas and the camera (checked through its sweep). */
export function assemblyPrisms(a: Assembly): Prism[] {
  return [
    ...a.plates.map(platePrism),
    ...a.standoffs.map(standoffPrism),
    ...a.cameraSpacers.map(standoffPrism),
    ...a.joints.flatMap(jointPrisms),
    ...a.motors.map(motorPrism),
    ...a.components.filter((c) => c.kind !== 'camera' && c.kind !== 'antenna').flatMap(componentPrisms),
  ];
}

/** How two prisms overlap: volume (mm³), a point inside the overlap, or null when they only touch or miss. */
export type Overlap = Readonly<{ volumeMm3: number; where: Vec3 }>;

const boxesApart = (a: Prism, b: Prism, gap = 0): boolean =>
  a.min[0] > b.max[0] + gap || b.min[0] > a.max[0] + gap || a.min[1] > b.max[1] + gap || b.min[1] > a.max[1] + gap || a.min[2] > b.max[2] + gap || b.min[2] > a.max[2] + gap;

/**
 * Overlap of two prisms. Same axis: the overlap of the two regions (clipper2 intersection of the
 * flattened loops) times the overlap along the axis. Crossed axes (z and y): they meet where, at
 * one x, the z-prism's region crosses the y-prism's y range and the y-prism's region crosses the
 * z-prism's z range; the volume is ∫ (z-chord of the y-prism in the z range) × (y-chord of the
 * z-prism in the y range) dx, integrated on strips of `STRIP_MM`.
 */
export function prismOverlap(a: Prism, b: Prism): Overlap | null {
  if (boxesApart(a, b, -CONTACT_MM)) return null;
  if (a.axis === b.axis) {
    const d = Math.min(a.hi, b.hi) - Math.max(a.lo, b.lo);
    if (d <= CONTACT_MM) return null;
    const common = intersectD(a.paths, b.paths, FillRule.NonZero, 6);
    const area = areaPathsD(common);
    if (area <= OVERLAP_AREA_MM2) return null;
    const c = pathsCentroid(common);
    const mid = (Math.max(a.lo, b.lo) + Math.min(a.hi, b.hi)) / 2;
    return { volumeMm3: area * d, where: a.axis === 'z' ? [c[0], c[1], mid] : [c[0], mid, c[1]] };
  }
  const [z, y] = a.axis === 'z' ? [a, b] : [b, a];
  return crossedOverlap(z, y);
}

/** Strip width for crossed prisms (at most MAX_STRIPS strips). mm. */
export const STRIP_MM = 0.1;
const MAX_STRIPS = 200;

function crossedOverlap(z: Prism, y: Prism): Overlap | null {
  const x0 = Math.max(z.min[0], y.min[0]);
  const x1 = Math.min(z.max[0], y.max[0]);
  if (x1 - x0 <= CONTACT_MM) return null;
  // Each region cut to the other's slab (rectangle clips are cheap), then compared at the same x.
  // The y-prism's region is small (side plates, spacers, camera): clip it first and stop when it
  // only touches the z-prism's slab.
  const yc = rectClip({ left: x0, top: z.lo, right: x1, bottom: z.hi }, y.paths, 6);
  if (!yc.length || areaPathsD(yc) <= OVERLAP_AREA_MM2) return null;
  const zc = rectClip({ left: x0, top: y.lo, right: x1, bottom: y.hi }, z.paths, 6);
  if (!zc.length || areaPathsD(zc) <= OVERLAP_AREA_MM2) return null;
  const span = (ps: PathsD): [number, number] => [Math.min(...ps.flatMap((p) => p.map((q) => q.x))), Math.max(...ps.flatMap((p) => p.map((q) => q.x)))];
  const [za, zb] = span(zc);
  const [ya, yb] = span(yc);
  const a = Math.max(za, ya);
  const b = Math.min(zb, yb);
  if (b - a <= CONTACT_MM) return null;
  let vol = 0;
  let sx = 0;
  let sy = 0;
  let sz = 0;
  const n = Math.min(MAX_STRIPS, Math.max(1, Math.ceil((b - a) / STRIP_MM)));
  const h = (b - a) / n;
  for (let k = 0; k < n; k++) {
    const x = a + (k + 0.5) * h;
    const ys = chordWithin(zc, x, y.lo, y.hi);
    const zs = chordWithin(yc, x, z.lo, z.hi);
    const v = ys.length * zs.length * h;
    if (v <= 0) continue;
    vol += v;
    sx += v * x;
    sy += v * ys.mid;
    sz += v * zs.mid;
  }
  if (vol <= OVERLAP_AREA_MM2 * CONTACT_MM * 10) return null;
  return { volumeMm3: vol, where: [sx / vol, sy / vol, sz / vol] };
}

/** Length of the vertical line at x inside the region (even–odd), clipped to [lo, hi], and its mid-point. */
function chordWithin(paths: PathsD, x: number, lo: number, hi: number): { length: number; mid: number } {
  const cuts: number[] = [];
  for (const p of paths) {
    for (let i = 0; i < p.length; i++) {
      const a = p[i];
      const b = p[(i + 1) % p.length];
      if ((a.x <= x) === (b.x <= x)) continue;
      cuts.push(a.y + ((x - a.x) * (b.y - a.y)) / (b.x - a.x));
    }
  }
  cuts.sort((m, n) => m - n);
  let length = 0;
  let moment = 0;
  for (let i = 0; i + 1 < cuts.length; i += 2) {
    const s = Math.max(cuts[i], lo);
    const e = Math.min(cuts[i + 1], hi);
    if (e > s) {
      length += e - s;
      moment += ((e + s) / 2) * (e - s);
    }
  }
  return { length, mid: length > 0 ? moment / length : 0 };
}

/** Area centroid of polygons (signed, so holes subtract). */
export function pathsCentroid(paths: PathsD): Vec2 {
  let a = 0;
  let cx = 0;
  let cy = 0;
  for (const p of paths) {
    for (let i = 0; i < p.length; i++) {
      const u = p[i];
      const v = p[(i + 1) % p.length];
      const cr = u.x * v.y - v.x * u.y;
      a += cr;
      cx += (u.x + v.x) * cr;
      cy += (u.y + v.y) * cr;
    }
  }
  return a === 0 ? [paths[0]?.[0]?.x ?? 0, paths[0]?.[0]?.y ?? 0] : [cx / (3 * a), cy / (3 * a)];
}

