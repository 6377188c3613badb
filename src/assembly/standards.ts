import { countersunkHeadMm } from '../params/screws.js';
import type { ScrewSize } from '../params/types.js';
import type { NutStandard, ScrewStandard } from './types.js';

/**
 * Fastener dimensions from the product standards (reference-values.md, "Assembly hardware").
 * Where a row is recalled rather than read from the table it says so; tests compare every row
 * that reference-values.md lists.
 */

/** ISO 261 coarse pitch. mm. */
const PITCH_MM: Record<ScrewSize, number> = { M2: 0.4, 'M2.5': 0.45, M3: 0.5, M4: 0.7, M5: 0.8 };

/** Coarse thread pitch (ISO 261). mm. */
export const pitchMm = (s: ScrewSize): number => PITCH_MM[s];

/** Head diameter dk max and head height k max. mm. */
type Head = Readonly<{ dk: number; k: number }>;

/** ISO 4762 socket head cap screws (M5 row from memory). */
const ISO_4762: Record<ScrewSize, Head> = {
  M2: { dk: 3.8, k: 2.0 },
  'M2.5': { dk: 4.5, k: 2.5 },
  M3: { dk: 5.5, k: 3.0 },
  M4: { dk: 7.0, k: 4.0 },
  M5: { dk: 8.5, k: 5.0 },
};

/** ISO 7380-1 button heads, M3 and up (M5 row from memory). */
const ISO_7380: Partial<Record<ScrewSize, Head>> = {
  M3: { dk: 5.7, k: 1.65 },
  M4: { dk: 7.6, k: 2.2 },
  M5: { dk: 9.5, k: 2.75 },
};

/** 90° countersunk heads: ISO 14581 (M2, M2.5) and ISO 10642 (M3 up); k = (dk − d) / 2 for a 90° cone. */
const COUNTERSUNK_K: Record<ScrewSize, number> = { M2: 1.2, 'M2.5': 1.5, M3: 1.86, M4: 2.48, M5: 3.1 };

export type HeadStyle = 'socket' | 'button' | 'countersunk';

export type ScrewHead = Readonly<{ standard: ScrewStandard; style: HeadStyle; diameterMm: number; heightMm: number }>;

/**
 * The head of a screw of the given style. Button heads exist from M3 (ISO 7380-1); smaller sizes get
 * a socket head. Countersunk: ISO 14581 below M3, ISO 10642 from M3.
 * @example screwHead('M3', 'socket') // { standard: 'ISO 4762', diameterMm: 5.5, heightMm: 3 }
 */
export function screwHead(size: ScrewSize, style: HeadStyle): ScrewHead {
  if (style === 'countersunk') {
    const standard: ScrewStandard = size === 'M2' || size === 'M2.5' ? 'ISO 14581' : 'ISO 10642';
    return { standard, style, diameterMm: countersunkHeadMm(size), heightMm: COUNTERSUNK_K[size] };
  }
  const button = style === 'button' ? ISO_7380[size] : undefined;
  if (button) return { standard: 'ISO 7380-1', style, diameterMm: button.dk, heightMm: button.k };
  const h = ISO_4762[size];
  return { standard: 'ISO 4762', style: 'socket', diameterMm: h.dk, heightMm: h.k };
}

/** Hex socket size s (ISO 4762 / 7380 / 10642 share it per thread size; from memory). mm. */
const SOCKET_S_MM: Record<ScrewSize, number> = { M2: 1.5, 'M2.5': 2, M3: 2.5, M4: 3, M5: 4 };
export const socketSizeMm = (s: ScrewSize): number => SOCKET_S_MM[s];

/**
 * Nut height m and width across flats s. ISO 4032 (regular): m from reference-values.md (M5 from
 * memory), s from memory. ISO 4035 (thin): M3 from reference-values.md, others from memory.
 * ISO 7040 (prevailing torque, M3 and up): h from reference-values.md (M5 from memory).
 */
const NUT_S_MM: Record<ScrewSize, number> = { M2: 4, 'M2.5': 5, M3: 5.5, M4: 7, M5: 8 };
const ISO_4032_M: Record<ScrewSize, number> = { M2: 1.6, 'M2.5': 2.0, M3: 2.4, M4: 3.2, M5: 4.7 };
const ISO_4035_M: Record<ScrewSize, number> = { M2: 1.2, 'M2.5': 1.6, M3: 1.8, M4: 2.2, M5: 2.7 };
const ISO_7040_H: Partial<Record<ScrewSize, number>> = { M3: 4.0, M4: 5.0, M5: 5.0 };

export type NutChoice = 'hex' | 'thin' | 'locking';
export type Nut = Readonly<{ standard: NutStandard; heightMm: number; acrossFlatsMm: number }>;

/**
 * The nut of the chosen kind. Locking nuts below M3 fall back to the regular hex nut (ISO 7040
 * starts at M3).
 * @example nut('M3', 'locking') // { standard: 'ISO 7040', heightMm: 4, acrossFlatsMm: 5.5 }
 */
export function nut(size: ScrewSize, choice: NutChoice): Nut {
  const s = NUT_S_MM[size];
  if (choice === 'locking' && ISO_7040_H[size] !== undefined) return { standard: 'ISO 7040', heightMm: ISO_7040_H[size]!, acrossFlatsMm: s };
  if (choice === 'thin') return { standard: 'ISO 4035', heightMm: ISO_4035_M[size], acrossFlatsMm: s };
  return { standard: 'ISO 4032', heightMm: ISO_4032_M[size], acrossFlatsMm: s };
}

/**
 * ISO 4762 preferred nominal lengths (reference-values.md; 55 and 60 from memory). 14, 18 and 22 mm
 * exist commercially but are outside the preferred series.
 */
export const PREFERRED_LENGTHS_MM = [3, 4, 5, 6, 8, 10, 12, 16, 20, 25, 30, 35, 40, 45, 50, 55, 60] as const;

/** The shortest preferred length of at least `minMm`, or null when the series ends first. mm. */
export function shortestPreferredLength(minMm: number): number | null {
  // A length equal to the need (within float noise) is enough.
  return PREFERRED_LENGTHS_MM.find((l) => l >= minMm - 1e-9) ?? null;
}

/** The longest preferred length of at most `maxMm`, or null when even the shortest is longer. mm. */
export function longestPreferredLength(maxMm: number): number | null {
  const fits = PREFERRED_LENGTHS_MM.filter((l) => l <= maxMm + 1e-9);
  return fits.length ? fits[fits.length - 1] : null;
}

export type Washer = Readonly<{ standard: 'ISO 7089'; innerMm: number; outerMm: number; thicknessMm: number }>;

/** ISO 7089 plain washers, normal series: d1 / d2 / h (from memory). */
const ISO_7089: Record<ScrewSize, [number, number, number]> = { M2: [2.2, 5, 0.3], 'M2.5': [2.7, 6, 0.5], M3: [3.2, 7, 0.5], M4: [4.3, 9, 0.8], M5: [5.3, 10, 1] };

/** The ISO 7089 washer for a screw size. */
export function washer(size: ScrewSize): Washer {
  const [innerMm, outerMm, thicknessMm] = ISO_7089[size];
  return { standard: 'ISO 7089', innerMm, outerMm, thicknessMm };
}

/** Tap drill for the coarse thread (ISO 2306 practice: d − P, from memory), the bore of a tapped standoff. mm. */
export const tapDrillMm = (s: ScrewSize): number => Math.round((Number(s.slice(1)) - PITCH_MM[s]) * 100) / 100;

/** Pitch diameter d2 = d − 0.6495 P (ISO 724), used for the volume of a threaded shank. mm. */
export const pitchDiameterMm = (s: ScrewSize): number => Number(s.slice(1)) - 0.649519 * PITCH_MM[s];
