import type { ChecksConfig } from './checksSchema.js';
import { patternClass } from './motorTable.js';
import { clearanceHoleMm, type HoleSeries } from './screws.js';
import type { ScrewSize } from './types.js';

/**
 * Defaults that follow from other parameters and from the design rules, so that a design giving only
 * the required fields passes its own checks. Each is a pure function of what it depends on.
 */

/** Round up to a multiple of `step`, ignoring float noise just above a multiple. */
export const ceilTo = (x: number, step: number): number => Number((Math.ceil(x / step - 1e-9) * step).toFixed(9));
/** Round down to a multiple of `step`, ignoring float noise just below a multiple. */
export const floorTo = (x: number, step: number): number => Number((Math.floor(x / step + 1e-9) * step).toFixed(9));

/**
 * A slot is cut wider than the bit by this much: a slot cut at exactly the bit's width comes out at
 * the bit's runout and cannot be finished with a second pass. mm. Common practice, no source.
 */
export const SLOT_OVER_TOOL_MM = 0.2;

/**
 * Width of a slot that must pass `needMm` (a screw's clearance, a strap) and be cut by a bit of
 * `toolMm`: the larger of the two, the bit's width plus SLOT_OVER_TOOL_MM rounded up to 0.1 mm. mm.
 * @example cuttableSlotWidthMm(2.4, 3.175) // 3.4: an M2 tilt slot cut with a 1/8" bit
 */
export const cuttableSlotWidthMm = (needMm: number, toolMm: number): number => Math.max(needMm, ceilTo(toolMm + SLOT_OVER_TOOL_MM, 0.1));

/** Strap slots are at least this wide across the strap. mm. Common practice (domain notes: 2.5–3.5 mm). */
export const STRAP_SLOT_MIN_MM = 3;

/**
 * Material from a bolt centre to the plate edge that meets the hole-edge rule's warning level:
 * e = warnEdgeRatio × D (D the ISO 273 clearance hole), rounded up to 0.5 mm. mm.
 * @example edgeDistanceMm('M3', 'medium', checks) // 7: 2.0 × 3.4 = 6.8
 */
export function edgeDistanceMm(screw: ScrewSize, series: HoleSeries, checks: ChecksConfig): number {
  return ceilTo(checks['hole-edge-distance'].warnEdgeRatio * clearanceHoleMm(screw, series), 0.5);
}

/**
 * Tip-pad margin (material outside the motor holes' edges) that puts each motor hole at the
 * hole-edge rule's warning e/D from the pad edge: e − D/2, rounded up to 0.5 mm. mm.
 */
export function tipPadMarginMm(motorBolt: ScrewSize, series: HoleSeries, checks: ChecksConfig): number {
  const D = clearanceHoleMm(motorBolt, series);
  return ceilTo(checks['hole-edge-distance'].warnEdgeRatio * D - D / 2, 0.5);
}

/** The web rule's warning web for a plate of thickness t: max(minMm, perThickness × t) × warnFactor. mm. */
export function warningWebMm(checks: ChecksConfig, thicknessMm: number): number {
  const w = checks['web-width'];
  return Math.max(w.minMm, w.perThickness * thicknessMm) * w.warnFactor;
}

/**
 * Motor centre bore: the motor table's bore for the bolt pattern (or `tableBoreMm`), never so large that the web
 * between the bore and the nearest bolt hole falls below the web rule's warning web for the plate
 * that carries the motor (rounded down to 0.5 mm; 0 when no bore fits). mm.
 * @example motorBoreMm([9], 'M2', 'medium', checks, 3) // 2.5, not 7: a 7 mm bore would cut into the 9 mm circle's holes
 */
export function motorBoreMm(boltCirclesMm: readonly number[], bolt: ScrewSize, series: HoleSeries, checks: ChecksConfig, plateThicknessMm: number, tableBoreMm?: number): number {
  const wanted = tableBoreMm ?? patternClass(boltCirclesMm, bolt)?.boreMm;
  const room = floorTo(Math.min(...boltCirclesMm) - clearanceHoleMm(bolt, series) - 2 * warningWebMm(checks, plateThicknessMm), 0.5);
  return Math.max(0, Math.min(wanted ?? room, room));
}

/**
 * Motor bell diameter: the motor table's bell for the bolt pattern, or the largest bolt circle plus
 * 12 mm when no class has the pattern (a bell overhangs its mount by about 6 mm; from memory). mm.
 */
export function motorBellMm(boltCirclesMm: readonly number[], bolt: ScrewSize): number {
  return patternClass(boltCirclesMm, bolt)?.bellDiameterMm ?? Math.max(...boltCirclesMm) + 12;
}
