import { FillRule, areaPathsD, intersectD, rectClip, type PathsD } from 'clipper2-ts';
import type { Assembly, Component } from '../assembly/types.js';
import { CONTACT_MM, componentPrisms, prismOverlap, type Prism, OVERLAP_AREA_MM2 } from './solids.js';
import { cameraPosePrisms, cameraSagittaMm, signedPathsDistance, BATTERY_FIT_RULE, CAMERA_FIT_RULE, MOTOR_SCREW_RULE, STACK_FIT_RULE } from './fit.js';
import { fitFinding, mm } from './finding.js';
import type { CheckOptions } from './options.js';
import type { Finding } from './types.js';
import type { Vec2 } from '../geometry/types.js';
import { radToDeg } from '../params/units.js';

/** Least distance between two polygon sets (0 when they overlap). mm. */
function pathsGap(a: PathsD, b: PathsD): number {
  const box = (ps: PathsD) => ps.flat().reduce((r, q) => [Math.min(r[0], q.x), Math.min(r[1], q.y), Math.max(r[2], q.x), Math.max(r[3], q.y)], [Infinity, Infinity, -Infinity, -Infinity]);
  const [ax0, ay0, ax1, ay1] = box(a);
  const [bx0, by0, bx1, by1] = box(b);
  const boxGap = Math.hypot(Math.max(bx0 - ax1, ax0 - bx1, 0), Math.max(by0 - ay1, ay0 - by1, 0));
  if (boxGap > 0) return boxGap <= PATHS_GAP_EXACT_WITHIN_MM ? exactGap(a, b) : boxGap;
  return exactGap(a, b);
}

/** Beyond this the bounding-box gap is reported as the gap (it is a lower bound, and far above every limit). mm. */
const PATHS_GAP_EXACT_WITHIN_MM = 20;

function exactGap(a: PathsD, b: PathsD): number {
  if (areaPathsD(intersectD(a, b, FillRule.NonZero, 6)) > OVERLAP_AREA_MM2 * 0.01) return 0;
  let d = Infinity;
  for (const [p, q] of [[a, b], [b, a]] as const) for (const path of p) for (const v of path) d = Math.min(d, Math.abs(signedPathsDistance(q, [v.x, v.y])));
  return d;
}

/** Which stack mount a component is piled on, or null. */
export function stackMountOf(c: Component): number | null {
  if (c.stack) return c.stack.mount;
  const m = c.mountedOn.find((x) => x.startsWith('stack mount '));
  return m ? Number(m.slice('stack mount '.length)) : null;
}

/**
 * Boards on a stack mount (rule stack-fit): inside the body footprint (the plan region the bottom and
 * top plate share), clear of standoffs, spacers, heads and nuts by `sideClearanceMm`, and the pile's
 * top (its nuts and screw tips included) `topClearanceMm` under the top plate — otherwise an error
 * that states the standoff length that would fit.
 */
export function stackFitRule(a: Assembly, o: CheckOptions, prisms: readonly Prism[]): Finding[] {
  const lim = o.limits['stack-fit'];
  if (!lim.enabled) return [];
  const out: Finding[] = [];
  const bottom = prisms.find((p) => p.id === 'bottom-plate');
  const top = prisms.find((p) => p.id === 'top-plate');
  if (!bottom || !top) return [];
  const outer = (p: Prism): PathsD => [p.paths[0]];
  // The part of a board outside a plate's outline: the board less its rectangle clip by the outline.
  const outsideOf = (board: Prism, plate: Prism): number => {
    const rect = { left: board.min[0], top: board.min[1], right: board.max[0], bottom: board.max[1] };
    return areaPathsD(board.paths) - areaPathsD(rectClip(rect, outer(plate), 6));
  };
  const piles = new Map<number, Component[]>();
  for (const c of a.components) {
    const m = stackMountOf(c);
    if (m !== null) piles.set(m, [...(piles.get(m) ?? []), c]);
  }
  for (const [mount, pile] of [...piles.entries()].sort((x, y) => x[0] - y[0])) {
    const own = (p: Prism) => p.owner !== undefined && p.owner.startsWith(`stack ${mount + 1} `);
    for (const c of pile) {
      const board = componentPrisms(c)[0];
      const outBottom = outsideOf(board, bottom);
      const outTop = outsideOf(board, top);
      if (Math.max(outBottom, outTop) > OVERLAP_AREA_MM2) {
        const plate = outBottom >= outTop ? bottom : top;
        const reach = Math.max(...board.paths[0].map((v) => signedPathsDistance(outer(plate), [v.x, v.y])));
        const where = farthestOutside(board.paths, outer(plate));
        out.push(fitFinding(STACK_FIT_RULE, 'error', reach, 0, 'mm', [c.id, plate.id], [where[0], where[1], board.lo],
          `${c.id} (${(board.max[0] - board.min[0]).toFixed(1)} × ${(board.max[1] - board.min[1]).toFixed(1)} mm) past the body footprint (${plate.id}): overhang ${mm(reach)} is above ${mm(0)}; use a larger body (body.widthMm, body.lengthMm) or a smaller board`));
      }
      for (const s of prisms) {
        if (own(s) || s.kind === 'plate' || s.kind === 'component' || s.kind === 'motor') continue;
        const dz = Math.min(s.hi, board.hi) - Math.max(s.lo, board.lo);
        if (s.axis !== 'z' || dz <= CONTACT_MM) continue;
        const gap = pathsGap(board.paths, s.paths);
        if (gap >= lim.sideClearanceMm) continue;
        const cx = (Math.max(board.min[0], s.min[0]) + Math.min(board.max[0], s.max[0])) / 2;
        const cy = (Math.max(board.min[1], s.min[1]) + Math.min(board.max[1], s.max[1])) / 2;
        out.push(fitFinding(STACK_FIT_RULE, 'error', gap, lim.sideClearanceMm, 'mm', [c.id, s.id], [cx, cy, (Math.max(s.lo, board.lo) + Math.min(s.hi, board.hi)) / 2],
          `${c.id} and ${s.id}: clearance ${mm(gap)} is below ${mm(lim.sideClearanceMm)}; move the stack (stacks.${mount}) or the ${s.kind}`));
      }
    }
    const pileTop = Math.max(...pile.map((c) => componentPrisms(c)[0].hi), ...prisms.filter((p) => own(p) && p.kind === 'nut').map((p) => p.hi), ...a.joints.filter((j) => j.kind === 'stack' && j.id.startsWith(`stack ${mount + 1} `)).map((j) => j.headAtMm[2] + j.screwLengthMm - (j.headStandard === 'ISO 10642' || j.headStandard === 'ISO 14581' ? j.headHeightMm : 0)));
    const room = a.stackUp.topPlateLowMm - pileTop;
    if (room < lim.topClearanceMm) {
      const need = Math.ceil(pileTop + lim.topClearanceMm - a.stackUp.bottomPlateTopMm - 1e-9);
      const first = pile[0];
      const c = first.boxes[0].centreMm;
      out.push(fitFinding(STACK_FIT_RULE, 'error', room, lim.topClearanceMm, 'mm', [first.id, 'top-plate'], [c[0], c[1], pileTop],
        `the stack on mount ${mount} (${pile.map((p) => p.id).join(', ')}, nuts and screw tips included), top at ${mm(pileTop, 1)}: room under the top plate ${mm(room)} is below ${mm(lim.topClearanceMm)}; use standoffs of ${need} mm (body.standoffs.heightMm is ${a.stackUp.plateGapMm})`));
    }
  }
  return out;
}

function farthestOutside(paths: PathsD, region: PathsD): Vec2 {
  let best = { d: -Infinity, p: [0, 0] as Vec2 };
  for (const v of paths[0]) {
    const d = signedPathsDistance(region, [v.x, v.y]);
    if (d > best.d) best = { d, p: [v.x, v.y] };
  }
  return best.p;
}

/**
 * The camera (rule camera-fit): its body against the side-plate spacing (an error when wider than
 * the spacing plus `fitToleranceMm`, a warning when looser than `looseMm`), and the body and lens
 * swept through the whole tilt range against every solid but the side plates (which hold it):
 * plates, camera spacers, standoffs, screw heads and nuts, boards, battery — an error naming the
 * tilt where they first meet.
 */
export function cameraFitRule(a: Assembly, o: CheckOptions, prisms: readonly Prism[]): Finding[] {
  const lim = o.limits['camera-fit'];
  const camera = a.components.find((c) => c.kind === 'camera');
  if (!lim.enabled || !camera) return [];
  const out: Finding[] = [];
  const sides = a.plates.filter((p) => p.part.role === 'camera-side');
  const left = sides.find((p) => p.placement.translateMm[1] > 0);
  const right = sides.find((p) => p.placement.translateMm[1] <= 0);
  const width = 2 * camera.boxes[0].halfSizeMm[1];
  const pivot = camera.pivot!.atMm;
  if (left && right) {
    const spacing = left.bounds.minMm[1] - right.bounds.maxMm[1];
    if (width > spacing + lim.fitToleranceMm) {
      out.push(fitFinding(CAMERA_FIT_RULE, 'error', width - spacing, lim.fitToleranceMm, 'mm', [camera.id, left.id], [pivot[0], left.bounds.minMm[1], pivot[2]],
        `${camera.id} (${mm(width, 1)} wide) between the camera side plates ${mm(spacing, 1)} apart: excess width ${mm(width - spacing)} is above the tolerance ${mm(lim.fitToleranceMm)}; set camera.widthMm to the camera's width`));
    } else if (spacing - width > lim.looseMm) {
      out.push(fitFinding(CAMERA_FIT_RULE, 'warning', spacing - width, lim.looseMm, 'mm', [camera.id, left.id], [pivot[0], left.bounds.minMm[1], pivot[2]],
        `${camera.id} (${mm(width, 1)} wide) between side plates ${mm(spacing, 1)} apart: play ${mm(spacing - width)} is above ${mm(lim.looseMm)}; shim it with washers or set camera.widthMm to the camera's width`));
    }
  }
  const margin = lim.clearanceMm + cameraSagittaMm(camera);
  const poses = cameraPosePrisms(camera, margin);
  const all = envelope(poses);
  const perPose = camera.boxes.length;
  const sideIds = new Set(sides.map((p) => p.id));
  for (const s of prisms) {
    if (sideIds.has(s.id) || s.id.startsWith('camera pivot ') || !boxesMeet(all, s)) continue;
    for (let k = 0; k < poses.length; k++) {
      const ov = prismOverlap(poses[k], s);
      if (!ov) continue;
      const p = camera.pivot!;
      const n = Math.max(1, poses.length / perPose - 1);
      const tilt = p.minRad + ((p.maxRad - p.minRad) * Math.floor(k / perPose)) / n;
      out.push(fitFinding(CAMERA_FIT_RULE, 'error', radToDeg(tilt), radToDeg(p.maxRad), 'deg', [camera.id, s.id], ov.where,
        `${camera.id}, turned through its uptilt range (${radToDeg(p.minRad).toFixed(0)}–${radToDeg(p.maxRad).toFixed(0)}°), comes within ${mm(lim.clearanceMm, 1)} of ${s.id}: contact from ${radToDeg(tilt).toFixed(2)}° uptilt, below the range's top ${radToDeg(p.maxRad).toFixed(2)}°; narrow the tilt range below ${radToDeg(tilt).toFixed(1)}° or move the camera (camera.forwardOffsetMm, camera.pivotHeightMm)`));
      break;
    }
  }
  return out;
}

/** The bounds of several prisms (for a first, cheap test). */
function envelope(ps: readonly Prism[]): Pick<Prism, 'min' | 'max'> {
  const min = [0, 1, 2].map((i) => Math.min(...ps.map((p) => p.min[i]))) as unknown as Prism['min'];
  const max = [0, 1, 2].map((i) => Math.max(...ps.map((p) => p.max[i]))) as unknown as Prism['max'];
  return { min, max };
}

const boxesMeet = (a: Pick<Prism, 'min' | 'max'>, b: Pick<Prism, 'min' | 'max'>): boolean => [0, 1, 2].every((i) => a.min[i] <= b.max[i] && b.min[i] <= a.max[i]);

/**
 * The battery's straps (rule battery-fit). On the top plate a strap runs down one strap slot, under
 * the plate, up the next slot and over the battery: the battery's length along x must fit between
 * two neighbouring slots (spacing less one slot width) and the strap must be long enough for
 * 2 × spacing + 2 × (battery height + plate thickness) + the hook-and-loop overlap. Under the frame
 * a strap goes round the battery and the plates across the frame.
 */
export function batteryFitRule(a: Assembly, o: CheckOptions, slotWidthMm: number): Finding[] {
  const lim = o.limits['battery-fit'];
  const battery = a.components.find((c) => c.kind === 'battery');
  if (!lim.enabled || !battery?.straps) return [];
  const b = battery.boxes[0];
  const [hx, hy, hz] = b.halfSizeMm;
  const st = battery.straps;
  const top = a.plates.find((p) => p.id === 'top-plate');
  const out: Finding[] = [];
  const where: [number, number, number] = [b.centreMm[0], b.centreMm[1], b.centreMm[2] - hz];
  if (st.side === 'top') {
    const xs = [...st.slotsXMm].sort((p, q) => p - q);
    const x0 = b.centreMm[0] - hx;
    const x1 = b.centreMm[0] + hx;
    const below = xs.filter((x) => x + slotWidthMm / 2 <= x0 + 1e-9);
    const above = xs.filter((x) => x - slotWidthMm / 2 >= x1 - 1e-9);
    if (!below.length || !above.length) {
      const pair = nearestPair(xs, b.centreMm[0]);
      const spacing = pair ? pair[1] - pair[0] : 0;
      out.push(fitFinding(BATTERY_FIT_RULE, 'error', xs.length < 2 ? xs.length : 2 * hx, xs.length < 2 ? 2 : spacing - slotWidthMm, xs.length < 2 ? 'slots' : 'mm', [battery.id, 'top-plate'], where,
        xs.length < 2
          ? `${battery.id} on the top plate: strap slots ${xs.length.toFixed(2)} are below the ${(2).toFixed(2)} it needs, one each side; add slots (topPlate.strapSlots.xPositionsMm)`
          : `${battery.id} between the strap slots ${mm(spacing, 1)} apart: battery length ${mm(2 * hx)} is above the ${mm(spacing - slotWidthMm)} between them, so the strap cannot pass; move the slots (topPlate.strapSlots.xPositionsMm) or turn the battery`));
    } else {
      const spacing = above[0] - below[below.length - 1];
      const need = 2 * spacing + 2 * (2 * hz + (top?.thicknessMm ?? 0)) + lim.strapOverlapMm;
      if (need > st.strapLengthMm) {
        out.push(fitFinding(BATTERY_FIT_RULE, 'error', need, st.strapLengthMm, 'mm', [battery.id, 'top-plate'], where,
          `the strap round ${battery.id} (2 × ${mm(spacing, 1)} slot spacing, 2 × battery height and plate, ${mm(lim.strapOverlapMm, 0)} overlap): needed length ${mm(need)} is above its ${mm(st.strapLengthMm)}; use a longer strap or move the slots closer together`));
      }
    }
  } else {
    const bottom = a.plates.find((p) => p.id === 'bottom-plate');
    const across = Math.max(2 * hy, bottom ? bottom.bounds.maxMm[1] - bottom.bounds.minMm[1] : 0);
    const need = 2 * across + 2 * (2 * hz + (a.stackUp.bottomPlateTopMm - (b.centreMm[2] + hz))) + lim.strapOverlapMm;
    if (need > st.strapLengthMm) {
      out.push(fitFinding(BATTERY_FIT_RULE, 'error', need, st.strapLengthMm, 'mm', [battery.id, 'bottom-plate'], where,
        `the strap round ${battery.id} and the plates: needed length ${mm(need)} is above its ${mm(st.strapLengthMm)}; use a longer strap`));
    }
  }
  return out;
}

function nearestPair(xs: readonly number[], x: number): [number, number] | null {
  let best: [number, number] | null = null;
  for (let i = 0; i + 1 < xs.length; i++) {
    const mid = (xs[i] + xs[i + 1]) / 2;
    if (!best || Math.abs(mid - x) < Math.abs((best[0] + best[1]) / 2 - x)) best = [xs[i], xs[i + 1]];
  }
  return best;
}

/**
 * Motor screws (rule motor-screw): the screw from the hardware list, less the plate it passes, must
 * end inside the motor's thread depth; further on it reaches the windings.
 */
export function motorScrewRule(a: Assembly, o: CheckOptions): Finding[] {
  if (!o.limits['motor-screw'].enabled) return [];
  const out: Finding[] = [];
  for (const m of a.motors) {
    const joints = a.joints.filter((j) => j.kind === 'motor' && j.id.startsWith(`motor ${m.site} `));
    for (const j of joints) {
      const into = j.screwLengthMm - j.gripMm;
      if (into <= m.threadDepthMm + 1e-9) continue;
      const tip: [number, number, number] = [j.planMm[0], j.planMm[1], j.headAtMm[2] + j.screwLengthMm];
      out.push(fitFinding(MOTOR_SCREW_RULE, 'error', into, m.threadDepthMm, 'mm', [j.id, `motor ${m.site}`], tip,
        `${j.screw} × ${j.screwLengthMm} mm motor screw through ${mm(j.gripMm, 1)} of arm (no preferred length fits): depth into the motor ${mm(into)} is above its ${mm(m.threadDepthMm)} thread (motor.threadDepthMm), so it would touch the windings; use ${mm(into - m.threadDepthMm, 1)} of washers under the head or a ${(j.gripMm + m.threadDepthMm).toFixed(1)} mm screw`));
      break;
    }
  }
  return out;
}
