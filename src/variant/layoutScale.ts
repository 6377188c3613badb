import { assertNever } from '../geometry/types.js';
import type { Design } from '../params/design.js';
import { motorSites, wheelbaseOf, type MotorSite, type SiteId } from '../geometry/layout.js';
import { dist } from '../geometry/vec.js';
import { ceilTo } from '../params/derived.js';

/**
 * Wheelbase from prop size and tip gap. Every layout kind is a fixed shape times one length: x and h
 * scale with `wheelbaseMm` at a fixed `armAngleDeg`; asymmetric scales both reaches by one factor at
 * fixed angles. Every motor-to-motor distance is therefore proportional to the wheelbase, and the
 * smallest wheelbase giving a tip gap g is exact: for each pair, s·d_ij − P = g.
 */

/** Prop tip gap between two motors with equal props: centre distance minus one prop diameter. mm. */
export type TipGap = Readonly<{ between: readonly [SiteId, SiteId]; adjacent: boolean; gapMm: number }>;

const ADJACENT: ReadonlyArray<readonly [SiteId, SiteId]> = [
  ['front-right', 'front-left'],
  ['front-left', 'rear-left'],
  ['rear-left', 'rear-right'],
  ['rear-right', 'front-right'],
];
const DIAGONAL: ReadonlyArray<readonly [SiteId, SiteId]> = [
  ['front-left', 'rear-right'],
  ['front-right', 'rear-left'],
];

/**
 * Tip gaps of every motor pair (adjacent first, then the diagonals), with the trade's
 * `g = |ri − rj| − (Pi + Pj)/2` for equal props P. mm.
 */
export function tipGaps(sites: readonly MotorSite[], propDiameterMm: number): TipGap[] {
  const at = (id: SiteId) => sites.find((s) => s.id === id)!.motorMm;
  return [
    ...ADJACENT.map((p) => ({ between: p, adjacent: true, gapMm: dist(at(p[0]), at(p[1])) - propDiameterMm })),
    ...DIAGONAL.map((p) => ({ between: p, adjacent: false, gapMm: dist(at(p[0]), at(p[1])) - propDiameterMm })),
  ];
}

/** Smallest tip gap over every pair. mm. */
export const minTipGapMm = (sites: readonly MotorSite[], propDiameterMm: number): number =>
  Math.min(...tipGaps(sites, propDiameterMm).map((g) => g.gapMm));

/** The design's layout scaled by `factor` (shape kept): the layout section as it would be written. */
export function scaledLayout(d: Design, factor: number): Design['layout'] {
  const L = d.layout;
  switch (L.kind) {
    case 'x':
    case 'h':
      return { ...L, wheelbaseMm: L.wheelbaseMm * factor };
    case 'asymmetric':
      return { ...L, front: { ...L.front, reachMm: L.front.reachMm * factor }, rear: { ...L.rear, reachMm: L.rear.reachMm * factor } };
    default:
      return assertNever(L);
  }
}

/**
 * The smallest wheelbase (diagonal front-left to rear-right) at which every pair of props keeps
 * `gapMm`, for the design's layout shape. Exact (no rounding). mm. Throws RangeError for a
 * non-positive prop or negative gap.
 * @example for a true X: (P + g)·√2
 */
export function minWheelbaseMm(d: Design, propDiameterMm: number, gapMm: number): number {
  if (!(propDiameterMm > 0) || !(gapMm >= 0)) throw new RangeError(`prop diameter must be > 0 and gap ≥ 0 (got ${propDiameterMm}, ${gapMm})`);
  const sites = motorSites(d);
  const w = wheelbaseOf(sites);
  // gap_ij(s) = s·d_ij − P ≥ g  ⇔  s ≥ (P + g) / d_ij
  const factor = Math.max(...tipGaps(sites, 0).map((t) => (propDiameterMm + gapMm) / t.gapMm));
  return factor * w;
}

/** Round up to a multiple of `stepMm` (0: no rounding), ignoring float noise just above a multiple. */
export const ceilToStep = (x: number, stepMm: number): number => (stepMm <= 0 ? x : ceilTo(x, stepMm));
