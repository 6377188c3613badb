import { dist, type Vec2 } from '../geometry/index.js';
import type { FeedBand, ShopProfile } from '../params/shop.js';
import type { PartCutData } from './cutData.js';

/** Machine time of one copy of a part, by cause. min. */
export type PartTime = Readonly<{
  passes: number;
  /** Tool-centre path × passes. mm. */
  cutPathMm: number;
  /** Plunges: each profiled contour and each drilled hole, once per pass. */
  plunges: number;
  /** Rapid travel between this part's contours. mm. */
  rapidMm: number;
  cutMin: number;
  plungeMin: number;
  rapidMin: number;
  /** Non-cutting allowance (accelerations, lead-ins, lifts) on the three above. */
  allowanceMin: number;
  totalMin: number;
}>;

/** Passes to cut through a plate: thickness over depth per pass, rounded up. */
export function passesFor(thicknessMm: number, band: FeedBand): number {
  // A plate exactly n depths thick takes n passes, not n + 1 from rounding.
  return Math.max(1, Math.ceil(thicknessMm / band.depthPerPassMm - 1e-9));
}

/**
 * Machine time of one copy of a part on the shop's router:
 * cut = Σ(tool path × passes) / feed; plunges = contours × passes × pierce time;
 * rapids = a nearest-neighbour tour through the inner contours' start points from and back to the
 * outline's start, at the rapid rate; plus the non-cutting allowance on all three.
 * (Cycle-time rule as in reference-values.md "Cutting and cost", common practice.)
 */
export function partTime(cut: PartCutData, band: FeedBand, shop: ShopProfile): PartTime {
  const passes = passesFor(cut.thicknessMm, band);
  const cutPathMm = cut.toolPathMm * passes;
  const plunges = cut.pierces * passes;
  const rapidMm = contourTour(cut);
  const cutMin = cutPathMm / band.feedMmPerMin;
  const plungeMin = (plunges * shop.pierceS) / 60;
  const rapidMin = rapidMm / shop.rapidMmPerMin;
  const allowanceMin = (cutMin + plungeMin + rapidMin) * shop.nonCuttingFraction;
  return { passes, cutPathMm, plunges, rapidMm, cutMin, plungeMin, rapidMin, allowanceMin, totalMin: cutMin + plungeMin + rapidMin + allowanceMin };
}

/** Length of the rapid tour: outline start → nearest unvisited inner start → … → outline start. mm. */
export function contourTour(cut: PartCutData): number {
  const outline = cut.contours.find((c) => c.role === 'outline');
  const home: Vec2 = outline ? outline.startMm : [cut.bboxMm[0], cut.bboxMm[1]];
  return nearestNeighbourTour(home, cut.contours.filter((c) => c.role === 'inner' && c.kind !== 'too-narrow').map((c) => c.startMm));
}

/** Closed nearest-neighbour tour from home through every point and back. mm. */
export function nearestNeighbourTour(home: Vec2, points: readonly Vec2[]): number {
  const left = [...points];
  let at = home;
  let total = 0;
  while (left.length) {
    let k = 0;
    for (let i = 1; i < left.length; i++) if (dist(at, left[i]) < dist(at, left[k])) k = i;
    total += dist(at, left[k]);
    at = left[k];
    left.splice(k, 1);
  }
  return total + dist(at, home);
}
