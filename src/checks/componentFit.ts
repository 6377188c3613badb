import { EndType, FillRule, JoinType, areaPathsD, differenceD, inflatePathsD, intersectD, type PathsD } from 'clipper2-ts';
import type { Assembly, Component } from '../assembly/types.js';
import { boxPrism, CONTACT_MM, componentPrisms, prismOverlap, type Prism, OVERLAP_AREA_MM2 } from './solids.js';
import { cameraSweptPrism, signedPathsDistance, BATTERY_FIT_RULE, CAMERA_FIT_RULE, MOTOR_SCREW_RULE, STACK_FIT_RULE } from './fit.js';
import { fitFinding, mm } from './finding.js';
import type { CheckOptions } from './options.js';
import type { Finding } from './types.js';
import type { Vec2 } from '../geometry/types.js';
import { radToDeg } from '../params/units.js';

/** Least distance between two polygon sets (0 when they overlap). mm. */
function pathsGap(a: PathsD, b: PathsD): number {
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
  const body = intersectD(outer(bottom), outer(top), FillRule.NonZero, 6);
  const piles = new Map<number, Component[]>();
  for (const c of a.components) {
    const m = stackMountOf(c);
    if (m !== null) piles.set(m, [...(piles.get(m) ?? []), c]);
  }
  for (const [mount, pile] of [...piles.entries()].sort((x, y) => x[0] - y[0])) {
    const own = (p: Prism) => p.owner !== undefined && p.owner.startsWith(`stack ${mount + 1} `);
    for (const c of pile) {
      const board = componentPrisms(c)[0];
      const outside = areaPathsD(differenceD(board.paths, body, FillRule.NonZero, 6));
      if (outside > OVERLAP_AREA_MM2) {
        const reach = Math.max(...board.paths[0].map((v) => signedPathsDistance(body, [v.x, v.y])));
        const plate = areaPathsD(differenceD(board.paths, outer(bottom), FillRule.NonZero, 6)) > OVERLAP_AREA_MM2 ? 'bottom-plate' : 'top-plate';
        const where = farthestOutside(board.paths, body);
        out.push(fitFinding(STACK_FIT_RULE, 'error', reach, 0, 'mm', [c.id, plate], [where[0], where[1], board.lo],
          `${c.id} (${(board.max[0] - board.min[0]).toFixed(1)} × ${(board.max[1] - board.min[1]).toFixed(1)} mm) reaches ${mm(reach)} past the body footprint (${plate}); use a larger body (body.widthMm, body.lengthMm) or a smaller board`));
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
          `${c.id} is ${gap === 0 ? 'against' : `${mm(gap)} from`} ${s.id}; keep ${mm(lim.sideClearanceMm)}: move the stack (stacks.${mount}) or the ${s.kind}`));
      }
    }
    const pileTop = Math.max(...pile.map((c) => componentPrisms(c)[0].hi), ...prisms.filter((p) => own(p) && p.kind === 'nut').map((p) => p.hi), ...a.joints.filter((j) => j.kind === 'stack' && j.id.startsWith(`stack ${mount + 1} `)).map((j) => j.headAtMm[2] + j.screwLengthMm - (j.headStandard === 'ISO 10642' || j.headStandard === 'ISO 14581' ? j.headHeightMm : 0)));
    const room = a.stackUp.topPlateLowMm - pileTop;
    if (room < lim.topClearanceMm) {
      const need = Math.ceil(pileTop + lim.topClearanceMm - a.stackUp.bottomPlateTopMm - 1e-9);
      const first = pile[0];
      const c = first.boxes[0].centreMm;
      out.push(fitFinding(STACK_FIT_RULE, 'error', room, lim.topClearanceMm, 'mm', [first.id, 'top-plate'], [c[0], c[1], pileTop],
        `the stack on mount ${mount} (${pile.map((p) => p.id).join(', ')}, nuts and screw tips included) tops out at ${mm(pileTop, 1)}, ${room < 0 ? `${mm(-room)} into` : `${mm(room)} under`} the top plate; keep ${mm(lim.topClearanceMm)}: standoffs of ${need} mm would fit (body.standoffs.heightMm is ${a.stackUp.plateGapMm})`));
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
        `${camera.id} is ${mm(width, 1)} wide, ${mm(width - spacing)} more than the ${mm(spacing, 1)} between the camera side plates (tolerance ${mm(lim.fitToleranceMm, 1)}); set camera.widthMm to the camera's width`));
    } else if (spacing - width > lim.looseMm) {
      out.push(fitFinding(CAMERA_FIT_RULE, 'warning', spacing - width, lim.looseMm, 'mm', [camera.id, left.id], [pivot[0], left.bounds.minMm[1], pivot[2]],
        `${camera.id} is ${mm(width, 1)} wide between side plates ${mm(spacing, 1)} apart: ${mm(spacing - width)} of play; shim it with washers or set camera.widthMm to the camera's width`));
    }
  }
  const swept = grow(cameraSweptPrism(camera), lim.clearanceMm);
  const sideIds = new Set(sides.map((p) => p.id));
  for (const s of prisms) {
    if (sideIds.has(s.id) || s.id.startsWith('camera pivot ')) continue;
    if (!prismOverlap(swept, s)) continue;
    const tilt = firstContactTilt(camera, s, lim.clearanceMm);
    const ov = prismOverlap(swept, s)!;
    out.push(fitFinding(CAMERA_FIT_RULE, 'error', tilt === null ? null : radToDeg(tilt), null, 'deg', [camera.id, s.id], ov.where,
      `${camera.id}, turned through its uptilt range (${radToDeg(camera.pivot!.minRad).toFixed(0)}–${radToDeg(camera.pivot!.maxRad).toFixed(0)}°), comes within ${mm(lim.clearanceMm, 1)} of ${s.id}${tilt === null ? '' : ` from ${radToDeg(tilt).toFixed(0)}° uptilt`}; move the camera (camera.forwardOffsetMm, camera.pivotHeightMm) or narrow the tilt range`));
  }
  return out;
}

/** The prism grown by a clearance (region offset, extent along the axis widened). */
function grow(p: Prism, byMm: number): Prism {
  if (byMm <= 0) return p;
  const paths = inflatePathsD(p.paths, byMm, JoinType.Round, EndType.Polygon, 2, 4);
  const min = p.min.map((v) => v - byMm) as unknown as Prism['min'];
  const max = p.max.map((v) => v + byMm) as unknown as Prism['max'];
  return { ...p, paths, lo: p.lo - byMm, hi: p.hi + byMm, min, max };
}

function firstContactTilt(camera: Component, s: Prism, clearanceMm: number): number | null {
  const poses = camera.sweep ?? [];
  const p = camera.pivot!;
  for (let k = 0; k < poses.length; k++) {
    const hit = poses[k].some((b) => prismOverlap(grow(boxPrism(camera.id, b, camera.id), clearanceMm), s));
    if (hit) return p.minRad + ((p.maxRad - p.minRad) * k) / Math.max(1, poses.length - 1);
  }
  return null;
}

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
      out.push(fitFinding(BATTERY_FIT_RULE, 'error', 2 * hx, pair ? spacing - slotWidthMm : null, 'mm', [battery.id, 'top-plate'], where,
        xs.length < 2
          ? `${battery.id} needs two strap slots in the top plate, one each side of it (topPlate.strapSlots.xPositionsMm has ${xs.length})`
          : `${battery.id} is ${mm(2 * hx, 1)} long along x, but the strap slots around it are ${mm(spacing, 1)} apart (${mm(spacing - slotWidthMm, 1)} between them): the strap cannot pass; move the slots (topPlate.strapSlots.xPositionsMm) or turn the battery`));
    } else {
      const spacing = above[0] - below[below.length - 1];
      const need = 2 * spacing + 2 * (2 * hz + (top?.thicknessMm ?? 0)) + lim.strapOverlapMm;
      if (need > st.strapLengthMm) {
        out.push(fitFinding(BATTERY_FIT_RULE, 'error', need, st.strapLengthMm, 'mm', [battery.id, 'top-plate'], where,
          `the strap round ${battery.id} needs ${mm(need, 0)} (2 × ${mm(spacing, 1)} slot spacing, 2 × battery height and plate, ${mm(lim.strapOverlapMm, 0)} overlap), more than its ${mm(st.strapLengthMm, 0)}; use a longer strap or slots closer together`));
      }
    }
  } else {
    const bottom = a.plates.find((p) => p.id === 'bottom-plate');
    const across = Math.max(2 * hy, bottom ? bottom.bounds.maxMm[1] - bottom.bounds.minMm[1] : 0);
    const need = 2 * across + 2 * (2 * hz + (a.stackUp.bottomPlateTopMm - (b.centreMm[2] + hz))) + lim.strapOverlapMm;
    if (need > st.strapLengthMm) {
      out.push(fitFinding(BATTERY_FIT_RULE, 'error', need, st.strapLengthMm, 'mm', [battery.id, 'bottom-plate'], where,
        `the strap round ${battery.id} and the plates needs ${mm(need, 0)}, more than its ${mm(st.strapLengthMm, 0)}; use a longer strap`));
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
        `${j.screw} × ${j.screwLengthMm} mm motor screw through ${mm(j.gripMm, 1)} of arm reaches ${mm(into, 1)} into the motor, ${mm(into - m.threadDepthMm)} past its ${mm(m.threadDepthMm, 1)} thread (motor.threadDepthMm): it would touch the windings; no preferred length fits — use ${mm(into - m.threadDepthMm, 1)} of washers under the head or a ${(j.gripMm + m.threadDepthMm).toFixed(1)} mm screw`));
      break;
    }
  }
  return out;
}
