import { assertNever } from '../geometry/types.js';
import type { CantileverBeam } from '../analysis/beam.js';
import type { Design } from '../params/design.js';
import { motorSites, type MotorSite, type SiteId } from '../geometry/layout.js';
import type { Material } from '../geometry/part.js';
import { degToRad } from '../params/units.js';
import { exAt } from '../checks/laminate.js';

/**
 * Each arm as a uniform cantilever for the stiffness rule: clamped where the plates stop holding it,
 * free at the motor, bending out of the plate's plane (thrust is vertical). Estimates, chosen so
 * that source and variant are measured the same way:
 * - separate arms are clamped up to the end of the bottom plate's root pad (root reach + bolt
 *   spacing + edge margin); a unibody arm from where its line leaves the body rectangle;
 * - width: straight arms their width; tapered the mean of root and tip; truss the main strut plus
 *   the secondary strut weighted by the fraction of the length it spans (both struts bend together
 *   where both exist);
 * - modulus: the woven laminate's axial modulus along the arm (classical laminate theory), because
 *   an arm at 45° to the weave is about four times softer than one along it.
 */
export type ArmBeam = CantileverBeam & Readonly<{ site: SiteId }>;

/** Effective uniform width of the arm for out-of-plane bending. mm. */
export function effectiveArmWidthMm(d: Design): number {
  const a = d.arms;
  switch (a.style) {
    case 'straight':
      return a.widthMm!;
    case 'tapered':
      return (a.widthMm! + (a.tipWidthMm ?? a.widthMm!)) / 2;
    case 'truss':
      return a.truss!.mainWidthMm + a.truss!.secondaryWidthMm * a.truss!.meetFraction;
    default:
      return assertNever(a.style);
  }
}

/** Distance along the arm line from its origin to where the plates stop clamping the arm. mm. */
export function clampAlongMm(d: Design, site: MotorSite): number {
  if (d.arms.construction === 'separate') {
    const r = d.arms.root;
    return r.reachMm + (r.boltCount - 1) * r.boltSpacingMm + r.edgeMarginMm;
  }
  // Unibody: the arm line leaves the body rectangle [±L/2] × [±W/2].
  const hx = d.body.lengthMm / 2;
  const hy = d.body.widthMm / 2;
  const [ox, oy] = site.armLineOriginMm;
  if (Math.abs(ox) >= hx || Math.abs(oy) >= hy) return 0;
  const cx = Math.cos(site.armDirRad);
  const cy = Math.sin(site.armDirRad);
  const tx = Math.abs(cx) < 1e-12 ? Infinity : ((cx > 0 ? hx : -hx) - ox) / cx;
  const ty = Math.abs(cy) < 1e-12 ? Infinity : ((cy > 0 ? hy : -hy) - oy) / cy;
  return Math.min(tx, ty);
}

/** Thickness of the plate the arms are cut from (the bottom plate for unibody frames). mm. */
export const armPlateThicknessMm = (d: Design): number => (d.arms.construction === 'unibody' ? d.body.thicknessMm : d.arms.thicknessMm);

/**
 * One cantilever per motor site, carrying `tipMassG` (the motor). A free length of zero or less
 * (motor inside the clamp) is returned as is; callers decide whether that is an error.
 */
export function armBeams(d: Design, tipMassG: number): ArmBeam[] {
  const unibody = d.arms.construction === 'unibody';
  const sec = unibody ? d.body : d.arms;
  const material = d.materialFor(sec.material);
  const widthMm = effectiveArmWidthMm(d);
  const thicknessMm = armPlateThicknessMm(d);
  return motorSites(d).map((site) => {
    // Separate arms are cut with the arm along part x; a unibody arm runs at its own angle on the plate.
    const angle = unibody ? site.armDirRad - degToRad(sec.weaveDeg) : degToRad(sec.weaveDeg);
    return {
      site: site.id,
      lengthMm: site.motorAlongMm - clampAlongMm(d, site),
      widthMm,
      thicknessMm,
      modulusGpa: exAt(material, angle),
      densityGPerCm3: material.densityGPerCm3,
      tipMassG,
    };
  });
}
