import type { Design } from '../params/design.js';
import { nominalDiameterMm } from '../params/screws.js';
import { motorSites, wheelbaseOf } from '../geometry/layout.js';
import { ceilToStep, scaledLayout } from './layoutScale.js';
import { stackCentre } from '../geometry/frame.js';
import type { Vec2 } from '../geometry/types.js';
import { dist } from '../geometry/vec.js';
import type { Change } from './changes.js';
import { VariantRequestError } from './errors.js';

/**
 * Body length in a variant: kept, unless the variant's props would come closer to what stands
 * between the plates (standoffs, the flight-controller stack) than the source allowed. The auto
 * wheelbase already avoids that, so this only happens for a wheelbase given by the user: the body is
 * then shortened just enough, and every fore-aft position on the body and top plate moves with it
 * (sizes, patterns and widths stay; the camera follows the front standoffs; an H layout's arm
 * starts move with it).
 */

/** Outer radius of a standoff around its screw: M3 aluminium standoffs are about 5–6 mm across. common practice, from memory. */
const standoffRadiusMm = (d: Design): number => nominalDiameterMm(d.body.standoffs.boltSize);
/** Stack boards reach about 3 mm beyond their bolt centres. common practice, no source. */
const STACK_BOARD_MARGIN_MM = 3;

/** Things between the plates as circles in plan view (frame coordinates, mm). */
function obstacles(d: Design): Array<{ at: Vec2; radiusMm: number; what: string }> {
  const out: Array<{ at: Vec2; radiusMm: number; what: string }> = [];
  d.body.standoffs.positionsMm.forEach((p, i) => out.push({ at: p, radiusMm: standoffRadiusMm(d), what: `standoff ${i}` }));
  d.stacks.forEach((s, i) => {
    const c = stackCentre(d, i);
    const h = Math.max(...s.patternsMm) / 2;
    for (const [sx, sy] of [[1, 1], [1, -1], [-1, 1], [-1, -1]]) out.push({ at: [c[0] + sx * h, c[1] + sy * h], radiusMm: STACK_BOARD_MARGIN_MM, what: `stack ${i}` });
  });
  return out;
}

/** Smallest plan-view clearance between any prop disc and anything standing between the plates. mm (negative: they overlap). */
export function propBodyClearanceMm(d: Design, propDiameterMm: number): { clearanceMm: number; what: string } {
  let best = { clearanceMm: Infinity, what: '' };
  for (const s of motorSites(d)) {
    for (const o of obstacles(d)) {
      const c = dist(s.motorMm, o.at) - propDiameterMm / 2 - o.radiusMm;
      if (c < best.clearanceMm) best = { clearanceMm: c, what: `${s.id} prop to ${o.what}` };
    }
  }
  return best;
}

/** Fore-aft positions on the body and top plate, as design paths with their x values. */
function xPositions(d: Design): Array<{ path: (string | number)[]; value: number }> {
  const out: Array<{ path: (string | number)[]; value: number }> = [];
  d.body.standoffs.positionsMm.forEach((p, i) => out.push({ path: ['body', 'standoffs', 'positionsMm', i, 0], value: p[0] }));
  d.stacks.forEach((s, i) => {
    if (typeof s.place === 'number') out.push({ path: ['stacks', i, 'place'], value: s.place });
  });
  if (d.layout.kind === 'h') {
    out.push({ path: ['layout', 'frontArmStartMm', 0], value: d.layout.frontArmStartMm[0] });
    out.push({ path: ['layout', 'rearArmStartMm', 0], value: d.layout.rearArmStartMm[0] });
  }
  d.components.forEach((c, i) => {
    if ('atMm' in c && c.atMm) out.push({ path: ['components', i, 'atMm', 0], value: c.atMm[0] });
    if (c.kind === 'battery') out.push({ path: ['components', i, 'xMm'], value: c.xMm });
  });
  const t = d.topPlate;
  t.strapSlots.xPositionsMm.forEach((x, i) => out.push({ path: ['topPlate', 'strapSlots', 'xPositionsMm', i], value: x }));
  if (t.leadOpening) out.push({ path: ['topPlate', 'leadOpening', 'xMm'], value: t.leadOpening.xMm });
  t.accessoryHoles.forEach((h, i) => out.push({ path: ['topPlate', 'accessoryHoles', i, 'atMm', 0], value: h.atMm[0] }));
  t.lightening.forEach((c, i) => out.push({ path: ['topPlate', 'lightening', i, 'atMm', 0], value: c.atMm[0] }));
  return out;
}

/** The design with its body shortened by `factor` (positions scaled, sizes kept), in memory. */
export function shortenedBody(d: Design, factor: number): Design {
  const scaleX = (p: readonly [number, number]) => [p[0] * factor, p[1]] as [number, number];
  const L = d.layout;
  const layout = L.kind === 'h' ? { ...L, frontArmStartMm: scaleX(L.frontArmStartMm), rearArmStartMm: scaleX(L.rearArmStartMm) } : L;
  return {
    ...d,
    layout,
    body: { ...d.body, lengthMm: d.body.lengthMm * factor, standoffs: { ...d.body.standoffs, positionsMm: d.body.standoffs.positionsMm.map(scaleX) } },
    stacks: d.stacks.map((s) => ({ ...s, place: typeof s.place === 'number' ? s.place * factor : s.place })),
  };
}

export type BodyFit = Readonly<{
  sourceClearanceMm: number;
  requiredClearanceMm: number;
  clearanceMm: number;
  /** New body length over old (1: kept). */
  factor: number;
  /** Smallest wheelbase (1 mm steps) at which the body could stay as it is. mm. */
  keepBodyWheelbaseMm: number;
  changes: readonly Change[];
  line: string;
}>;

/** Clearance the variant's props must keep from the body hardware: the source's, capped at the design's tip gap. mm. */
export function requiredBodyClearanceMm(source: Design, variant: Design): number {
  return Math.min(propBodyClearanceMm(source, source.props.diameterMm).clearanceMm, variant.props.minTipGapMm);
}

/**
 * Smallest wheelbase (layout shape kept) at which every prop clears the body hardware by
 * `requiredMm` with the body as it is. Searched from a wheelbase that clears downwards until the
 * first one that does not, then bisected to 1e-9 of the wheelbase: the smallest of the largest
 * clearing interval, so a wheelbase above it never strikes. mm.
 */
export function bodyKeptWheelbaseMm(d: Design, requiredMm: number): number {
  const w = wheelbaseOf(motorSites(d));
  const clears = (f: number) => propBodyClearanceMm({ ...d, layout: scaledLayout(d, f) }, d.props.diameterMm).clearanceMm >= requiredMm;
  let hi = 1;
  while (!clears(hi)) {
    hi *= 1.25;
    if (hi > 1e3) return Infinity;
  }
  let lo = hi;
  const stepDown = 0.005;
  while (lo > stepDown && clears(lo - stepDown)) lo -= stepDown;
  // clears(lo) and not clears(lo − step) (or lo is tiny): bisect the boundary.
  let fail = Math.max(lo - stepDown, 0);
  if (fail <= 0) return lo * w;
  for (let i = 0; i < 60; i++) {
    const mid = (fail + lo) / 2;
    if (clears(mid)) lo = mid;
    else fail = mid;
  }
  return lo * w;
}

const round2 = (x: number) => Math.round(x * 100) / 100;

/**
 * Shorten the variant's body when its props would crowd the standoffs or stack more than the
 * source's did (required clearance: the source's, capped at the design's tip gap). Throws
 * VariantRequestError when no shortening achieves it (the body is too wide for the props).
 */
export function fitBody(source: Design, variant: Design): BodyFit {
  const src = propBodyClearanceMm(source, source.props.diameterMm);
  const required = requiredBodyClearanceMm(source, variant);
  const now = propBodyClearanceMm(variant, variant.props.diameterMm);
  const base = { sourceClearanceMm: src.clearanceMm, requiredClearanceMm: required, keepBodyWheelbaseMm: ceilToStep(bodyKeptWheelbaseMm(variant, required), 1) };
  if (now.clearanceMm >= required - 1e-9) {
    return { ...base, clearanceMm: now.clearanceMm, factor: 1, changes: [], line: `Body: kept (props clear standoffs and stack by ${now.clearanceMm.toFixed(1)} mm; source ${src.clearanceMm.toFixed(1)} mm).` };
  }
  // Largest factor that clears: scan down (clearance need not be monotonic), then refine.
  const ok = (f: number) => propBodyClearanceMm(shortenedBody(variant, f), variant.props.diameterMm).clearanceMm >= required;
  let hi = 1;
  let lo = 0;
  for (let f = 1; f >= 0.2; f -= 0.0025) {
    if (ok(f)) {
      lo = f;
      break;
    }
    hi = f;
  }
  if (lo === 0) {
    throw new VariantRequestError(
      '--props',
      `${(variant.props.diameterMm / 25.4).toFixed(2)} in`,
      `would strike the body hardware (${now.what}, ${now.clearanceMm.toFixed(1)} mm) even with the body shortened to a fifth; the body (width ${variant.body.widthMm} mm, its stacks and standoffs) is too big for these props: give --wheelbase ${base.keepBodyWheelbaseMm} or more to keep the body`,
    );
  }
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    if (ok(mid)) lo = mid;
    else hi = mid;
  }
  // Length rounded down to 0.5 mm; every position scaled by the same factor, except that the body
  // grows back as far as the battery's strap slots need (see `batteryHold`).
  const propLength = Math.floor((variant.body.lengthMm * lo) / 0.5) * 0.5;
  const hold = batteryHold(variant, propLength / variant.body.lengthMm);
  const length = Math.max(propLength, Math.ceil((variant.body.lengthMm * hold.factor) / 0.5 - 1e-9) * 0.5);
  const factor = length / variant.body.lengthMm;
  const grown = length > propLength;
  const why = `props would crowd the body hardware (${now.what}: ${now.clearanceMm.toFixed(1)} mm, need ${required.toFixed(1)}); body shortened ×${factor.toFixed(3)}${grown ? `, ${(length - propLength).toFixed(1)} mm longer than that so the battery's strap slots stay on the top plate` : ''}`;
  const changes: Change[] = [{ path: ['body', 'lengthMm'], old: variant.body.lengthMm, new: length, why }];
  if (variant.topPlate.lengthMm !== undefined) changes.push({ path: ['topPlate', 'lengthMm'], old: variant.topPlate.lengthMm, new: Math.ceil((variant.topPlate.lengthMm * factor) / 0.5 - 1e-9) * 0.5, why: 'follows the body length' });
  const slots = batteryHold(variant, factor).slots;
  for (const p of xPositions(variant)) {
    const slot = p.path[1] === 'strapSlots' ? slots.get(p.value) : undefined;
    if (slot !== undefined) changes.push({ path: p.path, old: p.value, new: round2(slot), why: 'strap slot keeps its distance from the battery (the battery does not shrink with the body)' });
    else changes.push({ path: p.path, old: p.value, new: round2(p.value * factor), why: 'position moves with the body length (size kept)' });
  }
  const after = propBodyClearanceMm(shortenedBody(variant, factor), variant.props.diameterMm);
  return { ...base, clearanceMm: after.clearanceMm, factor, changes, line: `Body: shortened from ${variant.body.lengthMm} to ${length} mm so props clear standoffs and stack by ${after.clearanceMm.toFixed(1)} mm (required ${required.toFixed(1)} mm, the source's clearance capped at the tip gap)${grown ? `; ${(length - propLength).toFixed(1)} mm of it kept to hold the battery's strap slots` : ''}.` };
}

/**
 * A battery strapped on the top plate keeps its length when the body is shortened, so its strap
 * slots keep their distance from its centre (the centre moves with the body) rather than closing
 * in on it. The slots must stay on the top plate with a margin beyond them (the source's, at most the
 * web the checks warn below): the least
 * body factor (≥ `factor`) at which they do, and each slot's new x keyed by its old x.
 */
export function batteryHold(d: Design, factor: number): { factor: number; slots: Map<number, number> } {
  const battery = d.components.find((c) => c.kind === 'battery');
  const xs = d.topPlate.strapSlots.xPositionsMm;
  if (!battery || battery.kind !== 'battery' || battery.side !== 'top' || xs.length === 0) return { factor, slots: new Map(xs.map((x) => [x, x * factor])) };
  const w = d.topPlate.strapSlots.slotWidthMm ?? 3;
  const plate = d.topPlate.lengthMm ?? d.body.lengthMm;
  const reach = (f: number) => Math.max(...xs.map((x) => Math.abs(battery.xMm * f + (x - battery.xMm)))) + w / 2;
  // The source's margin beyond the outer slot, but no more than the web the checks ask of the top plate
  // (warning level: the larger of minMm and perThickness × t, times warnFactor).
  const web = d.checks['web-width'];
  const webMm = Math.max(web.minMm, web.perThickness * d.topPlate.thicknessMm) * web.warnFactor;
  const margin = Math.min(Math.max(0, plate / 2 - reach(1)), webMm);
  // The reach shrinks as the factor grows (the battery moves out with it), so a few passes settle.
  let f = factor;
  for (let i = 0; i < 20; i++) f = Math.min(1, Math.max(factor, (2 * (reach(f) + margin)) / plate));
  return { factor: f, slots: new Map(xs.map((x) => [x, battery.xMm * f + (x - battery.xMm)])) };
}
