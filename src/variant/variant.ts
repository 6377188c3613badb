import { checkOptions, propClearanceRule, propDiscs } from '../checks/index.js';
import { buildFrame, type Frame } from '../geometry/frame.js';
import { motorSites, wheelbaseOf } from '../geometry/layout.js';
import { partMassG } from '../geometry/metrics.js';
import { parseDesignText, type Design } from '../params/design.js';
import { DesignError } from '../params/errors.js';
import { MM_PER_INCH, parseLengthMm } from '../params/units.js';
import { editDesignText, realChanges, type Change } from './changes.js';
import { VariantRequestError } from './errors.js';
import { ceilToStep, minTipGapMm, minWheelbaseMm, scaledLayout } from './layoutScale.js';
import { chooseMotor, type MotorChoice } from './motor.js';
import { sizeArms, type ArmSizing } from './stiffness.js';
import { bodyKeptWheelbaseMm, fitBody, fitBodyWidthForH, requiredBodyClearanceMm, type BodyFit } from './body.js';

/** What the user asks for. Lengths in mm; `props` as written ("7in", "178mm"). */
export type VariantRequest = Readonly<{
  props: string;
  /** 'auto' (default): the smallest wheelbase keeping the design's tip gap; or a wheelbase in mm. */
  wheelbase?: 'auto' | number;
  /** Auto wheelbase is rounded up to a multiple of this (0: exact). mm. Default 1. */
  wheelbaseStepMm?: number;
  /** Motor size class ("2207", "22xx", "20xx-24xx") or "auto"; omitted keeps the motor. */
  motor?: string;
}>;

/** Auto wheelbases are rounded up to whole millimetres unless asked otherwise. mm. */
export const DEFAULT_WHEELBASE_STEP_MM = 1;

export type VariantResult = Readonly<{
  /** The new design file (YAML; comments and key order of the source kept). */
  text: string;
  design: Design;
  frame: Frame;
  sourceDesign: Design;
  sourceFrame: Frame;
  propDiameterMm: number;
  wheelbase: Readonly<{ minimumMm: number; bodyKeptMm: number; bound: 'tip gap' | 'body clearance' | 'requested'; chosenMm: number; stepMm: number; requestedGapMm: number; achievedGapMm: number; sourceMm: number }>;
  motor: MotorChoice;
  arms: ArmSizing;
  body: BodyFit;
  /** Every edit made to the design file (only real changes). */
  changes: readonly Change[];
  massG: number;
  sourceMassG: number;
}>;

/** Total mass of every plate copy. g. */
export const frameMassG = (f: Frame): number => f.parts.reduce((a, p) => a + partMassG(p) * p.quantity, 0);

/** Prop diameter text as the user wrote it → mm, with the range the design file allows. */
export function parsePropsOption(text: string): number {
  const mm = parseLengthMm(text);
  if (mm === null) throw new VariantRequestError('--props', text, 'is not a length; write it with a unit, e.g. 7in, 5.1in or 178mm');
  if (mm < 25 || mm > 600) {
    throw new VariantRequestError('--props', text, `is ${mm} mm, outside 25 to 600 mm (1 to 23.6 in)${/^\s*[0-9.]+\s*$/.test(text) ? '; a bare number is millimetres, write 7in for inches' : ''}`);
  }
  return mm;
}

/**
 * The smallest wheelbase from `startMm` up, in `stepMm` steps, at which the checks' prop-clearance
 * rule finds no error (layout shape kept, arms as they are: they do not move the props). A layout
 * whose plates cannot be built yet (the arms are sized later) cannot be judged here, so the search
 * stops there and the later build reports it. mm. Throws VariantRequestError when 400 steps do not
 * clear the props.
 */
function clearOfParts(d: Design, startMm: number, stepMm: number): number {
  const base = wheelbaseOf(motorSites(d));
  const options = checkOptions({ toolDiameterMm: d.cutting.toolDiameterMm, limits: d.checks, minTipGapMm: d.props.minTipGapMm });
  for (let wb = startMm, k = 0; k < 400; k++, wb = ceilToStep(wb + stepMm, stepMm)) {
    let frame: Frame;
    try {
      frame = buildFrame({ ...d, layout: scaledLayout(d, wb / base) });
    } catch (e) {
      if (e instanceof DesignError) return wb;
      throw e;
    }
    if (!propClearanceRule(frame, options, propDiscs(frame)).some((f) => f.severity === 'error')) return wb;
  }
  throw new VariantRequestError('--wheelbase', 'auto', `found no wheelbase from ${startMm} mm up to ${(startMm + 400 * stepMm).toFixed(0)} mm at which the props clear the frame parts (prop-clearance rule); check the body and camera plates`);
}

/** "Tessel 5" → "Tessel 5 (7in)"; an earlier "(…)" size suffix is replaced, so variants of variants stay tidy. */
export function variantName(name: string, propsText: string): string {
  const base = name.replace(/\s*\([0-9.]+\s*(in|mm|cm)\)\s*$/i, '');
  return `${base} (${propsText.trim()})`;
}

/**
 * Make a size variant of a design: new props, wheelbase from the tip gap, motor from the table when
 * asked, arms by the stiffness rule, body only where the new prop clearances need it; hardware kept.
 * Pure: text in, text and data out. Throws VariantRequestError for impossible requests and
 * DesignError when the source is invalid or the variant cannot be built.
 */
export function makeVariant(sourceText: string, req: VariantRequest, sourceName = 'design'): VariantResult {
  const source = parseDesignText(sourceText, sourceName);
  const sourceFrame = buildFrame(source);
  let text = sourceText;
  const propMm = parsePropsOption(req.props);
  const step = req.wheelbaseStepMm ?? DEFAULT_WHEELBASE_STEP_MM;
  if (!(step >= 0) || step > 50) throw new VariantRequestError('--wheelbase-step', step, 'must be from 0 (exact) to 50 mm');
  const changes: Change[] = [];
  const edit = (cs: readonly Change[]): Design => {
    text = editDesignText(text, cs);
    changes.push(...realChanges(cs));
    return parseDesignText(text, 'variant');
  };

  // 1. Props, name and motor.
  const motor = chooseMotor(source, req.motor, propMm);
  const propsText = req.props.trim();
  let cur = edit([
    { path: ['name'], old: source.name, new: variantName(source.name, propsText), why: 'names the size' },
    { path: ['props', 'diameter'], old: source.props.diameter, new: propsText, why: `requested (${(propMm / MM_PER_INCH).toFixed(2)} in = ${propMm.toFixed(1)} mm)` },
    ...motor.changes,
  ]);

  // 2. Wheelbase: the tip gap, and (auto) the props' clearance to the body hardware, layout shape kept.
  const gap = cur.props.minTipGapMm;
  const minimumMm = minWheelbaseMm(cur, propMm, gap);
  const bodyClearanceMm = requiredBodyClearanceMm(source, cur);
  const bodyKeptMm = bodyKeptWheelbaseMm(cur, bodyClearanceMm);
  let chosenMm: number;
  let wbWhy: string;
  let bound: 'tip gap' | 'body clearance' | 'requested';
  if (req.wheelbase === undefined || req.wheelbase === 'auto') {
    bound = bodyKeptMm > minimumMm ? 'body clearance' : 'tip gap';
    chosenMm = ceilToStep(Math.max(minimumMm, bodyKeptMm), step);
    wbWhy =
      bound === 'tip gap'
        ? `smallest keeping the ${gap} mm tip gap (${minimumMm.toFixed(2)} mm), rounded up to ${step} mm`
        : `smallest keeping the props ${bodyClearanceMm.toFixed(1)} mm clear of the standoffs and stack with the body kept (${bodyKeptMm.toFixed(2)} mm; tip gap alone: ${minimumMm.toFixed(2)} mm), rounded up to ${step} mm`;
    // The checks' own prop-clearance rule has the last word (it also sees the camera side plates
    // and the plates' heights): grow the wheelbase in steps until it finds no strike.
    const raised = clearOfParts(cur, chosenMm, Math.max(step, 0.5));
    if (raised > chosenMm) {
      wbWhy += `; raised to ${raised} mm so no prop comes closer to a frame part than the prop-clearance rule allows`;
      chosenMm = raised;
      bound = 'body clearance';
    }
  } else {
    if (!(req.wheelbase > 0) || req.wheelbase < minimumMm - 1e-9) {
      throw new VariantRequestError('--wheelbase', req.wheelbase, `is below the clearance minimum ${minimumMm.toFixed(2)} mm: ${propsText} props need it for the design's ${gap} mm tip gap (props.minTipGapMm)`);
    }
    bound = 'requested';
    chosenMm = req.wheelbase;
    wbWhy = `requested (minimum for the ${gap} mm tip gap: ${minimumMm.toFixed(2)} mm; body kept from ${bodyKeptMm.toFixed(2)} mm)`;
  }
  const factor = chosenMm / wheelbaseOf(motorSites(cur));
  const L = cur.layout;
  const newLayout = scaledLayout(cur, factor);
  const layoutChanges: Change[] = [];
  if (L.kind === 'asymmetric' && newLayout.kind === 'asymmetric') {
    // Reaches are written to 0.001 mm, rounded up so the gap never drops below the target.
    layoutChanges.push({ path: ['layout', 'front', 'reachMm'], old: L.front.reachMm, new: ceilToStep(newLayout.front.reachMm, 0.001), why: `wheelbase ${chosenMm.toFixed(2)} mm: ${wbWhy}; shape kept` });
    layoutChanges.push({ path: ['layout', 'rear', 'reachMm'], old: L.rear.reachMm, new: ceilToStep(newLayout.rear.reachMm, 0.001), why: 'scaled with the front reach (shape kept)' });
  } else if (L.kind !== 'asymmetric') {
    layoutChanges.push({ path: ['layout', 'wheelbaseMm'], old: L.wheelbaseMm, new: chosenMm, why: wbWhy });
  }
  cur = edit(layoutChanges);

  // 3. Body: only what the new layout and prop clearances need.
  cur = edit(fitBodyWidthForH(source, cur));
  const body = fitBody(source, cur);
  cur = edit(body.changes);

  // 4. Arms by the stiffness rule.
  // Buildable with the design's root fillet or a smaller one the build step below may fall back to.
  const minFillet = ceilToStep(cur.cutting.toolDiameterMm / 2, 0.5);
  const buildable = (d: Design): boolean => {
    for (let f = d.arms.rootFilletMm; ; f -= 0.5) {
      try {
        buildFrame({ ...d, arms: { ...d.arms, rootFilletMm: f } });
        return true;
      } catch (e) {
        if (!(e instanceof DesignError)) throw e;
        if (!e.issues.some((i) => i.path === 'arms.rootFilletMm') || f - 0.5 < minFillet) return false;
      }
    }
  };
  const arms = sizeArms(source, source.motorMassG, cur, cur.motorMassG, buildable);
  cur = edit(arms.changes);

  // 5. Build. A slimmer arm may have no room for the source's root fillet: reduce it in 0.5 mm
  // steps, never below the router bit's radius (an inside corner cannot be sharper).
  let frame: Frame | null = null;
  for (;;) {
    try {
      frame = buildFrame(cur);
      break;
    } catch (e) {
      if (!(e instanceof DesignError)) throw e;
      const filletAtFault = e.issues.some((i) => i.path === 'arms.rootFilletMm');
      const next = cur.arms.rootFilletMm - 0.5;
      if (filletAtFault && next >= minFillet) {
        cur = edit([{ path: ['arms', 'rootFilletMm'], old: cur.arms.rootFilletMm, new: next, why: `the resized arm has no room for a ${cur.arms.rootFilletMm} mm fillet (kept ≥ bit radius ${minFillet} mm)` }]);
        continue;
      }
      const hint = body.factor < 1 ? `; the body had to be shortened to ${cur.body.lengthMm} mm for the props to clear its standoffs and stack, and its hardware no longer fits: give --wheelbase ${body.keepBodyWheelbaseMm} or more to keep the body` : '';
      throw new VariantRequestError('--props', propsText, `gives a variant that cannot be built${hint}:\n${e.message}`);
    }
  }
  const design = cur;
  // Merge repeated edits of one key (the fillet steps) into one row: first old, last new.
  const merged = new Map<string, Change>();
  for (const c of changes) {
    const key = c.path.join('.');
    const prev = merged.get(key);
    merged.set(key, prev ? { ...c, old: prev.old } : c);
  }
  changes.length = 0;
  changes.push(...realChanges([...merged.values()]));
  return {
    text,
    design,
    frame,
    sourceDesign: source,
    sourceFrame,
    propDiameterMm: propMm,
    wheelbase: { minimumMm, bodyKeptMm, bound, chosenMm, stepMm: step, requestedGapMm: gap, achievedGapMm: minTipGapMm(frame.sites, propMm), sourceMm: wheelbaseOf(sourceFrame.sites) },
    motor,
    arms,
    body,
    changes,
    massG: frameMassG(frame),
    sourceMassG: frameMassG(sourceFrame),
  };
}
