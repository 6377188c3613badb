import { screwHead } from '../assembly/standards.js';
import { armShape } from '../geometry/arm.js';
import { flattenLoop, transformPoint } from '../geometry/loop.js';
import { alongArm, motorSites, type MotorSite } from '../geometry/layout.js';
import { convexHull } from '../geometry/primitives.js';
import type { Vec2 } from '../geometry/types.js';
import { dot, perp, polar, sub, unit } from '../geometry/vec.js';
import type { Design, SeparateArms } from '../params/design.js';
import { clearanceHoleMm } from '../params/screws.js';
import type { Change } from './changes.js';
import { armSections, type ArmSection, type SizeRule } from './sizeRule.js';

/**
 * Room at the arm roots of separate arms. Arms (and the brace plates under their roots) are
 * separate plates side by side on one bottom plate: they must not overlap each other or the
 * standoffs, and keep a little air so a crash-bent arm does not bind its neighbour. A wider arm root
 * therefore needs its roots further out from where the arm lines start; this module finds how far.
 * A fast estimate on convex hulls for the search; the assembly's fit checks have the last word.
 */

/** Air between neighbouring arm plates, standoffs and brace plates. mm. Common practice, no source. */
export const ROOT_CLEARANCE_MM = 1;

/**
 * Separation of two convex polygons along the best separating axis among their edge normals:
 * positive when they are apart (a lower bound of their distance), negative when they overlap. mm.
 */
export function convexGapMm(a: readonly Vec2[], b: readonly Vec2[]): number {
  // Boxes apart by more than any clearance asked here: that gap is a lower bound too, and cheap.
  const ba = boxOf(a);
  const bb = boxOf(b);
  const boxGap = Math.max(bb[0] - ba[2], ba[0] - bb[2], bb[1] - ba[3], ba[1] - bb[3]);
  if (boxGap >= ROOT_CLEARANCE_MM) return boxGap;
  let best = -Infinity;
  for (const [p, q] of [[a, b], [b, a]] as const) {
    for (let i = 0; i < p.length; i++) {
      const n = unit(perp(sub(p[(i + 1) % p.length], p[i])));
      const span = (poly: readonly Vec2[]) => {
        let lo = Infinity;
        let hi = -Infinity;
        for (const v of poly) {
          const x = dot(v, n);
          lo = Math.min(lo, x);
          hi = Math.max(hi, x);
        }
        return [lo, hi] as const;
      };
      const [p0, p1] = span(p);
      const [q0, q1] = span(q);
      best = Math.max(best, q0 - p1, p0 - q1);
    }
  }
  return best;
}

/** Bounding box [minX, minY, maxX, maxY] of a point list. */
function boxOf(pts: readonly Vec2[]): [number, number, number, number] {
  let b: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const [x, y] of pts) b = [Math.min(b[0], x), Math.min(b[1], y), Math.max(b[2], x), Math.max(b[3], y)];
  return b;
}

/** Chord tolerance for the arm hulls: coarse, the hull only has to contain the arm. mm. */
const HULL_CHORD_MM = 0.2;

/**
 * Every arm plate copy as a convex polygon in frame coordinates: the convex hull of its outline
 * pieces (the arm lies inside it; a truss's windows are covered), placed as the frame places it.
 * Arms of one length share one hull, computed once in the arm's own frame.
 */
function armHulls(d: Design, a: SeparateArms, sites: readonly MotorSite[]): Vec2[][] {
  const start = a.root.reachMm - a.root.edgeMarginMm;
  const local = new Map<number, Vec2[]>();
  return sites.map((site) => {
    const length = site.motorAlongMm - start;
    const key = Math.round(length * 1e6);
    let hull = local.get(key);
    if (!hull) {
      hull = convexHull(armShape(d, length).pieces.flatMap((p) => flattenLoop(p, HULL_CHORD_MM)));
      local.set(key, hull);
    }
    const tf = { rotateRad: site.armDirRad, translate: alongArm(site, start), mirrorY: site.left };
    return hull.map((p) => transformPoint(p, tf));
  });
}

/** Round things an arm plate must keep clear of: the standoffs (and their screw heads) at the body. */
function standoffDiscs(d: Design): Vec2[][] {
  const so = d.body.standoffs;
  const r = Math.max(screwHead(so.boltSize, 'socket').diameterMm / 2, so.shape === 'hex' ? so.acrossFlatsMm / Math.sqrt(3) : so.acrossFlatsMm / 2);
  return so.positionsMm.map((c) => Array.from({ length: 16 }, (_, k) => {
    const o = polar(r / Math.cos(Math.PI / 16), (k * Math.PI) / 8);
    return [c[0] + o[0], c[1] + o[1]] as Vec2;
  }));
}

/** A brace plate's outline as a convex polygon: the hull of its root bolts' pads (16-gon each). */
function bracePolygon(d: Design, a: SeparateArms, pair: readonly MotorSite[]): Vec2[] {
  const r = clearanceHoleMm(a.root.boltSize, d.cutting.holeSeries) / 2 + (d.braces?.marginMm ?? 0);
  const pts: Vec2[] = [];
  for (const s of pair) {
    for (let i = 0; i < a.root.boltCount; i++) {
      const c = alongArm(s, a.root.reachMm + i * a.root.boltSpacingMm);
      for (let k = 0; k < 16; k++) {
        const o = polar(r / Math.cos(Math.PI / 16), (k * Math.PI) / 8);
        pts.push([c[0] + o[0], c[1] + o[1]]);
      }
    }
  }
  return convexHull(pts);
}

/**
 * Smallest gap between neighbouring arm plates, between an arm plate and a standoff (with its screw
 * head), and between the front and rear braces (separate arms). mm. Infinity for unibody frames.
 */
export function rootGapMm(d: Design): number {
  const a = d.arms;
  if (a.construction !== 'separate') return Infinity;
  const sites = motorSites(d);
  const hulls = armHulls(d, a, sites);
  let gap = Infinity;
  for (let i = 0; i < hulls.length; i++) for (let j = i + 1; j < hulls.length; j++) gap = Math.min(gap, convexGapMm(hulls[i], hulls[j]));
  for (const disc of standoffDiscs(d)) for (const h of hulls) gap = Math.min(gap, convexGapMm(h, disc));
  if (d.braces) {
    gap = Math.min(gap, convexGapMm(bracePolygon(d, a, sites.filter((s) => s.front)), bracePolygon(d, a, sites.filter((s) => !s.front))));
  }
  return gap;
}

/**
 * The design with its arm roots moved out (arms.root.reachMm up, in 0.5 mm steps from where it is)
 * until the arm plates, standoffs and braces keep ROOT_CLEARANCE_MM; unchanged when they already do.
 * Null when the roots would have to pass 60 % of the way to the motors (the arms are too wide for
 * the layout). Moving out only opens the gaps, so the search doubles its step until clear and then
 * halves back to the 0.5 mm step. Unibody frames are returned as they are.
 */
export function withRootRoom(d: Design): Design | null {
  const a = d.arms;
  if (a.construction !== 'separate') return d;
  const limit = 0.6 * Math.min(...motorSites(d).map((s) => s.motorAlongMm)) - (a.root.boltCount - 1) * a.root.boltSpacingMm - a.root.edgeMarginMm;
  const at = (steps: number): Design => (steps === 0 ? d : { ...d, arms: { ...a, root: { ...a.root, reachMm: a.root.reachMm + 0.5 * steps } } });
  const clear = (steps: number): boolean => rootGapMm(at(steps)) >= ROOT_CLEARANCE_MM;
  if (clear(0)) return d;
  const maxSteps = Math.floor((limit - a.root.reachMm) / 0.5 + 1e-9);
  if (maxSteps < 1) return null;
  let bad = 0;
  let good = -1;
  for (let n = 1; ; n = Math.min(2 * n, maxSteps)) {
    if (clear(n)) {
      good = n;
      break;
    }
    bad = n;
    if (n === maxSteps) return null;
  }
  while (good - bad > 1) {
    const mid = Math.floor((good + bad) / 2);
    if (clear(mid)) good = mid;
    else bad = mid;
  }
  return at(good);
}

/**
 * The smallest root reach, in whole millimetres from `step` above the design's, at which `ok` holds
 * for the design with its roots there; `ok` must hold from some reach on (moving the clamp out only
 * stiffens the arm). The search stops where the motors come within `leaveMm` of the root block's
 * end, or at 60 % of the way to them by default. Null when it never holds. mm.
 */
export function smallestReach(d: Design, step: number, ok: (moved: Design) => boolean, leaveMm?: number): number | null {
  const a = d.arms;
  if (a.construction !== 'separate') return null;
  const block = (a.root.boltCount - 1) * a.root.boltSpacingMm + a.root.edgeMarginMm;
  const nearest = Math.min(...motorSites(d).map((s) => s.motorAlongMm));
  const limit = Math.floor(leaveMm === undefined ? 0.6 * nearest - block : nearest - block - leaveMm);
  const at = (reach: number): Design => ({ ...d, arms: { ...a, root: { ...a.root, reachMm: reach } } });
  let lo = Math.floor(a.root.reachMm) + step - 1;
  let hi = limit;
  if (hi <= lo || !ok(at(hi))) return null;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (ok(at(mid))) hi = mid;
    else lo = mid;
  }
  return hi;
}

/**
 * The smallest root reach (whole mm, above the design's) at which some arm section meets the rule,
 * with the sections there; null for unibody arms or when none up to 60 % of the way to the motors
 * does. The rule gets easier as the clamp moves out (shorter free arm).
 */
export function clampFurtherOut(d: Design, rule: SizeRule, place: (d: Design) => Design | null): { change: Change; sections: ArmSection[] } | null {
  const a = d.arms;
  if (a.construction !== 'separate') return null;
  const at = (reach: number): Design => ({ ...d, arms: { ...a, root: { ...a.root, reachMm: reach } } });
  const reach = smallestReach(d, 1, (moved) => armSections(moved, rule, place).length > 0);
  if (reach === null) return null;
  return {
    change: { path: ['arms', 'root', 'reachMm'], old: a.root.reachMm, new: reach, why: `arms clamped further out: with the roots at ${a.root.reachMm} mm no arm section meets the size rule; the bottom plate's arm pads and the braces grow with them` },
    sections: armSections(at(reach), rule, place),
  };
}
