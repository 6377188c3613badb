import type { Design } from '../params/design.js';
import { clearanceHoleMm, countersunkHeadMm } from '../params/screws.js';
import type { Feature, FeaturePurpose, ScrewSize } from './part.js';
import { circle, roundedRect, slot } from './primitives.js';
import { reverseLoop } from './loop.js';
import type { Loop, Vec2 } from './types.js';
import { add, polar } from './vec.js';

export type SourcedFeature = Feature & Readonly<{ sourcePath: string }>;

/** A round clearance hole for a screw, ISO 273 series from the design. */
export function screwHole(d: Design, center: Vec2, screw: ScrewSize, purpose: FeaturePurpose, sourcePath: string): SourcedFeature {
  const dia = clearanceHoleMm(screw, d.cutting.holeSeries);
  return { loop: circle(center, dia / 2, false), kind: 'hole', purpose, screw, centerMm: center, diameterMm: dia, sourcePath };
}

/** A round hole of a given diameter that no screw sizes (e.g. a motor bore). */
export function plainHole(center: Vec2, diameterMm: number, purpose: FeaturePurpose, sourcePath: string): SourcedFeature {
  return { loop: circle(center, diameterMm / 2, false), kind: 'hole', purpose, centerMm: center, diameterMm, sourcePath };
}

/** Inner contour from a counter-clockwise shape (reversed to clockwise). */
export function cutout(shape: Loop, kind: 'slot' | 'cutout', purpose: FeaturePurpose, sourcePath: string, screw?: ScrewSize): SourcedFeature {
  return { loop: reverseLoop(shape), kind, purpose, sourcePath, ...(screw ? { screw } : {}) };
}

/**
 * Motor bolt pattern about `center`, rotated so angle 0 points from the motor towards the arm tip.
 * Bolts sit at 45°, 135°, 225°, 315°; with two circles (n×m) the 45°/225° pair uses the first and the
 * 135°/315° pair the second. With three bolts the one at 225° (root side) is left out. Slotted holes
 * run radially from the smaller circle to the larger so either pattern fits.
 */
export function motorHoles(d: Design, center: Vec2, rotRad: number, sourcePath: string): SourcedFeature[] {
  const m = d.motor;
  const dia = clearanceHoleMm(m.boltSize, d.cutting.holeSeries);
  const angles = [45, 135, 225, 315].filter((a) => m.boltCount === 4 || a !== 225);
  const out: SourcedFeature[] = [];
  for (const deg of angles) {
    const a = rotRad + (deg * Math.PI) / 180;
    if (m.slotted) {
      const [c1, c2] = [...m.boltCircleMm].sort((p, q) => p - q);
      out.push(cutout(slot(add(center, polar(c1 / 2, a)), add(center, polar(c2 / 2, a)), dia), 'slot', 'motor-bolt', `${sourcePath}.boltCircleMm`, m.boltSize));
    } else {
      const circleMm = m.boltCircleMm.length === 2 && (deg === 135 || deg === 315) ? m.boltCircleMm[1] : m.boltCircleMm[0];
      out.push(screwHole(d, add(center, polar(circleMm / 2, a)), m.boltSize, 'motor-bolt', `${sourcePath}.boltCircleMm`));
    }
  }
  if (m.boreMm > 0) out.push(plainHole(center, m.boreMm, 'motor-bore', `${sourcePath}.boreMm`));
  return out;
}

/** Radius of the smallest disc around the motor centre that keeps tipPadMarginMm round every motor hole. */
export function motorPadRadius(d: Design): number {
  const dia = clearanceHoleMm(d.motor.boltSize, d.cutting.holeSeries);
  const holes = Math.max(...d.motor.boltCircleMm) / 2 + dia / 2 + d.arms.tipPadMarginMm;
  const guard = d.arms.tipGuardMm > 0 ? d.motor.bellDiameterMm / 2 + d.arms.tipGuardMm : 0;
  return Math.max(holes, guard);
}

/**
 * Four holes on a square of side sideMm centred at `center` (flight-controller stack pattern),
 * optionally countersunk from the bottom face for flush 90° heads (ISO 14581 / ISO 10642 head size).
 */
export function squareHoles(d: Design, center: Vec2, sideMm: number, screw: ScrewSize, sourcePath: string, countersunk = false): SourcedFeature[] {
  const h = sideMm / 2;
  return ([[h, h], [-h, h], [-h, -h], [h, -h]] as Vec2[]).map((o) => {
    const hole = screwHole(d, add(center, o), screw, 'stack-bolt', sourcePath);
    return countersunk ? { ...hole, countersink: { headDiameterMm: countersunkHeadMm(screw), face: 'bottom' as const } } : hole;
  });
}

/** Rounded-rectangle cut-out; corners never below the router bit radius. */
export function roundedCutout(
  center: Vec2,
  lengthMm: number,
  widthMm: number,
  cornerMm: number,
  purpose: FeaturePurpose,
  sourcePath: string,
): SourcedFeature {
  return cutout(roundedRect(center, lengthMm, widthMm, cornerMm), 'cutout', purpose, sourcePath);
}
