import { cantileverFrequencyHz, cantileverTipDeflectionMm } from '../analysis/beam.js';
import { fullThrustN, rotationBandFromTipSpeed, type RotationBand } from '../analysis/rotation.js';
import { assertNever } from '../geometry/types.js';
import type { Design } from '../params/design.js';
import { ceilTo } from '../params/derived.js';
import { clearanceHoleMm } from '../params/screws.js';
import { bestWeave } from '../checks/weave.js';
import { motorSites } from '../geometry/layout.js';
import type { Member } from '../geometry/part.js';
import { armBeams, armPlateThicknessMm, type ArmBeam } from './armModel.js';
import { VariantRequestError } from './errors.js';

/**
 * The arm size rule. Each arm is a cantilever from where the plates stop clamping it to its motor
 * (see armModel.ts). A variant's arm must be
 * 1. stiff against what shakes it: the motors turn in a top rotation band that falls as 1/D with
 *    the prop diameter D at a given blade tip speed (../analysis/rotation.ts), so the arm's first
 *    bending frequency keeps the source arm's place relative to that band:
 *    f1 ≥ f1_source · f_band(D) / f_band(D_source) = f1_source · D_source / D;
 * 2. stiff against its motor's thrust: the tip deflection under THRUST_MARGIN × full thrust (the
 *    prop at the top of its band) over the free length stays within the source arm's ratio, or
 *    MAX_TIP_DEFLECTION_FRACTION when the source is stiffer than that.
 * Both are what a frame scaled in every dimension keeps exactly (f1 ∝ 1/size, thrust ∝ D², so
 * deflection/length is unchanged); the rule keeps them while the hardware keeps its size.
 * Of the sections meeting both (every stock thickness from MIN_ARM_STOCK_MM; all arm widths scaled
 * by one factor, each strut at least as wide as the plate is thick and at most twice the source's)
 * the lightest is tried first; the variant takes the first that builds and passes every check.
 */

/** Carbon plate thicknesses a shop commonly stocks. mm. Common practice, no source. */
export const STOCK_THICKNESSES_MM = [0.5, 0.8, 1, 1.5, 2, 2.5, 3, 4, 5, 6] as const;
/** Arms are cut from this stock up; thinner sheet is for covers and small plates. mm. Common practice, no source. */
export const MIN_ARM_STOCK_MM = 1.5;
/** Arm widths are written in multiples of this. mm. */
export const WIDTH_STEP_MM = 0.5;
/** No arm width grows beyond this multiple of the source's: past it the arm is another design (thicker, or another style). */
export const MAX_WIDTH_FACTOR = 2;
/** Thrust margin for the deflection criterion (manoeuvres and gusts above full static thrust). Common practice, no source. */
export const THRUST_MARGIN = 2;
/** Tip deflection under THRUST_MARGIN × full thrust, as a fraction of the free length, that is always allowed (the motor axis then tilts under 0.9°). Common practice, no source. */
export const MAX_TIP_DEFLECTION_FRACTION = 0.01;

/** The rule's numbers for one variant size. Frequencies Hz, forces N. */
export type SizeRule = Readonly<{
  sourcePropMm: number;
  propMm: number;
  /** First bending frequency of the source's softest arm with its motor. */
  sourceHz: number;
  sourceBand: RotationBand;
  band: RotationBand;
  /** The source arm's f1 over the top of its rotation band; the variant keeps it. */
  bandRatio: number;
  requiredHz: number;
  fullThrustN: number;
  /** THRUST_MARGIN × full thrust: the load of the deflection criterion. */
  designThrustN: number;
  /** The source arm's tip deflection over free length under its own THRUST_MARGIN × full thrust. */
  sourceDeflectionRatio: number;
  /** What the variant may reach: the larger of the source's ratio and MAX_TIP_DEFLECTION_FRACTION. */
  allowedDeflectionRatio: number;
}>;

/** The softest arm of a design (lowest first bending frequency with its motor). */
export function softestArm(d: Design, tipMassG: number): { beam: ArmBeam; frequencyHz: number } {
  const beams = armBeams(d, tipMassG);
  for (const b of beams) {
    if (!(b.lengthMm > 0)) {
      throw new VariantRequestError('--props', `${b.site} arm`, `would leave no free arm: the motor sits ${(-b.lengthMm).toFixed(1)} mm inside the clamped root (arms.root / body); the wheelbase is too small for this body`);
    }
  }
  return beams.map((beam) => ({ beam, frequencyHz: cantileverFrequencyHz(beam) })).reduce((a, b) => (b.frequencyHz < a.frequencyHz ? b : a));
}

/** The rule for a variant of `source` with props of `propMm`. */
export function sizeRule(source: Design, propMm: number): SizeRule {
  const src = softestArm(source, source.motorMassG);
  const sourceBand = rotationBandFromTipSpeed(source.props.diameterMm);
  const band = rotationBandFromTipSpeed(propMm);
  const bandRatio = src.frequencyHz / sourceBand.highHz;
  const thrust = fullThrustN(propMm);
  const sourceDeflectionRatio = worstDeflection(source, THRUST_MARGIN * fullThrustN(source.props.diameterMm)).ratio;
  return {
    sourcePropMm: source.props.diameterMm,
    propMm,
    sourceHz: src.frequencyHz,
    sourceBand,
    band,
    bandRatio,
    requiredHz: bandRatio * band.highHz,
    fullThrustN: thrust,
    designThrustN: THRUST_MARGIN * thrust,
    sourceDeflectionRatio,
    allowedDeflectionRatio: Math.max(sourceDeflectionRatio, MAX_TIP_DEFLECTION_FRACTION),
  };
}

/** The arm whose tip deflection under `forceN`, over its free length, is largest. */
function worstDeflection(d: Design, forceN: number): { deflectionMm: number; lengthMm: number; ratio: number } {
  let worst = { deflectionMm: 0, lengthMm: 1, ratio: -Infinity };
  for (const b of armBeams(d, d.motorMassG)) {
    const deflectionMm = cantileverTipDeflectionMm(b, forceN);
    if (deflectionMm / b.lengthMm > worst.ratio) worst = { deflectionMm, lengthMm: b.lengthMm, ratio: deflectionMm / b.lengthMm };
  }
  return worst;
}

/** How an arm section fares against the rule: the softest arm's f1 and the worst deflection ratio. */
export type RuleMeasure = Readonly<{ frequencyHz: number; beam: ArmBeam; deflectionMm: number; allowedDeflectionMm: number; met: boolean }>;

/** Measure a design's arms against the rule. */
export function measureArms(d: Design, rule: SizeRule): RuleMeasure {
  const soft = softestArm(d, d.motorMassG);
  const worst = worstDeflection(d, rule.designThrustN);
  const met = soft.frequencyHz >= rule.requiredHz * (1 - 1e-12) && worst.ratio <= rule.allowedDeflectionRatio * (1 + 1e-12);
  return { frequencyHz: soft.frequencyHz, beam: soft.beam, deflectionMm: worst.deflectionMm, allowedDeflectionMm: rule.allowedDeflectionRatio * worst.lengthMm, met };
}

/** One width parameter of the arms, the range it may take, and whether it is a strut (at least as wide as the plate is thick). */
export type WidthParam = Readonly<{ path: readonly string[]; value: number; minMm: number; maxMm: number; strut: boolean }>;

/** The width parameters the rule scales for the arm style, with their fixed limits. */
export function armWidthParams(d: Design): WidthParam[] {
  const a = d.arms;
  // Root bolts on a separate arm's centreline keep the hole-edge rule's error e/D on both sides.
  const rootMin = a.construction === 'separate' ? 2 * d.checks['hole-edge-distance'].errorEdgeRatio * clearanceHoleMm(a.root.boltSize, d.cutting.holeSeries) : 4;
  switch (a.style) {
    case 'straight':
      return [{ path: ['arms', 'widthMm'], value: a.widthMm!, minMm: Math.max(4, rootMin), maxMm: 60, strut: true }];
    case 'tapered':
      return [
        { path: ['arms', 'widthMm'], value: a.widthMm!, minMm: Math.max(4, rootMin), maxMm: 60, strut: true },
        { path: ['arms', 'tipWidthMm'], value: a.tipWidthMm ?? a.widthMm!, minMm: 4, maxMm: 60, strut: true },
      ];
    case 'truss': {
      const t = a.truss!;
      return [
        { path: ['arms', 'truss', 'mainWidthMm'], value: t.mainWidthMm, minMm: 3, maxMm: 40, strut: true },
        { path: ['arms', 'truss', 'secondaryWidthMm'], value: t.secondaryWidthMm, minMm: 3, maxMm: 40, strut: true },
        { path: ['arms', 'truss', 'spreadMm'], value: t.spreadMm, minMm: Math.max(4, rootMin), maxMm: 80, strut: false },
      ];
    }
    default:
      return assertNever(a.style);
  }
}

/**
 * The design with arm widths, plate thickness and (optionally) the arm plate's weave angle replaced
 * (in memory, for evaluation). Unibody arms set the bottom plate's thickness and weave.
 */
export function withArmSize(d: Design, widths: readonly number[], thicknessMm: number, weaveDeg?: number): Design {
  const params = armWidthParams(d);
  const shape: Record<string, number> = {};
  const truss: Record<string, number> = {};
  params.forEach((p, i) => {
    if (p.path.length === 2) shape[p.path[1]] = widths[i];
    else truss[p.path[2]] = widths[i];
  });
  const a = d.arms;
  const trussNow = a.truss ? { ...a.truss, ...truss } : undefined;
  if (a.construction === 'unibody') return { ...d, arms: { ...a, ...shape, truss: trussNow }, body: { ...d.body, thicknessMm, weaveDeg: weaveDeg ?? d.body.weaveDeg } };
  return { ...d, arms: { ...a, ...shape, truss: trussNow, thicknessMm, weaveDeg: weaveDeg ?? a.weaveDeg } };
}

/** The weave angle of the plate the arms are cut from (the bottom plate for unibody frames). deg. */
export const armPlateWeaveDeg = (d: Design): number => (d.arms.construction === 'unibody' ? d.body.weaveDeg : d.arms.weaveDeg);

/**
 * Weave angles worth trying for the arm plate: the design's, and the one that lays the arms best
 * along the fibres (laminate theory, the weave rule's own search) when it differs by more than 1°.
 * Separate arms run along their part's x axis; unibody arms at their own angles on the bottom plate.
 */
export function armWeaveOptions(d: Design): number[] {
  const now = armPlateWeaveDeg(d);
  const dirs = d.arms.construction === 'unibody' ? motorSites(d).map((s) => s.armDirRad) : [0];
  const members: Member[] = dirs.map((a, i) => ({ name: `arm ${i}`, startMm: [0, 0], endMm: [Math.cos(a), Math.sin(a)], widthMm: 1 }));
  const material = d.materialFor(d.arms.construction === 'unibody' ? d.body.material : d.arms.material);
  const best = bestWeave(material, members).weaveDeg;
  return Math.abs(best - now) > 1 ? [now, best] : [now];
}

/**
 * Widths of the source scaled by k, rounded up to the step and kept within [lo, hi] per parameter.
 * A truss's spread is not scaled: it is the struts plus the source's gap between them at the root
 * (the window keeps the width the bit enters by; the clamp grows only by what the struts add), and
 * it carries no bending in the beam model, so scaling it would only add mass.
 */
export function scaledWidths(params: readonly WidthParam[], k: number, lo: readonly number[], hi: readonly number[]): number[] {
  const out = params.map((p, i) => (p.strut ? Math.min(hi[i], Math.max(lo[i], ceilTo(p.value * k, WIDTH_STEP_MM))) : p.value));
  if (params.length === 3 && !params[2].strut) {
    const gap = params[2].value - params[0].value - params[1].value;
    out[2] = Math.min(hi[2], Math.max(lo[2], ceilTo(out[0] + out[1] + gap, WIDTH_STEP_MM)));
  }
  return out;
}

/** A truss window must stay wide enough at the root for the bit to enter: spread − struts − the 2 mm of insets ≥ bit + 2 × bit radius of fillets. */
function trussWindowOk(d: Design, widths: readonly number[]): boolean {
  if (d.arms.style !== 'truss') return true;
  const [main, sec, spread] = widths;
  return spread - main - sec - 2 >= 2 * d.cutting.toolDiameterMm;
}

/**
 * Whether a tapered separate arm is still wide enough at its outermost root bolt for the hole-edge
 * rule's error e/D on both sides (the taper narrows it towards the motor). Other arms: true.
 */
function rootBoltsHeld(d: Design): boolean {
  const a = d.arms;
  if (a.construction !== 'separate' || a.style !== 'tapered') return true;
  const need = 2 * d.checks['hole-edge-distance'].errorEdgeRatio * clearanceHoleMm(a.root.boltSize, d.cutting.holeSeries);
  const w0 = a.widthMm!;
  const w1 = a.tipWidthMm ?? w0;
  const x = a.root.edgeMarginMm + (a.root.boltCount - 1) * a.root.boltSpacingMm;
  return motorSites(d).every((s) => {
    const length = s.motorAlongMm - (a.root.reachMm - a.root.edgeMarginMm);
    return w0 + ((w1 - w0) * x) / length >= need - 1e-9;
  });
}

/** One arm section the rule allows: thickness, weave angle of the arm plate, width factor, the rounded widths. */
export type ArmSection = Readonly<{
  thicknessMm: number;
  weaveDeg: number;
  widthFactor: number;
  widths: readonly number[];
  measure: RuleMeasure;
  massIndex: number;
  /** The design with this section, as placed (arm roots moved out where they need room). */
  design: Design;
}>;

/**
 * The lightest section meeting the rule at each stock thickness, lightest first. `prepare` applies
 * anything that follows from a section before it is measured (e.g. moving the arm roots out so
 * wider roots keep clear of each other); it returns null when the section cannot be placed.
 * Bisects the width factor (the rule's criteria grow with it) and rounds widths up to WIDTH_STEP_MM.
 */
export function armSections(variant: Design, rule: SizeRule, prepare: (d: Design) => Design | null = (d) => d): ArmSection[] {
  const params = armWidthParams(variant);
  const out: ArmSection[] = [];
  for (const weave of armWeaveOptions(variant)) for (const t of STOCK_THICKNESSES_MM) {
    if (t < MIN_ARM_STOCK_MM) continue;
    const lo = params.map((p) => Math.max(p.minMm, p.strut ? t : 0));
    const hi = params.map((p) => Math.min(p.maxMm, ceilTo(MAX_WIDTH_FACTOR * p.value, WIDTH_STEP_MM)));
    if (lo.some((l, i) => l > hi[i])) continue;
    type At = { kind: 'narrow' } | { kind: 'no room' } | { kind: 'placed'; d: Design; m: RuleMeasure };
    // Widths are rounded to a step, so many k give the same section: each is placed and measured once.
    const seen = new Map<string, At>();
    const at = (k: number): At => {
      const widths = scaledWidths(params, k, lo, hi);
      const key = widths.join(',');
      const known = seen.get(key);
      if (known) return known;
      let r: At;
      if (!trussWindowOk(variant, widths)) r = { kind: 'narrow' };
      else {
        const d = prepare(withArmSize(variant, widths, t, weave));
        r = !d ? { kind: 'no room' } : rootBoltsHeld(d) ? { kind: 'placed', d, m: measureArms(d, rule) } : { kind: 'narrow' };
      }
      seen.set(key, r);
      return r;
    };
    // Smallest k in [a, b] from which `holds` is true, bisected on the rounded widths (a step function).
    const firstFrom = (a: number, b: number, holds: (k: number) => boolean): number => {
      if (holds(a)) return a;
      for (let i = 0; i < 40 && b - a > 1e-4; i++) {
        const mid = (a + b) / 2;
        if (holds(mid)) b = mid;
        else a = mid;
      }
      return b;
    };
    let kLo = Math.max(...params.map((p, i) => (p.strut ? lo[i] / p.value : 0)));
    let kHi = Math.min(...params.map((p, i) => (p.strut ? hi[i] / p.value : Infinity)));
    if (!(kLo <= kHi)) continue;
    // A truss needs a window the bit can enter (narrow below some k); wider arms may not fit side by side (no room above some k).
    if (at(kHi).kind === 'narrow') continue;
    kLo = firstFrom(kLo, kHi, (k) => at(k).kind !== 'narrow');
    if (at(kLo).kind === 'no room') continue;
    if (at(kHi).kind === 'no room') {
      let fits = kLo;
      for (let i = 0; i < 40 && kHi - fits > 1e-4; i++) {
        const mid = (fits + kHi) / 2;
        if (at(mid).kind === 'placed') fits = mid;
        else kHi = mid;
      }
      kHi = fits;
    }
    const met = (k: number) => {
      const r = at(k);
      return r.kind === 'placed' && r.m.met;
    };
    if (!met(kHi)) continue;
    const b = firstFrom(kLo, kHi, met);
    const best = at(b) as Extract<At, { kind: 'placed' }>;
    const widths = scaledWidths(params, b, lo, hi);
    out.push({ thicknessMm: t, weaveDeg: weave, widthFactor: b, widths, measure: best.m, massIndex: armMassIndex(best.d), design: best.d });
  }
  return out.sort((p, q) => p.massIndex - q.massIndex || q.thicknessMm - p.thicknessMm);
}

/**
 * A quantity proportional to the mass that an arm section moves (for ranking sections, not for
 * reporting): plate thickness × effective width × arm length over all arms, plus the bottom plate
 * when the arms are cut from it. mm³.
 */
function armMassIndex(d: Design): number {
  const beams = armBeams(d, d.motorMassG);
  const t = armPlateThicknessMm(d);
  const arms = beams.reduce((s, b) => s + b.widthMm * (b.lengthMm + 2 * b.widthMm), 0) * t;
  return d.arms.construction === 'unibody' ? arms + d.body.lengthMm * d.body.widthMm * t : arms;
}

/** The rule as printed text lines (what it requires and why). */
export function ruleLines(rule: SizeRule): string[] {
  const inch = (mm: number) => (mm / 25.4).toFixed(2);
  return [
    'Arm size rule: each arm a cantilever from its clamp with its motor at the tip (Euler-Bernoulli, exact tip-mass frequency equation).',
    `  1. f1 keeps the source arm's place under the motors' rotation band, which falls as 1/D at a given tip speed:`,
    `     source ${rule.sourceHz.toFixed(1)} Hz at ${inch(rule.sourcePropMm)} in (band ${rule.sourceBand.lowHz.toFixed(0)}-${rule.sourceBand.highHz.toFixed(0)} Hz, ratio ${rule.bandRatio.toFixed(3)}) -> f1 >= ${rule.requiredHz.toFixed(1)} Hz at ${inch(rule.propMm)} in (band ${rule.band.lowHz.toFixed(0)}-${rule.band.highHz.toFixed(0)} Hz)`,
    `  2. tip deflection under ${THRUST_MARGIN} x full thrust (${rule.fullThrustN.toFixed(1)} N at the band's top) <= ${(100 * rule.allowedDeflectionRatio).toFixed(2)} % of the free length (source ${(100 * rule.sourceDeflectionRatio).toFixed(2)} %, never required below ${MAX_TIP_DEFLECTION_FRACTION * 100} %)`,
    `  lightest section first: stock ${STOCK_THICKNESSES_MM.filter((t) => t >= MIN_ARM_STOCK_MM).join(', ')} mm (common practice), widths scaled together, struts >= plate thickness, <= ${MAX_WIDTH_FACTOR} x source, rounded up to ${WIDTH_STEP_MM} mm`,
  ];
}
