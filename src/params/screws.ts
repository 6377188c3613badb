import type { ScrewSize } from './types.js';

export const SCREW_SIZES = ['M2', 'M2.5', 'M3', 'M4', 'M5'] as const satisfies readonly ScrewSize[];
export type HoleSeries = 'fine' | 'medium' | 'coarse';

/** ISO 273 clearance holes (fine H12 / medium H13 / coarse H14), mm. */
const ISO_273: Record<ScrewSize, Record<HoleSeries, number>> = {
  M2: { fine: 2.2, medium: 2.4, coarse: 2.6 },
  'M2.5': { fine: 2.7, medium: 2.9, coarse: 3.1 },
  M3: { fine: 3.2, medium: 3.4, coarse: 3.6 },
  M4: { fine: 4.3, medium: 4.5, coarse: 4.8 },
  M5: { fine: 5.3, medium: 5.5, coarse: 5.8 },
};

/** ISO 273 clearance hole for the screw in the series (mm). */
export const clearanceHoleMm = (screw: ScrewSize, series: HoleSeries): number => ISO_273[screw][series];

/** Nominal thread diameter, mm. */
export const nominalDiameterMm = (screw: ScrewSize): number => Number(screw.slice(1));

/**
 * Countersunk head diameter (theoretical dk) for a flush 90° head: ISO 14581 for M2 and M2.5,
 * ISO 10642 for M3 and up (M5 value from memory; the others from the standards' tables).
 */
const COUNTERSUNK_HEAD_MM: Record<ScrewSize, number> = { M2: 4.4, 'M2.5': 5.5, M3: 6.72, M4: 8.96, M5: 11.2 };
/** Head diameter of a flush 90° countersunk screw (mm). */
export const countersunkHeadMm = (screw: ScrewSize): number => COUNTERSUNK_HEAD_MM[screw];
