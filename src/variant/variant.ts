import { checkFrame, checkOptions, propClearanceRule, propDiscs, type CheckReport, type Finding } from '../checks/index.js';
import { buildFrame, type Frame } from '../geometry/frame.js';
import { motorSites, wheelbaseOf } from '../geometry/layout.js';
import { partMassG } from '../geometry/metrics.js';
import { parseDesignText, type Design } from '../params/design.js';
import { DesignError } from '../params/errors.js';
import { PROP_TABLE_RANGE_IN } from '../params/motorTable.js';
import { motorBoreMm } from '../params/derived.js';
import { MM_PER_INCH, parseLengthMm } from '../params/units.js';
import { editDesignText, realChanges, type Change } from './changes.js';
import { VariantRefusal, VariantRequestError } from './errors.js';
import { ceilToStep, minTipGapMm, minWheelbaseMm, scaledLayout } from './layoutScale.js';
import { chooseMotor, type MotorChoice } from './motor.js';
import { clampFurtherOut, withRootRoom } from './rootRoom.js';
import { armRuleAlternatives, armRuleConstraint, checkAlternatives, sourceErrorHint } from './refusal.js';
import { armSections, armWidthParams, measureArms, ruleLines, sizeRule, type ArmSection, type RuleMeasure, type SizeRule } from './sizeRule.js';
import { bodyKeptWheelbaseMm, fitBody, requiredBodyClearanceMm, type BodyFit } from './body.js';

/** What the user asks for. Lengths in mm; `props` as written ("7in", "178mm"). */
export type VariantRequest = Readonly<{
  props: string;
  /** 'auto' (default): the smallest wheelbase keeping the design's tip gap; or a wheelbase in mm. */
  wheelbase?: 'auto' | number;
  /** Auto wheelbase is rounded up to a multiple of this (0: exact). mm. Default 1. */
  wheelbaseStepMm?: number;
  /** "auto" (default: from the prop-size table), "keep", or a motor size class ("2207", "22xx", "20xx-24xx"). */
  motor?: string;
}>;

/** Auto wheelbases are rounded up to whole millimetres unless asked otherwise. mm. */
export const DEFAULT_WHEELBASE_STEP_MM = 1;

/** The resolution of an "exact" (step 0) auto wheelbase. mm. */
const EXACT_STEP_MM = 1e-6;

/** Arm sections built and checked before the variant is refused (lightest first). */
const MAX_CHECKED_SECTIONS = 8;

/** The arm rule's outcome. */
export type ArmResult = Readonly<{
  rule: SizeRule;
  section: ArmSection;
  /** The variant's arms (after rounding, root moves and fillet easing) against the rule. */
  measure: RuleMeasure;
  /** The source's arms against the same rule (its own f1 and its deflection under the new thrust). */
  sourceMeasure: RuleMeasure;
  /** Root reach of separate arms, source and variant (moved out when wider roots need the room). mm. */
  rootReachMm: readonly [number, number] | null;
  /** Sections checked before one passed. */
  tried: number;
  lines: readonly string[];
}>;

export type VariantResult = Readonly<{
  /** The new design file (YAML; comments and key order of the source kept). */
  text: string;
  design: Design;
  frame: Frame;
  /** Every check on the variant (0 errors: a variant is only returned when it passes). */
  report: CheckReport;
  sourceDesign: Design;
  sourceFrame: Frame;
  propDiameterMm: number;
  wheelbase: WheelbaseChoice & Readonly<{ achievedGapMm: number }>;
  motor: MotorChoice;
  arms: ArmResult;
  body: BodyFit;
  /** Every edit made to the design file (only real changes). */
  changes: readonly Change[];
  massG: number;
  sourceMassG: number;
}>;

/** Total mass of every plate copy. g. */
export const frameMassG = (f: Frame): number => f.parts.reduce((a, p) => a + partMassG(p) * p.quantity, 0);

/** Prop sizes a variant may take: the prop-size table's range. mm. */
export const VARIANT_PROP_RANGE_MM = [PROP_TABLE_RANGE_IN[0] * MM_PER_INCH, PROP_TABLE_RANGE_IN[1] * MM_PER_INCH] as const;

/** Prop diameter text as the user wrote it → mm, within the prop-size table's 1 to 13 in. Throws VariantRequestError. */
export function parsePropsOption(text: string): number {
  const mm = parseLengthMm(text);
  if (mm === null) throw new VariantRequestError('--props', text, 'is not a length; write it with a unit, e.g. 7in, 5.1in or 178mm');
  const [lo, hi] = VARIANT_PROP_RANGE_MM;
  if (mm < lo - 0.01 || mm > hi + 0.01) {
    const bare = /^\s*[0-9.]+\s*$/.test(text) ? '; a bare number is millimetres, write 7in for inches' : '';
    throw new VariantRequestError('--props', text, `is ${Number(mm.toFixed(2))} mm (${Number((mm / MM_PER_INCH).toFixed(2))} in), outside ${PROP_TABLE_RANGE_IN[0]} to ${PROP_TABLE_RANGE_IN[1]} in (${lo} to ${hi} mm)${bare}`);
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
  // Clear (or not yet judgeable) at startMm + n steps: moving the props out only opens their clearances.
  const clear = (n: number): boolean => {
    let frame: Frame;
    try {
      frame = buildFrame({ ...d, layout: scaledLayout(d, wb(n) / base) });
    } catch (e) {
      if (e instanceof DesignError) return true;
      throw e;
    }
    return !propClearanceRule(frame, options, propDiscs(frame)).some((f) => f.severity === 'error');
  };
  const wb = (n: number): number => (n === 0 ? startMm : ceilToStep(startMm + n * stepMm, stepMm));
  if (clear(0)) return startMm;
  // Double the step until clear, then halve back to one step.
  let bad = 0;
  let good = 1;
  while (!clear(good)) {
    bad = good;
    good *= 2;
    if (good > 400) throw new VariantRequestError('--wheelbase', 'auto', `found no wheelbase from ${startMm} mm up to ${wb(400).toFixed(0)} mm at which the props clear the frame parts (prop-clearance rule); check the body and camera plates`);
  }
  while (good - bad > 1) {
    const mid = Math.floor((good + bad) / 2);
    if (clear(mid)) good = mid;
    else bad = mid;
  }
  return wb(good);
}

/** "Tessel 5" → "Tessel 5 (7in)"; an earlier "(…)" size suffix is replaced, so variants of variants stay tidy. */
export function variantName(name: string, propsText: string): string {
  const base = name.replace(/\s*\([0-9.]+\s*(in|mm|cm)\)\s*$/i, '');
  return `${base} (${propsText.trim()})`;
}

/** Design text and its parsed design after some edits; the edits are collected. */
type Draft = Readonly<{ text: string; design: Design; changes: readonly Change[] }>;

function applyEdits(draft: Draft, cs: readonly Change[]): Draft {
  const text = editDesignText(draft.text, cs);
  return { text, design: parseDesignText(text, 'variant'), changes: [...draft.changes, ...realChanges(cs)] };
}

/** Merge repeated edits of one key (the fillet steps) into one row: first old, last new. */
function mergedChanges(changes: readonly Change[]): Change[] {
  const merged = new Map<string, Change>();
  for (const c of changes) {
    const key = c.path.join('.');
    const prev = merged.get(key);
    merged.set(key, prev ? { ...c, old: prev.old } : c);
  }
  return realChanges([...merged.values()]);
}

/**
 * Build, easing the root fillet in 0.5 mm steps (never below the router bit's radius: an inside
 * corner cannot be sharper) when a resized arm has no room for it. Throws the DesignError when the
 * fillet is not at fault or cannot go lower.
 */
function buildEasingFillet(draft: Draft): { draft: Draft; frame: Frame } {
  const minFillet = ceilToStep(draft.design.cutting.toolDiameterMm / 2, 0.5);
  let cur = draft;
  for (;;) {
    try {
      return { draft: cur, frame: buildFrame(cur.design) };
    } catch (e) {
      if (!(e instanceof DesignError)) throw e;
      const next = cur.design.arms.rootFilletMm - 0.5;
      if (!e.issues.some((i) => i.path === 'arms.rootFilletMm') || next < minFillet) throw e;
      cur = applyEdits(cur, [{ path: ['arms', 'rootFilletMm'], old: cur.design.arms.rootFilletMm, new: next, why: `the resized arm has no room for a ${cur.design.arms.rootFilletMm} mm fillet (kept ≥ bit radius ${minFillet} mm)` }]);
    }
  }
}

/** The edits that give the design an arm section (widths, plate thickness, root reach). */
function sectionChanges(d: Design, placed: Design, s: ArmSection, rule: SizeRule, wantedBoreMm: number): Change[] {
  const why = `arm size rule: f1 ≥ ${rule.requiredHz.toFixed(1)} Hz, tip deflection ≤ ${s.measure.allowedDeflectionMm.toFixed(2)} mm; lightest passing section`;
  const out: Change[] = armWidthParams(d).map((p, i) => ({ path: p.path, old: p.value, new: s.widths[i], why }));
  if (d.arms.construction === 'separate') {
    out.push({ path: ['arms', 'thicknessMm'], old: d.arms.thicknessMm, new: s.thicknessMm, why: `${why}; stocked sheet` });
    out.push({ path: ['arms', 'weaveDeg'], old: d.arms.weaveDeg, new: s.weaveDeg, why: 'weave laid along the arm: stiffer for its mass (laminate theory)' });
    if (placed.arms.construction === 'separate' && placed.arms.root.reachMm !== d.arms.root.reachMm) {
      out.push({ path: ['arms', 'root', 'reachMm'], old: d.arms.root.reachMm, new: placed.arms.root.reachMm, why: `roots moved out so the wider arm roots keep clear of each other and of the other brace` });
    }
  } else {
    out.push({ path: ['body', 'thicknessMm'], old: d.body.thicknessMm, new: s.thicknessMm, why: `${why}; stocked sheet (unibody arms are cut from the bottom plate)` });
    out.push({ path: ['body', 'weaveDeg'], old: d.body.weaveDeg, new: s.weaveDeg, why: 'weave turned to lay the arms along the fibres: stiffer arms for their mass (laminate theory); the weave rule suggests the same angle' });
    // Heights on the frame are measured from the bottom plate's lower face: the camera stays where it was over the plate's top face.
    if (d.camera) out.push({ path: ['camera', 'pivotHeightMm'], old: d.camera.pivotHeightMm, new: Number((d.camera.pivotHeightMm + s.thicknessMm - d.body.thicknessMm).toFixed(3)), why: 'keeps the camera at its height over the thicker (or thinner) bottom plate' });
  }
  // The bore the motor wants, as large as the web rule allows on this plate (the derived default's rule).
  const bore = motorBoreMm(d.motor.boltCircleMm, d.motor.boltSize, d.cutting.holeSeries, d.checks, s.thicknessMm, wantedBoreMm);
  if (bore !== d.motor.boreMm) out.push({ path: ['motor', 'boreMm'], old: d.motor.boreMm, new: bore, why: `${wantedBoreMm} mm bore for the motor${bore < wantedBoreMm ? `, kept to ${bore} mm for the web rule's web to the bolt holes on the ${s.thicknessMm} mm plate` : ''}` });
  return out;
}

const errorsOf = (r: CheckReport): Finding[] => r.findings.filter((f) => f.severity === 'error');
const findingText = (f: Finding): string => `${f.rule}${f.part ? ` on ${f.part}` : ''}: ${f.message}`;

/**
 * Make a size variant of a design: new props; motor from the prop-size table (unless kept or
 * named); wheelbase from the tip gap and the props' clearance; body only where a given wheelbase
 * needs it; arms by the size rule, lightest passing section first; hardware kept. Every check runs
 * on the result and has the last word. Pure: text in, text and data out.
 * Throws VariantRequestError for impossible requests (bad input), VariantRefusal when no variant
 * passes every check (naming the constraint and the nearest valid alternative), DesignError when
 * the source is invalid.
 */
export function makeVariant(sourceText: string, req: VariantRequest, sourceName = 'design'): VariantResult {
  return variantOrRefusal(sourceText, req, sourceName, true);
}

/** Wheelbase outcome: the minimum for the tip gap, the least that keeps the body, what set it, and the result. mm. */
export type WheelbaseChoice = Readonly<{ minimumMm: number; bodyKeptMm: number; bound: 'tip gap' | 'body clearance' | 'requested'; chosenMm: number; stepMm: number; requestedGapMm: number; sourceMm: number }>;

/** The first steps of a variant (props and name, motor, wheelbase, body), before the arms are sized. */
export type VariantPlan = Readonly<{
  source: Design;
  sourceFrame: Frame;
  propMm: number;
  propsText: string;
  motor: MotorChoice;
  wheelbase: WheelbaseChoice;
  body: BodyFit;
  /** The design file so far: `text`, its `design`, and the changes made. */
  text: string;
  design: Design;
  changes: readonly Change[];
}>;

/**
 * Props, name and motor; wheelbase from the tip gap and the props' clearance (layout shape kept);
 * the body only where a given wheelbase needs it. The arms are as in the source. Throws
 * VariantRequestError for impossible requests.
 */
export function planVariant(sourceText: string, req: VariantRequest, sourceName = 'design'): VariantPlan {
  const source = parseDesignText(sourceText, sourceName);
  const sourceFrame = buildFrame(source);
  const propMm = parsePropsOption(req.props);
  const step = req.wheelbaseStepMm ?? DEFAULT_WHEELBASE_STEP_MM;
  if (!(step >= 0) || step > 50) throw new VariantRequestError('--wheelbase-step', step, 'must be from 0 (exact) to 50 mm');
  const propsText = req.props.trim();

  // 1. Props, name and motor.
  const motor = chooseMotor(source, req.motor, propMm);
  let draft = applyEdits({ text: sourceText, design: source, changes: [] }, [
    { path: ['name'], old: source.name, new: variantName(source.name, propsText), why: 'names the size' },
    { path: ['props', 'diameter'], old: source.props.diameter, new: propsText, why: `requested (${(propMm / MM_PER_INCH).toFixed(2)} in = ${propMm.toFixed(1)} mm)` },
    ...motor.changes,
  ]);

  // 2. Wheelbase: the tip gap, and (auto) the props' clearance to the body hardware, layout shape kept.
  const cur = draft.design;
  const gap = cur.props.minTipGapMm;
  const minimumMm = minWheelbaseMm(cur, propMm, gap);
  const bodyClearanceMm = requiredBodyClearanceMm(source, cur);
  const bodyKeptMm = bodyKeptWheelbaseMm(cur, bodyClearanceMm);
  let chosenMm: number;
  let wbWhy: string;
  let bound: 'tip gap' | 'body clearance' | 'requested';
  if (req.wheelbase === undefined || req.wheelbase === 'auto') {
    bound = bodyKeptMm > minimumMm ? 'body clearance' : 'tip gap';
    // "Exact" (step 0) is written to the micrometre, rounded up, so float noise cannot put the gap a hair under.
    chosenMm = ceilToStep(Math.max(minimumMm, bodyKeptMm), step > 0 ? step : EXACT_STEP_MM);
    wbWhy =
      bound === 'tip gap'
        ? `smallest keeping the ${gap} mm tip gap (${minimumMm.toFixed(2)} mm), rounded up to ${step} mm`
        : `smallest keeping the props ${bodyClearanceMm.toFixed(1)} mm clear of the standoffs and stack with the body kept (${bodyKeptMm.toFixed(2)} mm; tip gap alone: ${minimumMm.toFixed(2)} mm), rounded up to ${step} mm`;
    // The checks' own prop-clearance rule has the last word on the wheelbase (it also sees the
    // camera side plates and the plates' heights): grow it in steps until the rule finds no strike.
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
  draft = applyEdits(draft, layoutChanges);

  // 3. Body: only what the new layout and prop clearances need.
  const body = fitBody(source, draft.design);
  draft = applyEdits(draft, body.changes);
  const wheelbase = { minimumMm, bodyKeptMm, bound, chosenMm, stepMm: step, requestedGapMm: gap, sourceMm: wheelbaseOf(sourceFrame.sites) };
  return { source, sourceFrame, propMm, propsText, motor, wheelbase, body, ...draft };
}

function variantOrRefusal(sourceText: string, req: VariantRequest, sourceName: string, withAlternatives: boolean): VariantResult {
  const plan = planVariant(sourceText, req, sourceName);
  const { source, sourceFrame, propMm, propsText, motor, body } = plan;
  let draft: Draft = { text: plan.text, design: plan.design, changes: plan.changes };
  let cur = draft.design;

  // 4. Arms by the size rule; 5. every check has the last word.
  const rule = sizeRule(source, propMm);
  let sections = armSections(cur, rule, withRootRoom);
  if (sections.length === 0) {
    // Separate arms: the clamp moves out (the bottom plate's arm pads and the braces grow with it)
    // to the smallest whole-millimetre root reach at which the rule can be met.
    const moved = clampFurtherOut(cur, rule, withRootRoom);
    if (moved) {
      draft = applyEdits(draft, [moved.change]);
      cur = draft.design;
      sections = moved.sections;
    }
  }
  if (sections.length === 0) {
    const near = () => nearestPassingProps(sourceText, req, sourceName);
    throw new VariantRefusal(propsText, armRuleConstraint(cur, rule, withRootRoom), withAlternatives ? alternatives([...sourceErrorHint(source), ...armRuleAlternatives(cur, rule, withRootRoom)], near, 'none found: change the arm style or the motor') : 'none searched', null);
  }
  // The motor's own bore: the new class's when the motor changed, else the source's.
  const wantedBore = motor.changes.length && motor.variantClass !== motor.sourceClass ? motor.variantClass.boreMm : source.motor.boreMm;
  type Accepted = { draft: Draft; frame: Frame; report: CheckReport; section: ArmSection; index: number };
  let firstFailure: { draft: Draft | null; report: CheckReport | null; problem: string } | null = null;
  // Build and check sections in order; the first with no check error is taken.
  const firstPassing = (list: readonly ArmSection[]): Accepted | null => {
    for (const [index, section] of list.slice(0, MAX_CHECKED_SECTIONS).entries()) {
      let built: { draft: Draft; frame: Frame };
      try {
        built = buildEasingFillet(applyEdits(draft, sectionChanges(cur, section.design, section, rule, wantedBore)));
      } catch (e) {
        if (!(e instanceof DesignError)) throw e;
        firstFailure ??= { draft: null, report: null, problem: `the ${section.thicknessMm} mm arm cannot be built: ${e.message}` };
        continue;
      }
      const report = checkFrame(built.frame);
      if (report.summary.errors === 0) return { ...built, report, section, index };
      firstFailure ??= { draft: built.draft, report, problem: errorsOf(report).slice(0, 3).map(findingText).join('; ') };
    }
    return null;
  };
  let accepted = firstPassing(sections);
  // Roots moved out for room make sections possible that were not at the old reach: search again
  // from where the roots now are until nothing lighter passes, so a variant of this variant at the
  // same size finds the same arms (the search has a fixed point).
  for (let round = 0; accepted && round < 3; round++) {
    const d = accepted.section.design;
    if (d.arms.construction !== 'separate' || cur.arms.construction !== 'separate' || d.arms.root.reachMm === cur.arms.root.reachMm) break;
    const reach = d.arms.root.reachMm;
    const lighter = armSections({ ...cur, arms: { ...cur.arms, root: { ...cur.arms.root, reachMm: reach } } }, rule, withRootRoom).filter((s) => s.massIndex < accepted!.section.massIndex * (1 - 1e-3));
    const better = lighter.length ? firstPassing(lighter) : null;
    if (!better) break;
    accepted = better;
  }
  if (!accepted) {
    const failure = firstFailure!;
    const n = failure.report ? errorsOf(failure.report).length : 0;
    const constraint = failure.report ? `every check (${n} error${n === 1 ? '' : 's'} on the lightest arm that meets the size rule: ${failure.problem})` : `a buildable arm (${failure.problem})`;
    const attempt = failure.draft && failure.report ? { text: failure.draft.text, errors: failure.report.summary.errors, warnings: failure.report.summary.warnings } : null;
    const near = () => nearestPassingProps(sourceText, req, sourceName);
    // A wheelbase the user gave that fails: the one auto would choose, when that variant passes.
    const autoWheelbase = (): string | null => {
      if (typeof req.wheelbase !== 'number') return null;
      try {
        const layout = variantOrRefusal(sourceText, { ...req, wheelbase: 'auto' }, sourceName, false).design.layout;
        return 'wheelbaseMm' in layout ? `--wheelbase auto (${layout.wheelbaseMm} mm)` : '--wheelbase auto';
      } catch (e) {
        if (e instanceof VariantRefusal) return null;
        throw e;
      }
    };
    throw new VariantRefusal(propsText, constraint, withAlternatives ? alternatives(checkAlternatives(source, failure.report, autoWheelbase()), near, 'none found nearby') : 'none searched', attempt);
  }

  const design = accepted.draft.design;
  const frame = accepted.frame;
  const measure = measureArms(design, rule);
  const sourceMeasure = measureArms(source, rule);
  const rootReachMm: readonly [number, number] | null = source.arms.construction === 'separate' && design.arms.construction === 'separate' ? [source.arms.root.reachMm, design.arms.root.reachMm] : null;
  const beam = (m: RuleMeasure) => `L ${m.beam.lengthMm.toFixed(1)} mm, width ${m.beam.widthMm.toFixed(2)} mm, t ${m.beam.thicknessMm} mm, E ${m.beam.modulusGpa.toFixed(1)} GPa, motor ${m.beam.tipMassG} g`;
  const lines = [
    ...ruleLines(rule),
    `  source  ${sourceMeasure.beam.site}: ${beam(sourceMeasure)} -> f1 ${sourceMeasure.frequencyHz.toFixed(1)} Hz`,
    `  variant ${measure.beam.site}: ${beam(measure)} -> f1 ${measure.frequencyHz.toFixed(1)} Hz (>= ${rule.requiredHz.toFixed(1)}), deflection ${measure.deflectionMm.toFixed(3)} mm (<= ${measure.allowedDeflectionMm.toFixed(3)})`,
    `  section: ${accepted.section.thicknessMm} mm, weave ${accepted.section.weaveDeg}°, width factor ${accepted.section.widthFactor.toFixed(3)}${accepted.index > 0 ? ` (the ${accepted.index} lighter section${accepted.index > 1 ? 's' : ''} failed a check)` : ''}${rootReachMm && rootReachMm[1] !== rootReachMm[0] ? `; arm roots moved out ${rootReachMm[0]} -> ${rootReachMm[1]} mm` : ''}`,
  ];
  return {
    text: accepted.draft.text,
    design,
    frame,
    report: accepted.report,
    sourceDesign: source,
    sourceFrame,
    propDiameterMm: propMm,
    wheelbase: { ...plan.wheelbase, achievedGapMm: minTipGapMm(frame.sites, propMm) },
    motor,
    arms: { rule, section: accepted.section, measure, sourceMeasure, rootReachMm, tried: accepted.index + 1, lines },
    body,
    changes: mergedChanges(accepted.draft.changes),
    massG: frameMassG(frame),
    sourceMassG: frameMassG(sourceFrame),
  };
}

/** The alternatives found, with the nearest passing prop size last; `none` when there are none. */
function alternatives(found: readonly string[], nearestProps: () => string | null, none: string): string {
  const near = nearestProps();
  const all = near ? [...found, `props of ${near} with this design`] : found;
  return all.length ? all.join('; or ') : none;
}

/**
 * The prop size nearest the requested one, in 0.5 in steps towards the source's size, whose variant
 * passes every check; null when none does (not even the source's own size).
 */
function nearestPassingProps(sourceText: string, req: VariantRequest, sourceName: string): string | null {
  const want = parsePropsOption(req.props) / MM_PER_INCH;
  const have = parseDesignText(sourceText, sourceName).props.diameterMm / MM_PER_INCH;
  const dir = have < want ? -1 : 1;
  for (let k = 1; k <= 24; k++) {
    const inches = Math.round((want + dir * 0.5 * k) * 2) / 2;
    if ((dir < 0 && inches < have) || (dir > 0 && inches > have) || inches < PROP_TABLE_RANGE_IN[0]) break;
    try {
      variantOrRefusal(sourceText, { ...req, props: `${inches}in`, wheelbase: 'auto' }, sourceName, false);
      return `${inches}in`;
    } catch (e) {
      if (!(e instanceof VariantRefusal || e instanceof VariantRequestError || e instanceof DesignError)) throw e;
    }
  }
  return null;
}
