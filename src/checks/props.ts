import type { Frame } from '../geometry/frame.js';
import { windingNumber, distanceToLoop } from '../geometry/inside.js';
import { loopBBox, transformLoop } from '../geometry/loop.js';
import type { Part } from '../geometry/part.js';
import { circle, roundedRect } from '../geometry/primitives.js';
import type { Loop, Vec2 } from '../geometry/types.js';
import { closestPoint } from '../geometry/segment.js';
import { dist } from '../geometry/vec.js';
import { degToRad } from '../params/units.js';
import { discViewMargin, smallestHiding, type CameraPose, type PropDisc } from './camera.js';
import { finding, mm, pt } from './finding.js';
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

/** Something a prop could meet, in plan view, with the heights it spans. */
export type PlanObstacle = Readonly<{ name: string; loop: Loop; zMinMm: number; zMaxMm: number }>;

/**
 * The body, standoffs, top plate, braces, camera plates and any other plate copy except the arms
 * (which carry the motors under the props), as plan-view regions in frame coordinates.
 */
export function planObstacles(frame: Frame, o: CheckOptions): PlanObstacle[] {
  const d = frame.design;
  const out: PlanObstacle[] = [];
  out.push({ name: 'body', loop: roundedRect([0, 0], d.body.lengthMm, d.body.widthMm, d.body.cornerRadiusMm), zMinMm: 0, zMaxMm: d.body.thicknessMm });
  const r = o.limits['prop-clearance'].standoffDiameterMm / 2;
  d.body.standoffs.positionsMm.forEach((p, i) => {
    out.push({ name: `standoff ${i + 1}`, loop: circle(p, r), zMinMm: d.body.thicknessMm, zMaxMm: d.body.thicknessMm + d.body.standoffs.heightMm });
  });
  for (const part of frame.parts) {
    if (part.role === 'arm' || part.role === 'bottom') continue;
    part.placements.forEach((pl, k) => {
      const name = part.placements.length > 1 ? `${part.name} ${k + 1}` : part.name;
      out.push(placedObstacle(part, pl, name));
    });
  }
  return out;
}

function placedObstacle(part: Part, pl: Part['placements'][number], name: string): PlanObstacle {
  if (pl.vertical) {
    const [x0, y0, x1, y1] = loopBBox(part.outline);
    const y = pl.translateMm[1];
    const t = part.thicknessMm;
    return { name, loop: roundedRect([(x0 + x1) / 2, y - t / 2], x1 - x0, t, 0), zMinMm: pl.zMm + y0, zMaxMm: pl.zMm + y1 };
  }
  const loop = transformLoop(part.outline, { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY });
  return { name, loop, zMinMm: pl.zMm, zMaxMm: pl.zMm + part.thicknessMm };
}

/** Signed plan distance from a point to a region: negative inside. mm. */
function signedDistance(loop: Loop, p: Vec2): number {
  const d = distanceToLoop(loop, p);
  return windingNumber(loop, p) !== 0 ? -d : d;
}

/**
 * Rule 6: adjacent prop tip gaps against minTipGapMm (error), and each prop disc against every
 * obstacle in plan view: an error when an obstacle that spans the prop plane comes closer than
 * minPartClearanceMm, a warning when one within maxVerticalGapMm above or below the prop plane lies
 * under the disc.
 */
export function propClearanceRule(frame: Frame, o: CheckOptions, discs: readonly PropDisc[]): Finding[] {
  const lim = o.limits['prop-clearance'];
  if (!lim.enabled) return [];
  const out: Finding[] = [];
  for (const g of tipGaps(discs)) {
    if (g.gapMm >= o.minTipGapMm) continue;
    out.push(finding(PROP_RULE, 'error', FRAME_PART, g.gapMm, o.minTipGapMm, 'mm', g.atMm,
      `prop tips ${g.a} and ${g.b} are ${mm(g.gapMm)} apart, below ${mm(o.minTipGapMm)}; lengthen the arms or use smaller props`));
  }
  const obstacles = planObstacles(frame, o);
  for (const disc of discs) {
    for (const ob of obstacles) {
      const clearance = signedDistance(ob.loop, disc.centerMm) - disc.radiusMm;
      const spans = ob.zMinMm <= disc.zMm && disc.zMm <= ob.zMaxMm;
      if (spans && clearance < lim.minPartClearanceMm) {
        out.push(finding(PROP_RULE, 'error', FRAME_PART, clearance, lim.minPartClearanceMm, 'mm', nearestTip(disc, ob.loop),
          `${disc.id} prop disc ${clearance < 0 ? `overlaps the ${ob.name} by ${mm(-clearance)}` : `passes ${mm(clearance)} from the ${ob.name}`} at prop height ${mm(disc.zMm, 1)}; keep ${mm(lim.minPartClearanceMm)}`));
        continue;
      }
      const gapZ = disc.zMm > ob.zMaxMm ? disc.zMm - ob.zMaxMm : ob.zMinMm - disc.zMm;
      if (!spans && clearance < 0 && gapZ < lim.maxVerticalGapMm) {
        out.push(finding(PROP_RULE, 'warning', FRAME_PART, clearance, 0, 'mm', nearestTip(disc, ob.loop),
          `${disc.id} prop disc reaches ${mm(-clearance)} over the ${ob.name} in plan view, ${mm(gapZ, 1)} ${disc.zMm > ob.zMaxMm ? 'above' : 'below'} it; prop flex or a bent arm may strike it`));
      }
    }
  }
  return out;
}

/** The point of the disc edge nearest the obstacle (where to put the marker). */
function nearestTip(disc: PropDisc, loop: Loop): Vec2 {
  const c = disc.centerMm;
  if (windingNumber(loop, c) === 0) {
    // Centre outside: the nearest edge point lies towards the obstacle's nearest boundary point (exact).
    let q: Vec2 | null = null;
    let d = Infinity;
    for (const s of loop) {
      const cp = closestPoint(s, c);
      if (cp.distance < d) [d, q] = [cp.distance, cp.point];
    }
    if (q && d > 1e-9) return [c[0] + (disc.radiusMm * (q[0] - c[0])) / d, c[1] + (disc.radiusMm * (q[1] - c[1])) / d];
  }
  // Centre inside the obstacle (no frame puts a motor there): the deepest of 360 edge points.
  let best: { d: number; p: Vec2 } | null = null;
  for (let k = 0; k < 360; k++) {
    const a = (k * Math.PI) / 180;
    const p: Vec2 = [disc.centerMm[0] + disc.radiusMm * Math.cos(a), disc.centerMm[1] + disc.radiusMm * Math.sin(a)];
    const d = signedDistance(loop, p);
    if (!best || d < best.d) best = { d, p };
  }
  return best!.p;
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
  const out: Finding[] = [];
  let visible = 0;
  for (const disc of discs) {
    const m = discViewMargin(pose, disc);
    if (m > 0) continue;
    visible++;
    out.push(finding(CAMERA_RULE, 'warning', FRAME_PART, -m, 0, 'mm', disc.centerMm,
      `${disc.id} prop is in the camera view: ${mm(-m)} of its disc lies inside the view in the prop plane (camera at ${pt([pose.eyeMm[0], pose.eyeMm[2]])} x/z, uptilt ${c.uptiltDeg}°)`));
  }
  if (visible === 0) return out;
  const worst = (p: CameraPose): number => Math.min(...discs.map((d) => discViewMargin(p, d)));
  const off = smallestHiding((v) => worst(cameraPose(frame, o, v)!), FORWARD_OFFSET_RANGE_MM[0], FORWARD_OFFSET_RANGE_MM[1], 0.5);
  const up = smallestHiding((v) => worst(cameraPose(frame, o, undefined, v)!), c.uptiltMinDeg, c.uptiltMaxDeg, 0.25);
  const down = smallestHiding((v) => worst(cameraPose(frame, o, undefined, -v)!), -c.uptiltMaxDeg, -c.uptiltMinDeg, 0.25);
  const tilts = [up, down === null ? null : -down].filter((x): x is number => x !== null);
  const tilt = tilts.length ? tilts.reduce((a, b) => (Math.abs(a - c.uptiltDeg) <= Math.abs(b - c.uptiltDeg) ? a : b)) : null;
  const parts = [
    off === null ? `no camera.forwardOffsetMm up to ${FORWARD_OFFSET_RANGE_MM[1]} mm hides them` : `camera.forwardOffsetMm ≥ ${(Math.ceil(off * 100) / 100).toFixed(2)} mm (set ${c.forwardOffsetMm})`,
    tilt === null ? `no uptilt in the slot's ${c.uptiltMinDeg}–${c.uptiltMaxDeg}° hides them` : `uptilt ${tilt.toFixed(2)}° (set ${c.uptiltDeg}°)`,
  ];
  out.push(finding(CAMERA_RULE, 'info', FRAME_PART, off, null, 'mm', null, `no prop in view with ${parts.join(', or with ')}`));
  return out;
}
