import { assertNever } from '../geometry/types.js';
import { cantileverFrequencyHz, cantileverTipDeflectionMm } from '../analysis/beam.js';
import type { Design } from '../params/design.js';
import { clearanceHoleMm } from '../params/screws.js';
import { armBeams, armPlateThicknessMm, type ArmBeam } from './armModel.js';
import type { Change } from './changes.js';
import { VariantRequestError } from './errors.js';
import { ceilToStep } from './layoutScale.js';

/**
 * The stiffness rule for variant arms: keep the first bending frequency of the softest arm, with its
 * motor as tip mass, at or above the source design's. Frequency, not deflection, because a frame's
 * lowest arm mode is what the flight controller's filters must stay clear of, and it already
 * includes the motor's mass. Thickness is snapped to stocked sheet; widths (all arm widths scaled by
 * one factor, so the arm keeps its proportions) absorb the rest and are rounded up to WIDTH_STEP_MM.
 */

/** Carbon plate thicknesses a shop commonly stocks. mm. common practice, no source. */
export const STOCK_THICKNESSES_MM = [0.5, 0.8, 1, 1.5, 2, 2.5, 3, 4, 5, 6] as const;

/** Arm widths are written in multiples of this. mm. */
export const WIDTH_STEP_MM = 0.5;

/** One width parameter of the arms, with the range it may take. */
type WidthParam = Readonly<{ path: readonly string[]; value: number; minMm: number; maxMm: number }>;

/** The width parameters the rule scales for the arm style, with their allowed ranges. */
export function armWidthParams(d: Design): WidthParam[] {
  const a = d.arms;
  // Root bolts in a straight or tapered separate arm: e/D ≥ 1.5 both sides, the suggested error
  // limit for hole edge distance (reference-values.md), so width ≥ 3 D.
  const rootMin = a.construction === 'separate' ? 3 * clearanceHoleMm(a.root.boltSize, d.cutting.holeSeries) : 4;
  switch (a.style) {
    case 'straight':
      return [{ path: ['arms', 'widthMm'], value: a.widthMm!, minMm: Math.max(4, rootMin), maxMm: 60 }];
    case 'tapered':
      return [
        { path: ['arms', 'widthMm'], value: a.widthMm!, minMm: Math.max(4, rootMin), maxMm: 60 },
        { path: ['arms', 'tipWidthMm'], value: a.tipWidthMm ?? a.widthMm!, minMm: 4, maxMm: 60 },
      ];
    case 'truss': {
      const t = a.truss!;
      return [
        { path: ['arms', 'truss', 'mainWidthMm'], value: t.mainWidthMm, minMm: 3, maxMm: 40 },
        { path: ['arms', 'truss', 'secondaryWidthMm'], value: t.secondaryWidthMm, minMm: 3, maxMm: 40 },
        { path: ['arms', 'truss', 'spreadMm'], value: t.spreadMm, minMm: Math.max(4, rootMin), maxMm: 80 },
      ];
    }
    default:
      return assertNever(a.style);
  }
}

/** The design with arm widths and plate thickness replaced (in memory, for evaluation). */
export function withArmSize(d: Design, widths: readonly number[], thicknessMm: number): Design {
  const params = armWidthParams(d);
  const arms = { ...d.arms, truss: d.arms.truss ? { ...d.arms.truss } : undefined } as Record<string, unknown> & { truss?: Record<string, unknown> };
  params.forEach((p, i) => {
    if (p.path.length === 2) arms[p.path[1]] = widths[i];
    else arms.truss![p.path[2]] = widths[i];
  });
  if (d.arms.construction === 'unibody') {
    return { ...d, arms: { ...(arms as Design['arms']), thicknessMm }, body: { ...d.body, thicknessMm } };
  }
  return { ...d, arms: { ...(arms as Design['arms']), thicknessMm } };
}

/** The softest arm and its first bending frequency. */
export function softestArm(d: Design, tipMassG: number): { beam: ArmBeam; frequencyHz: number } {
  const beams = armBeams(d, tipMassG);
  for (const b of beams) {
    if (!(b.lengthMm > 0)) {
      throw new VariantRequestError('--props', `${b.site} arm`, `would leave no free arm: the motor sits ${(-b.lengthMm).toFixed(1)} mm inside the clamped root (arms.root / body); the wheelbase is too small for this body`);
    }
  }
  const rated = beams.map((beam) => ({ beam, frequencyHz: cantileverFrequencyHz(beam) }));
  return rated.reduce((a, b) => (b.frequencyHz < a.frequencyHz ? b : a));
}

export type ArmSizing = Readonly<{
  targetHz: number;
  source: { beam: ArmBeam; frequencyHz: number };
  /** Thickness that keeps the frequency with all arm proportions scaled together. mm. */
  idealThicknessMm: number;
  thicknessMm: number;
  /** Width scale factor before rounding. */
  widthFactor: number;
  widths: readonly number[];
  achieved: { beam: ArmBeam; frequencyHz: number };
  /** Tip deflection of the softest arm under 1 N, source and variant (for the printout). mm/N. */
  complianceMmPerN: readonly [number, number];
  met: boolean;
  /** The widths stopped at their lower limit (root bolts or strut minimum), so f1 is above the target by more than a snapping step. */
  atMinimumWidth: boolean;
  changes: readonly Change[];
  /** Human-readable statement of the rule and its numbers. */
  lines: readonly string[];
}>;

function bisect(f: (x: number) => number, target: number, lo: number, hi: number): number {
  // f increasing; returns the smallest x (to float precision) with f(x) ≥ target.
  for (let i = 0; i < 200 && hi - lo > 1e-13 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (f(mid) >= target) hi = mid;
    else lo = mid;
  }
  return hi;
}

/**
 * Size the variant's arms by the rule. `source` is the original design with its motor mass;
 * `variant` has the new layout and motor. Stock thicknesses are tried nearest the ideal first; with
 * `buildable`, a size whose plates cannot be built (e.g. a truss too cramped for its fillets) is
 * passed over for the next. Throws VariantRequestError when an arm has no free length.
 */
export function sizeArms(source: Design, sourceTipMassG: number, variant: Design, variantTipMassG: number, buildable?: (d: Design) => boolean): ArmSizing {
  const src = softestArm(source, sourceTipMassG);
  const target = src.frequencyHz;
  const params = armWidthParams(variant);
  const w0 = params.map((p) => p.value);
  const t0 = armPlateThicknessMm(variant);
  const freq = (k: number, t: number) => softestArm(withArmSize(variant, w0.map((w) => w * k), t), variantTipMassG).frequencyHz;

  // Ideal: every arm dimension (widths and thickness) scaled by one factor c; f grows with c.
  const c = bisect((x) => freq(x, t0 * x), target, 0.01, 100);
  const idealT = t0 * c;
  const kLo = Math.max(...params.map((p) => p.minMm / p.value));
  const kHi = Math.min(...params.map((p) => p.maxMm / p.value));
  const candidates = [...STOCK_THICKNESSES_MM].sort((a, b) => Math.abs(Math.log(a / idealT)) - Math.abs(Math.log(b / idealT)) || b - a);
  let chosen: { t: number; k: number; met: boolean } | null = null;
  let firstMeeting: { t: number; k: number; met: boolean } | null = null;
  const rounded = (k: number) => params.map((p, i) => Math.min(p.maxMm, Math.max(p.minMm, ceilToStep(w0[i] * k, WIDTH_STEP_MM))));
  if (kLo <= kHi) {
    for (const t of candidates) {
      if (freq(kHi, t) < target) continue;
      const k = freq(kLo, t) >= target ? kLo : bisect((x) => freq(x, t), target, kLo, kHi);
      firstMeeting ??= { t, k, met: true };
      if (buildable && !buildable(withArmSize(variant, rounded(k), t))) continue;
      chosen = { t, k, met: true };
      break;
    }
  }
  chosen ??= firstMeeting;
  // Nothing meets the target: the stiffest arm allowed (thickest stock, widest widths), flagged.
  if (!chosen) chosen = { t: STOCK_THICKNESSES_MM[STOCK_THICKNESSES_MM.length - 1], k: kLo <= kHi ? kHi : kLo, met: false };
  const widths = rounded(chosen.k);
  const sized = withArmSize(variant, widths, chosen.t);
  const achieved = softestArm(sized, variantTipMassG);

  const unibody = variant.arms.construction === 'unibody';
  const why = `stiffness rule: arm f1 ≥ source ${target.toFixed(1)} Hz`;
  const changes: Change[] = params.map((p, i) => ({ path: p.path, old: p.value, new: widths[i], why }));
  changes.push({ path: ['arms', 'thicknessMm'], old: variant.arms.thicknessMm, new: chosen.t, why: `${why}; stocked sheet` });
  if (unibody) changes.push({ path: ['body', 'thicknessMm'], old: variant.body.thicknessMm, new: chosen.t, why: `${why}; unibody arms are cut from the bottom plate` });

  const b = (x: ArmBeam) => `L ${x.lengthMm.toFixed(1)} mm, width ${x.widthMm.toFixed(2)} mm, t ${x.thicknessMm} mm, E ${x.modulusGpa.toFixed(1)} GPa, motor ${x.tipMassG} g`;
  const compliance: [number, number] = [cantileverTipDeflectionMm(src.beam, 1), cantileverTipDeflectionMm(achieved.beam, 1)];
  const lines = [
    'Stiffness rule: keep the first bending frequency of the softest arm (Euler-Bernoulli cantilever from the clamp, motor as tip mass,',
    '  exact tip-mass frequency equation) at or above the source design\'s; thickness snapped to stock, widths scaled together, rounded up to 0.5 mm.',
    `  source  ${src.beam.site}: ${b(src.beam)} -> f1 ${src.frequencyHz.toFixed(1)} Hz, tip deflection ${compliance[0].toFixed(4)} mm/N`,
    `  ideal thickness ${idealT.toFixed(2)} mm -> stock ${chosen.t} mm (stock list ${STOCK_THICKNESSES_MM.join(', ')} mm, common practice); width factor ${chosen.k.toFixed(3)}`,
    `  variant ${achieved.beam.site}: ${b(achieved.beam)} -> f1 ${achieved.frequencyHz.toFixed(1)} Hz, tip deflection ${compliance[1].toFixed(4)} mm/N`,
  ];
  const atMinimumWidth = chosen.k <= kLo + 1e-12;
  if (atMinimumWidth) lines.push(`  widths at their lower limit (${params.map((p) => `${p.path[p.path.length - 1]} ≥ ${p.minMm.toFixed(1)} mm`).join(', ')}), so f1 is above the target`);
  if (!chosen.met) lines.push(`  NOT MET: the stiffest allowed arm (${chosen.t} mm, widths at their limits) reaches ${achieved.frequencyHz.toFixed(1)} Hz of ${target.toFixed(1)} Hz`);
  return { targetHz: target, source: src, idealThicknessMm: idealT, thicknessMm: chosen.t, widthFactor: chosen.k, widths, achieved, complianceMmPerN: compliance, met: chosen.met, atMinimumWidth, changes, lines };
}
