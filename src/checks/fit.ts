import { FillRule, areaD, differenceD, intersectD, rectClip, type PathD, type PathsD } from 'clipper2-ts';
import type { Assembly, Component, Prop } from '../assembly/types.js';
import { distanceToLoop, windingNumber } from '../geometry/inside.js';
import { convexHull } from '../geometry/primitives.js';
import type { Loop, Vec2 } from '../geometry/types.js';
import { fitFinding, mm } from './finding.js';
import type { CheckOptions } from './options.js';
import { CONTACT_MM, assemblyPrisms, boxPrism, prismOverlap, type Prism } from './solids.js';
import type { Finding } from './types.js';

export const INTERFERENCE_RULE = 'interference';
export const STACK_FIT_RULE = 'stack-fit';
export const CAMERA_FIT_RULE = 'camera-fit';
export const BATTERY_FIT_RULE = 'battery-fit';
export const MOTOR_SCREW_RULE = 'motor-screw';

/** What to change when two solids meet, by what they are. */
function advice(p: Prism, q: Prism): string {
  const ids = [p.id, q.id];
  if (ids.every((id) => id.startsWith('arm') || id.startsWith('brace'))) return 'lengthen arms.root.reachMm, narrow the root or enlarge the wheelbase, as the arm roots or braces overlap';
  const kinds = [p.kind, q.kind].sort().join('/');
  if (kinds === 'head/plate') return 'use countersunk screws there (countersunk holes) or move the hole clear of the plate';
  if (kinds === 'plate/standoff' || kinds === 'nut/standoff' || kinds === 'head/standoff') return 'move the standoff (body.standoffs.positionsMm) or the part it meets';
  if (kinds.includes('component')) return 'move or resize the component (components), or make room for it';
  return 'move one of them or change its size';
}

/**
 * Solids of the assembled frame that intersect beyond their contact faces (faces that touch are
 * intended contact): plate against plate (arm against arm, brace against brace), plates against
 * standoffs, screw heads and nuts against plates and parts, boards and battery against all of
 * them. One error per pair, with the overlap volume and a point inside it.
 */
export function interferenceRule(a: Assembly, o: CheckOptions, prisms: readonly Prism[] = assemblyPrisms(a)): Finding[] {
  if (!o.limits.interference.enabled) return [];
  const out: Finding[] = [];
  for (let i = 0; i < prisms.length; i++) {
    for (let j = i + 1; j < prisms.length; j++) {
      const p = prisms[i];
      const q = prisms[j];
      if (p.owner !== undefined && p.owner === q.owner) continue;
      const ov = prismOverlap(p, q);
      if (!ov) continue;
      out.push(fitFinding(INTERFERENCE_RULE, 'error', ov.volumeMm3, 0, 'mm³', [p.id, q.id], ov.where,
        `${p.id} and ${q.id} intersect near ${pt3(ov.where)}: overlap ${ov.volumeMm3.toFixed(2)} mm³ is above the limit 0.00 mm³; ${advice(p, q)}`));
    }
  }
  return out;
}

/** Least overhang area that is reported: ten times what flattening arcs at FIT_CHORD_MM can leave. mm². */
const ROOT_OVERHANG_MM2 = 1;

/**
 * Separate arms: the clamped root (the arm's material under the heads of its root screws and
 * between them) must lie on the bottom plate, or the clamp bears on nothing there. The clamp zone is
 * the convex hull of the root screws' head footprints, cut to the arm's outline; what of it lies
 * outside the bottom plate's outline is an error, with its area and a point in it.
 */
export function armRootFootprintRule(a: Assembly, o: CheckOptions, prisms: readonly Prism[]): Finding[] {
  if (!o.limits.interference.enabled) return [];
  const byId = new Map(prisms.map((p) => [p.id, p]));
  const body = prisms.find((p) => p.kind === 'plate' && p.id === 'bottom-plate');
  if (!body) return [];
  const roots = new Map<string, typeof a.joints[number][]>();
  for (const j of a.joints) {
    if (j.kind !== 'arm-root') continue;
    for (const id of j.clamps) if (byId.get(id)?.kind === 'plate' && id.startsWith('arm ')) roots.set(id, [...(roots.get(id) ?? []), j]);
  }
  const out: Finding[] = [];
  for (const [armId, joints] of roots) {
    const ring: Vec2[] = joints.flatMap((j) => Array.from({ length: 32 }, (_, k): Vec2 => [j.planMm[0] + j.headRadiusMm * Math.cos((k * Math.PI) / 16), j.planMm[1] + j.headRadiusMm * Math.sin((k * Math.PI) / 16)]));
    const hull: PathD = convexHull(ring).map(([x, y]) => ({ x, y }));
    const clamped = intersectD([hull], byId.get(armId)!.paths, FillRule.NonZero);
    const outside = differenceD(clamped, body.paths, FillRule.NonZero);
    const area = outside.reduce((s, path) => s + Math.abs(areaD(path)), 0);
    if (!(area > ROOT_OVERHANG_MM2)) continue;
    const worst = outside.reduce((x, y) => (Math.abs(areaD(y)) > Math.abs(areaD(x)) ? y : x));
    const at: [number, number, number] = [worst.reduce((s, q) => s + q.x, 0) / worst.length, worst.reduce((s, q) => s + q.y, 0) / worst.length, body.hi];
    out.push(fitFinding(INTERFERENCE_RULE, 'error', area, 0, 'mm²', [armId, body.id], at,
      `${armId} root: ${area.toFixed(2)} mm² of its clamped root lies outside the bottom plate near ${pt3(at)} (limit ${ROOT_OVERHANG_MM2.toFixed(2)} mm²); enlarge the body's arm pads or move the root screws inward (arms.root)`));
  }
  return out;
}

const pt3 = (p: readonly number[]): string => `(${p.map((v) => v.toFixed(1)).join(', ')}) mm`;

/** Signed plan distance from a point to a region of loops (negative inside; holes are outside). mm. */
export function signedRegionDistance(loops: readonly Loop[], p: Vec2): number {
  let d = Infinity;
  let w = 0;
  for (const l of loops) {
    d = Math.min(d, distanceToLoop(l, p));
    w += windingNumber(l, p);
  }
  return w !== 0 ? -d : d;
}

/** Signed distance from a point to flattened polygons (even–odd inside test). mm. */
export function signedPathsDistance(paths: PathsD, p: Vec2): number {
  let d = Infinity;
  let inside = false;
  for (const path of paths) {
    for (let i = 0; i < path.length; i++) {
      const a = path[i];
      const b = path[(i + 1) % path.length];
      if ((a.y > p[1]) !== (b.y > p[1]) && p[0] < a.x + ((p[1] - a.y) * (b.x - a.x)) / (b.y - a.y)) inside = !inside;
      const ex = b.x - a.x;
      const ey = b.y - a.y;
      const l2 = ex * ex + ey * ey;
      const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a.x) * ex + (p[1] - a.y) * ey) / l2));
      d = Math.min(d, Math.hypot(a.x + t * ex - p[0], a.y + t * ey - p[1]));
    }
  }
  return inside ? -d : d;
}

/** The plan footprint of a y-prism within heights [lo, hi]: rectangles over the x ranges its region covers there. */
function yPrismPlanFootprint(s: Prism, lo: number, hi: number): PathsD {
  const clipped = rectClip({ left: s.min[0] - 1, top: lo, right: s.max[0] + 1, bottom: hi }, s.paths, 6);
  return clipped.map((path) => {
    const xs = path.map((q) => q.x);
    const x0 = Math.min(...xs);
    const x1 = Math.max(...xs);
    return [{ x: x0, y: s.lo }, { x: x1, y: s.lo }, { x: x1, y: s.hi }, { x: x0, y: s.hi }];
  });
}

/** Heights of a prop's swept band. mm. */
const band = (p: Prop): [number, number] => [p.centreMm[2] - p.bandMm / 2, p.centreMm[2] + p.bandMm / 2];

/**
 * Prop discs against every solid (rule prop-clearance): for each prop, its swept band (props.bandMm
 * thick about the prop plane) against every solid the band's heights reach — an error when the plan
 * gap is below minPartClearanceMm; the plate sandwich (bottom and top plate above and below the band)
 * — an error when the disc reaches between them; a plate just above or below the band that lies
 * under the disc — a warning. The prop's own motor is its hub, not an obstacle.
 */
export function propSweepFindings(a: Assembly, o: CheckOptions, rule: string, prisms: readonly Prism[] = assemblyPrisms(a)): Finding[] {
  const lim = o.limits['prop-clearance'];
  const out: Finding[] = [];
  const camera = a.components.find((c) => c.kind === 'camera');
  const obstacles = prisms;
  const bottom = prisms.find((p) => p.id === 'bottom-plate');
  const top = prisms.find((p) => p.id === 'top-plate');
  const sandwich = bottom && top ? intersectD([bottom.paths[0]], [top.paths[0]], FillRule.NonZero, 6) : [];
  for (const prop of a.props) {
    const [zLo, zHi] = band(prop);
    const c: Vec2 = [prop.centreMm[0], prop.centreMm[1]];
    const R = prop.diameterMm / 2;
    const name = `prop ${prop.site}`;
    for (const s of obstacles) {
      if (s.owner === prop.site || (s.kind === 'head' && s.id.startsWith(`motor ${prop.site} `))) continue;
      // Nothing within reach in plan: neither an error nor a plate under the disc.
      if (planBoxGap(c, R, s) >= Math.max(lim.minPartClearanceMm, 0) + 1e-9) continue;
      const lo = s.axis === 'z' ? s.lo : s.min[2];
      const hi = s.axis === 'z' ? s.hi : s.max[2];
      const dz = Math.min(hi, zHi) - Math.max(lo, zLo);
      if (dz > CONTACT_MM) {
        const gap = s.axis === 'z' ? materialDistance(s, c) - R : signedPathsDistance(yPrismPlanFootprint(s, zLo, zHi), c) - R;
        if (gap < lim.minPartClearanceMm) {
          const where = towards(c, R, s);
          out.push(fitFinding(rule, 'error', gap, lim.minPartClearanceMm, 'mm', [name, s.id], [where[0], where[1], prop.centreMm[2]],
            `${name} disc and ${s.id} within its swept band (${zLo.toFixed(1)}–${zHi.toFixed(1)} mm high): clearance ${mm(gap)} is below ${mm(lim.minPartClearanceMm)}${gap < 0 ? ' (they overlap)' : ''}; lengthen the arms, use smaller props or move ${s.id}`));
        }
        continue;
      }
      if (s.kind !== 'plate' || s.axis !== 'z') continue;
      const gapZ = lo >= zHi ? lo - zHi : zLo - hi;
      const reach = -(materialDistance(s, c) - R);
      if (reach > 0 && gapZ < lim.maxVerticalGapMm && !(bottom && top && (s === bottom || s === top) && between(bottom, top, zLo, zHi))) {
        const where = towards(c, R, s);
        out.push(fitFinding(rule, 'warning', -reach, 0, 'mm', [name, s.id], [where[0], where[1], prop.centreMm[2]],
          `${name} disc over ${s.id} in plan, ${mm(gapZ, 1)} ${lo >= zHi ? 'above' : 'below'} its swept band: plan clearance ${mm(-reach)} is below ${mm(0)}; trim ${s.id} by ${mm(reach)} there or lengthen the arms, as prop flex or a bent arm may strike it`));
      }
    }
    if (bottom && top && between(bottom, top, zLo, zHi)) {
      const gap = signedPathsDistance(sandwich, c) - R;
      if (gap < lim.minPartClearanceMm) {
        const where = towards(c, R, bottom);
        out.push(fitFinding(rule, 'error', gap, lim.minPartClearanceMm, 'mm', [name, 'bottom-plate'], [where[0], where[1], prop.centreMm[2]],
          `${name} disc and the space between the bottom and top plates (where the stack and wiring are): clearance ${mm(gap)} is below ${mm(lim.minPartClearanceMm)}${gap < 0 ? ' (it sweeps into it)' : ''}; lengthen the arms or use smaller props`));
      }
    }
    if (camera) out.push(...cameraVsProp(camera, prop, c, R, lim.minPartClearanceMm, rule));
    for (const c2 of a.components.filter((k) => k.kind === 'antenna')) out.push(...antennaVsProp(c2, prop, lim.minPartClearanceMm, rule));
  }
  return out;
}

/** Plan gap between the disc's bounding square and the prism's bounds (a lower bound of the true gap). mm. */
function planBoxGap(c: Vec2, R: number, s: Prism): number {
  const dx = Math.max(s.min[0] - (c[0] + R), c[0] - R - s.max[0], 0);
  const dy = Math.max(s.min[1] - (c[1] + R), c[1] - R - s.max[1], 0);
  return Math.hypot(dx, dy);
}

/**
 * Signed plan distance from a point to a z-prism's material: from outside the outline the outline
 * is the nearest material (holes lie inside it), so only inside does every loop count.
 */
function materialDistance(s: Prism, c: Vec2): number {
  const outline = s.loops[0];
  if (windingNumber(outline, c) === 0) return distanceToLoop(outline, c);
  return signedRegionDistance(s.loops, c);
}

const between = (bottom: Prism, top: Prism, zLo: number, zHi: number): boolean => bottom.hi <= zLo + CONTACT_MM && top.lo >= zHi - CONTACT_MM;

/** The point on the disc edge in the direction of the solid's centre (a marker position). */
function towards(c: Vec2, R: number, s: Prism): Vec2 {
  const tx = (s.min[0] + s.max[0]) / 2 - c[0];
  const ty = (s.min[1] + s.max[1]) / 2 - c[1];
  const l = Math.hypot(tx, ty) || 1;
  return [c[0] + (R * tx) / l, c[1] + (R * ty) / l];
}

/** The camera swept through its tilt range against a prop's band: the least plan gap over the sampled poses, less the sweep's sagitta. */
function cameraVsProp(camera: Component, prop: Prop, c: Vec2, R: number, minMm: number, rule: string): Finding[] {
  const [zLo, zHi] = band(prop);
  let worst: { gap: number; pose: Prism } | null = null;
  const poses = cameraPosePrisms(camera);
  const reach = { min: [Math.min(...poses.map((p) => p.min[0])), Math.min(...poses.map((p) => p.min[1])), 0], max: [Math.max(...poses.map((p) => p.max[0])), Math.max(...poses.map((p) => p.max[1])), 0] } as unknown as Prism;
  if (planBoxGap(c, R, reach) > minMm + 1) return [];
  for (const pose of poses) {
    if (Math.min(pose.max[2], zHi) - Math.max(pose.min[2], zLo) <= CONTACT_MM || planBoxGap(c, R, pose) > minMm + 1) continue;
    const footprint = yPrismPlanFootprint(pose, zLo, zHi);
    if (!footprint.length) continue;
    const gap = signedPathsDistance(footprint, c) - R - cameraSagittaMm(camera);
    if (!worst || gap < worst.gap) worst = { gap, pose };
  }
  if (!worst || worst.gap >= minMm) return [];
  const name = `prop ${prop.site}`;
  const where = towards(c, R, worst.pose);
  return [fitFinding(rule, 'error', worst.gap, minMm, 'mm', [name, camera.id], [where[0], where[1], prop.centreMm[2]],
    `${name} disc and ${camera.id} somewhere in its tilt range: clearance ${mm(worst.gap)} is below ${mm(minMm)}${worst.gap < 0 ? ' (they overlap)' : ''}; move the camera back (camera.forwardOffsetMm) or lengthen the arms`)];
}

/** An antenna (a rod of its diameter) against a prop's band: plan distance of the rod's piece inside the band heights. */
function antennaVsProp(ant: Component, prop: Prop, minMm: number, rule: string): Finding[] {
  const b = ant.boxes[0];
  const f = b.axes[0];
  const h = b.halfSizeMm[0];
  const r = b.halfSizeMm[1];
  const p0 = [b.centreMm[0] - f[0] * h, b.centreMm[1] - f[1] * h, b.centreMm[2] - f[2] * h];
  const [zLo, zHi] = band(prop);
  // The rod's parameter range whose centre line lies within the band heights widened by its radius.
  let t0 = 0;
  let t1 = 2 * h;
  if (Math.abs(f[2]) > 1e-12) {
    const ta = (zLo - r - p0[2]) / f[2];
    const tb = (zHi + r - p0[2]) / f[2];
    t0 = Math.max(t0, Math.min(ta, tb));
    t1 = Math.min(t1, Math.max(ta, tb));
  } else if (p0[2] < zLo - r || p0[2] > zHi + r) return [];
  if (t1 < t0) return [];
  const a: Vec2 = [p0[0] + f[0] * t0, p0[1] + f[1] * t0];
  const e: Vec2 = [p0[0] + f[0] * t1, p0[1] + f[1] * t1];
  const c: Vec2 = [prop.centreMm[0], prop.centreMm[1]];
  const ex = e[0] - a[0];
  const ey = e[1] - a[1];
  const l2 = ex * ex + ey * ey;
  const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((c[0] - a[0]) * ex + (c[1] - a[1]) * ey) / l2));
  const q: Vec2 = [a[0] + t * ex, a[1] + t * ey];
  const gap = Math.hypot(q[0] - c[0], q[1] - c[1]) - r - prop.diameterMm / 2;
  if (gap >= minMm) return [];
  return [fitFinding(rule, 'error', gap, minMm, 'mm', [`prop ${prop.site}`, ant.id], [q[0], q[1], prop.centreMm[2]],
    `prop ${prop.site} disc and ${ant.id}: clearance ${mm(gap)} is below ${mm(minMm)}${gap < 0 ? ' (it crosses it)' : ''}; turn or shorten the antenna (${ant.sourcePath})`)];
}

const poseCache = new WeakMap<Component, Map<number, readonly Prism[]>>();

/**
 * The camera's body and lens at every sampled uptilt, as y-prisms (per pose its boxes in order),
 * min to max tilt, each box grown by `growMm` on every side (a box grown square-cornered: at least
 * `growMm` of clearance everywhere).
 */
export function cameraPosePrisms(camera: Component, growMm = 0): readonly Prism[] {
  const byGrow = poseCache.get(camera) ?? new Map<number, readonly Prism[]>();
  poseCache.set(camera, byGrow);
  const hit = byGrow.get(growMm);
  if (hit) return hit;
  const poses = (camera.sweep ?? [camera.boxes]).flatMap((boxes) =>
    boxes.map((b) => boxPrism(camera.id, { ...b, halfSizeMm: [b.halfSizeMm[0] + growMm, b.halfSizeMm[1] + growMm, b.halfSizeMm[2] + growMm] }, camera.id, 'y')),
  );
  byGrow.set(growMm, poses);
  return poses;
}

/** How far the swept camera strays outside its sampled poses: r (1 − cos(step / 2)) at its farthest corner. mm. */
export function cameraSagittaMm(camera: Component): number {
  const p = camera.pivot;
  const n = camera.sweep?.length ?? 1;
  if (!p || n < 2) return 0;
  const step = (p.maxRad - p.minRad) / (n - 1);
  let r = 0;
  for (const b of camera.boxes) {
    // Triangle inequality: centre distance plus half the diagonal bounds every corner.
    r = Math.max(r, Math.hypot(b.centreMm[0] - p.atMm[0], b.centreMm[2] - p.atMm[2]) + Math.hypot(b.halfSizeMm[0], b.halfSizeMm[2]));
  }
  return r * (1 - Math.cos(step / 2));
}
