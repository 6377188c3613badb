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

/** Camera settings a fix may change; unset ones keep the design's values. */
export type CameraChange = Partial<Readonly<{ forwardOffsetMm: number; uptiltDeg: number; pivotHeightMm: number; horizontalFovDeg: number; verticalFovDeg: number }>>;

/** The camera pose of a design with a camera, or null. FOVs from `checks.camera-view` when set; `change` overrides. */
export function cameraPose(frame: Frame, o: CheckOptions, change: CameraChange = {}): CameraPose | null {
  const d = frame.design;
  const c = d.camera;
  if (!c) return null;
  const frontX = Math.max(...d.body.standoffs.positionsMm.map((p) => p[0]));
  const v = o.limits['camera-view'];
  return {
    eyeMm: [frontX + (change.forwardOffsetMm ?? c.forwardOffsetMm), 0, change.pivotHeightMm ?? c.pivotHeightMm],
    uptiltRad: degToRad(change.uptiltDeg ?? c.uptiltDeg),
    hFovRad: degToRad(change.horizontalFovDeg ?? v.horizontalFovDeg ?? c.horizontalFovDeg),
    vFovRad: degToRad(change.verticalFovDeg ?? v.verticalFovDeg ?? c.verticalFovDeg),
  };
}

/** Forward-offset range searched for a prop-free view: the design file's allowed range. mm. */
export const FORWARD_OFFSET_RANGE_MM = [-30, 80] as const;
/** Pivot heights searched: the design file's allowed range of camera.pivotHeightMm. mm. */
export const PIVOT_HEIGHT_RANGE_MM = [3, 80] as const;
/** Narrowest fields of view the design file allows (camera.horizontalFovDeg, camera.verticalFovDeg). deg. */
const MIN_HFOV_DEG = 30;
const MIN_VFOV_DEG = 20;

/** One way to hide every prop: the settings to change, how to say it, and its size as a fraction of the parameter's allowed range. */
export type CameraFix = Readonly<{ change: CameraChange; text: string; fraction: number }>;

const r2 = (x: number): string => x.toFixed(2);

/**
 * The nearest value of one setting, from `now` towards either end of [lo, hi], at which `clear(v)`
 * holds, rounded to 0.01 away from `now` and then stepped on by 0.01 until it still clears (the
 * advice is checked at the value printed). Null when no value in the range clears.
 */
export function nearestClearing(clear: (v: number) => number, now: number, lo: number, hi: number, step: number): number | null {
  const up = now < hi ? smallestHiding(clear, now, hi, step) : null;
  const dn = now > lo ? smallestHiding((v) => clear(-v), -now, -lo, step) : null;
  const candidates = [up, dn === null ? null : -dn].filter((x): x is number => x !== null);
  if (!candidates.length) return null;
  const best = candidates.reduce((a, b) => (Math.abs(a - now) <= Math.abs(b - now) ? a : b));
  const dir = best >= now ? 1 : -1;
  let v = dir > 0 ? Math.ceil(best * 100 - 1e-6) / 100 : Math.floor(best * 100 + 1e-6) / 100;
  for (let k = 0; k < 100 && clear(v) <= 0; k++) v += dir * 0.01;
  return Math.min(hi, Math.max(lo, Math.round(v * 100) / 100));
}

/**
 * Every single change that hides all props, smallest first (the change as a fraction of that
 * setting's allowed range in the design file, so degrees and millimetres compare): the uptilt within
 * the tilt slot, the forward offset, the pivot height, and a lens of longer focal length (both fields
 * of view narrowed together: tan(FOV/2) scales by f/f′ for the same sensor).
 */
export function cameraFixes(frame: Frame, o: CheckOptions, discs: readonly PropDisc[]): CameraFix[] {
  const c = frame.design.camera;
  if (!c) return [];
  // The searches only ask "all hidden?" (the sign), so a pose stops at the first disc in view.
  const hiddenMargin = (ch: CameraChange): number => {
    const pose = cameraPose(frame, o, ch)!;
    let least = Infinity;
    for (const d of discs) {
      const m = discViewMargin(pose, d);
      if (!(m > 0)) return m;
      least = Math.min(least, m);
    }
    return least;
  };
  const out: CameraFix[] = [];
  const tilt = nearestClearing((v) => hiddenMargin({ uptiltDeg: v }), c.uptiltDeg, c.uptiltMinDeg, c.uptiltMaxDeg, 0.25);
  if (tilt !== null) {
    const d = tilt - c.uptiltDeg;
    out.push({ change: { uptiltDeg: tilt }, fraction: Math.abs(d) / 100, text: `camera.uptiltDeg ${r2(tilt)}° (now ${c.uptiltDeg}°, ${r2(Math.abs(d))}° ${d < 0 ? 'less' : 'more'} uptilt)` });
  }
  const off = nearestClearing((v) => hiddenMargin({ forwardOffsetMm: v }), c.forwardOffsetMm, FORWARD_OFFSET_RANGE_MM[0], FORWARD_OFFSET_RANGE_MM[1], 0.5);
  if (off !== null) {
    const d = off - c.forwardOffsetMm;
    out.push({ change: { forwardOffsetMm: off }, fraction: Math.abs(d) / (FORWARD_OFFSET_RANGE_MM[1] - FORWARD_OFFSET_RANGE_MM[0]), text: `camera.forwardOffsetMm ${r2(off)} mm (now ${c.forwardOffsetMm} mm, ${r2(Math.abs(d))} mm ${d > 0 ? 'forward' : 'back'})` });
  }
  const h = nearestClearing((v) => hiddenMargin({ pivotHeightMm: v }), c.pivotHeightMm, PIVOT_HEIGHT_RANGE_MM[0], PIVOT_HEIGHT_RANGE_MM[1], 0.5);
  if (h !== null) {
    const d = h - c.pivotHeightMm;
    out.push({ change: { pivotHeightMm: h }, fraction: Math.abs(d) / (PIVOT_HEIGHT_RANGE_MM[1] - PIVOT_HEIGHT_RANGE_MM[0]), text: `camera.pivotHeightMm ${r2(h)} mm (now ${c.pivotHeightMm} mm, mounted ${r2(Math.abs(d))} mm ${d > 0 ? 'higher' : 'lower'})` });
  }
  const v = o.limits['camera-view'];
  const hNow = v.horizontalFovDeg ?? c.horizontalFovDeg;
  const vNow = v.verticalFovDeg ?? c.verticalFovDeg;
  const fovPath = v.horizontalFovDeg !== undefined ? 'checks.camera-view' : 'camera';
  // A lens of focal length f/k: both half-angles' tangents scale by k (pinhole, same sensor).
  const lens = (k: number): CameraChange => ({ horizontalFovDeg: (2 * Math.atan(k * Math.tan(degToRad(hNow) / 2)) * 180) / Math.PI, verticalFovDeg: (2 * Math.atan(k * Math.tan(degToRad(vNow) / 2)) * 180) / Math.PI });
  // The narrowest lens keeps both fields of view inside the design file's ranges.
  const kMin = Math.max(Math.tan(degToRad(MIN_HFOV_DEG) / 2) / Math.tan(degToRad(hNow) / 2), Math.tan(degToRad(MIN_VFOV_DEG) / 2) / Math.tan(degToRad(vNow) / 2));
  if (kMin < 1) {
    // Search the narrowed horizontal field; the vertical one follows it through k.
    const hMin = Math.ceil(((2 * Math.atan(kMin * Math.tan(degToRad(hNow) / 2)) * 180) / Math.PI) * 100) / 100;
    const fov = nearestClearing((deg) => hiddenMargin(lens(Math.tan(degToRad(deg) / 2) / Math.tan(degToRad(hNow) / 2))), hNow, hMin, hNow, 0.5);
    if (fov !== null && fov < hNow) {
      const k = Math.tan(degToRad(fov) / 2) / Math.tan(degToRad(hNow) / 2);
      const vFov = Math.max(MIN_VFOV_DEG, Math.floor(lens(k).verticalFovDeg! * 100) / 100);
      out.push({ change: { horizontalFovDeg: fov, verticalFovDeg: vFov }, fraction: (hNow - fov) / (179 - MIN_HFOV_DEG), text: `a lens of ${r2(1 / k)}× the focal length: ${fovPath}.horizontalFovDeg ${r2(fov)}° and ${fovPath}.verticalFovDeg ${r2(vFov)}° (now ${hNow}° × ${vNow}°)` });
    }
  }
  return out.sort((a, b) => a.fraction - b.fraction);
}

/**
 * Rule 7: a warning for every prop disc that reaches into the camera view (how far, in the prop
 * plane), with every single change of the camera that hides them all, smallest first (`cameraFixes`).
 */
export function cameraViewRule(frame: Frame, o: CheckOptions, discs: readonly PropDisc[]): Finding[] {
  const pose = cameraPose(frame, o);
  const c = frame.design.camera;
  if (!pose || !c || !o.limits['camera-view'].enabled) return [];
  const seen = discs.map((disc) => ({ disc, m: discViewMargin(pose, disc) })).filter((x) => x.m <= 0);
  if (seen.length === 0) return [];
  const fixes = cameraFixes(frame, o, discs);
  const fix = fixes.length
    ? `set one of these, smallest change first, and every prop leaves the view: ${fixes.map((f) => f.text).join(', or ')}`
    : `accept props in view: no uptilt in the slot's ${c.uptiltMinDeg}–${c.uptiltMaxDeg}°, no forward offset from ${FORWARD_OFFSET_RANGE_MM[0]} to ${FORWARD_OFFSET_RANGE_MM[1]} mm, no pivot height from ${PIVOT_HEIGHT_RANGE_MM[0]} to ${PIVOT_HEIGHT_RANGE_MM[1]} mm and no lens down to ${MIN_HFOV_DEG}° × ${MIN_VFOV_DEG}° hides them on its own`;
  const where = `camera at x ${mm(pose.eyeMm[0])}, z ${mm(pose.eyeMm[2])}, uptilt ${c.uptiltDeg}°`;
  return seen.map(({ disc, m }) =>
    finding(CAMERA_RULE, 'warning', FRAME_PART, -m, 0, 'mm', disc.centerMm,
      `${disc.id} prop in the camera view (${where}): ${mm(-m)} of its disc lies inside the view in the prop plane, above the limit ${mm(0)}; ${fix}`));
}
