import type { Frame } from '../geometry/frame.js';
import { buildAssembly } from '../assembly/build.js';
import type { Assembly } from '../assembly/types.js';
import type { Vec2 } from '../geometry/types.js';
import { dist } from '../geometry/vec.js';
import { degToRad } from '../params/units.js';
import { discViewMargin, smallestHiding, type CameraPose, type PropDisc } from './camera.js';
import { finding, mm, pt } from './finding.js';
import { propSweepFindings } from './fit.js';
import type { Prism } from './solids.js';
import type { CheckOptions } from './options.js';
import type { Finding } from './types.js';

export const PROP_RULE = 'prop-clearance';
export const CAMERA_RULE = 'camera-view';
/** Part name used for frame-level findings. */
export const FRAME_PART = 'frame';

/** The frame's prop discs: one per motor, in the prop plane (arm top + props.heightAboveArmMm). */
export function propDiscs(frame: Frame): PropDisc[] {
  const z = frame.armTopZMm + frame.design.props.heightAboveArmMm;
  return frame.sites.map((s) => ({ id: s.id, centerMm: s.motorMm, radiusMm: frame.propDiameterMm / 2, zMm: z }));
}

export type TipGap = Readonly<{ a: string; b: string; gapMm: number; atMm: Vec2 }>;

/**
 * Tip gap of every pair of discs: centre distance minus the two radii (exact for any layout), and
 * the point midway between the two nearest tips. Sorted by gap.
 */
export function tipGaps(discs: readonly PropDisc[]): TipGap[] {
  const out: TipGap[] = [];
  for (let i = 0; i < discs.length; i++) {
    for (let j = i + 1; j < discs.length; j++) {
      const A = discs[i];
      const B = discs[j];
      const d = dist(A.centerMm, B.centerMm);
      const gap = d - A.radiusMm - B.radiusMm;
      const k = d === 0 ? 0.5 : (A.radiusMm + gap / 2) / d;
      const at: Vec2 = [A.centerMm[0] + (B.centerMm[0] - A.centerMm[0]) * k, A.centerMm[1] + (B.centerMm[1] - A.centerMm[1]) * k];
      out.push({ a: A.id, b: B.id, gapMm: gap, atMm: at });
    }
  }
  return out.sort((x, y) => x.gapMm - y.gapMm);
}

/**
 * Rule 6: adjacent prop tip gaps against minTipGapMm (error), and every prop's swept band against
 * every solid of the assembled frame (see `propSweepFindings`: an error for anything the band
 * reaches within minPartClearanceMm and for a disc that sweeps between the bottom and top plate, a
 * warning for a plate just above or below the band under the disc). The assembly is built from the
 * frame when not given.
 */
export function propClearanceRule(frame: Frame, o: CheckOptions, discs: readonly PropDisc[], assembly?: Assembly, prisms?: readonly Prism[]): Finding[] {
  const lim = o.limits['prop-clearance'];
  if (!lim.enabled) return [];
  const out: Finding[] = [];
  for (const g of tipGaps(discs)) {
    if (g.gapMm >= o.minTipGapMm) continue;
    out.push(finding(PROP_RULE, 'error', FRAME_PART, g.gapMm, o.minTipGapMm, 'mm', g.atMm,
      `${g.a} and ${g.b} prop tips: gap ${mm(g.gapMm)} is below ${mm(o.minTipGapMm)}; move the two motors ${mm(o.minTipGapMm - g.gapMm)} further apart (a longer wheelbase) or use smaller props`));
  }
  const a = assembly ?? buildAssembly(frame.design, frame);
  out.push(...propSweepFindings(a, o, PROP_RULE, prisms));
  return out;
}

/** The camera pose of a design with a camera, or null. FOVs from `checks.camera-view` when set. */
export function cameraPose(frame: Frame, o: CheckOptions, forwardOffsetMm?: number, uptiltDeg?: number): CameraPose | null {
  const d = frame.design;
  const c = d.camera;
  if (!c) return null;
  const frontX = Math.max(...d.body.standoffs.positionsMm.map((p) => p[0]));
  const v = o.limits['camera-view'];
  return {
    eyeMm: [frontX + (forwardOffsetMm ?? c.forwardOffsetMm), 0, c.pivotHeightMm],
    uptiltRad: degToRad(uptiltDeg ?? c.uptiltDeg),
    hFovRad: degToRad(v.horizontalFovDeg ?? c.horizontalFovDeg),
    vFovRad: degToRad(v.verticalFovDeg ?? c.verticalFovDeg),
  };
}

/** Forward-offset range searched for a prop-free view: the design file's allowed range. mm. */
export const FORWARD_OFFSET_RANGE_MM = [-30, 80] as const;

/**
 * Rule 7: a warning for every prop disc that reaches into the camera view (how far, in the prop
 * plane), and an info with the smallest camera forward offset, and the uptilt nearest the set one
 * within the tilt slot, at which no prop is visible.
 */
export function cameraViewRule(frame: Frame, o: CheckOptions, discs: readonly PropDisc[]): Finding[] {
  const pose = cameraPose(frame, o);
  const c = frame.design.camera;
  if (!pose || !c || !o.limits['camera-view'].enabled) return [];
  const seen = discs.map((disc) => ({ disc, m: discViewMargin(pose, disc) })).filter((x) => x.m <= 0);
  if (seen.length === 0) return [];
  // Positive (the smallest margin) when every disc is hidden, else the margin of the first disc
  // found in view: the search only asks "all hidden?", so it stops at the first visible one.
  const allHidden = (p: CameraPose): number => {
    let least = Infinity;
    for (const d of discs) {
      const m = discViewMargin(p, d);
      if (!(m > 0)) return m;
      least = Math.min(least, m);
    }
    return least;
  };
  const off = smallestHiding((v) => allHidden(cameraPose(frame, o, v)!), FORWARD_OFFSET_RANGE_MM[0], FORWARD_OFFSET_RANGE_MM[1], 0.5);
  const up = smallestHiding((v) => allHidden(cameraPose(frame, o, undefined, v)!), c.uptiltMinDeg, c.uptiltMaxDeg, 0.25);
  const down = smallestHiding((v) => allHidden(cameraPose(frame, o, undefined, -v)!), -c.uptiltMaxDeg, -c.uptiltMinDeg, 0.25);
  const tilts = [up, down === null ? null : -down].filter((x): x is number => x !== null);
  const tilt = tilts.length ? tilts.reduce((a, b) => (Math.abs(a - c.uptiltDeg) <= Math.abs(b - c.uptiltDeg) ? a : b)) : null;
  // One fix for every visible prop: the nearest camera setting that hides them all.
  const fixes = [
    ...(off !== null ? [`move the camera forward to camera.forwardOffsetMm ${(Math.ceil(off * 100) / 100).toFixed(2)} mm (now ${c.forwardOffsetMm} mm)`] : []),
    ...(tilt !== null ? [`set the uptilt to ${tilt.toFixed(2)}° (now ${c.uptiltDeg}°)`] : []),
  ];
  const fix = fixes.length
    ? fixes.join(' or ')
    : `accept props in view or use a narrower lens, since no forward offset up to ${FORWARD_OFFSET_RANGE_MM[1]} mm and no uptilt in the slot's ${c.uptiltMinDeg}–${c.uptiltMaxDeg}° hides them`;
  const where = `camera at x ${mm(pose.eyeMm[0])}, z ${mm(pose.eyeMm[2])}, uptilt ${c.uptiltDeg}°`;
  return seen.map(({ disc, m }) =>
    finding(CAMERA_RULE, 'warning', FRAME_PART, -m, 0, 'mm', disc.centerMm,
      `${disc.id} prop in the camera view (${where}): ${mm(-m)} of its disc lies inside the view in the prop plane, above the limit ${mm(0)}; ${fix}`));
}
