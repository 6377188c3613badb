import type { Design } from '../params/design.js';
import { MM_PER_INCH } from '../params/units.js';
import { clearanceHoleMm } from '../params/screws.js';
import { motorBoreMm, tipPadMarginMm } from '../params/derived.js';
import {
  classNamed,
  classTurnsProp,
  MOTOR_BY_PROP,
  MOTOR_CLASSES,
  motorClassesForPattern,
  motorClassNames,
  motorClassOf,
  motorForProp,
  PROP_TABLE_RANGE_IN,
  type MotorClass,
} from '../params/motorTable.js';
import { VariantRequestError } from './errors.js';
import type { Change } from './changes.js';

/** The motor of the source and of the variant, and the design changes that swap it. */
export type MotorChoice = Readonly<{
  sourceClass: MotorClass;
  variantClass: MotorClass;
  /** Mass of one motor in the variant (the arm's tip mass). g. */
  massG: number;
  /** How it was chosen: kept, from the prop-size table, or as asked. */
  how: 'kept' | 'prop table' | 'requested';
  changes: readonly Change[];
}>;

const inches = (mm: number): string => `${Number((mm / MM_PER_INCH).toFixed(2))} in`;

/**
 * The class a design's motor belongs to: among the classes whose bolt circles and bolt size match,
 * the one whose typical bell is nearest the design's bell; with no match, the nearest bell overall.
 */
export function designMotorClass(d: Design): { cls: MotorClass; matchesPattern: readonly MotorClass[] } {
  const matches = motorClassesForPattern(d.motor.boltCircleMm, d.motor.boltSize);
  const pool = matches.length ? matches : MOTOR_CLASSES;
  const cls = [...pool].sort((a, b) => Math.abs(a.bellDiameterMm - d.motor.bellDiameterMm) - Math.abs(b.bellDiameterMm - d.motor.bellDiameterMm))[0];
  return { cls, matchesPattern: matches };
}

/**
 * Decide the variant's motor. `request`:
 * - "auto" (also when undefined): the prop-size table's class and mass for the new prop
 *   (common practice); the source's motor is kept when the table gives its class for both its prop
 *   and the new one in the same row;
 * - "keep": the source's motor, refused when its mount's classes do not turn the prop;
 * - a size or class ("2207", "22xx", "20xx-24xx"): that class with its typical mass.
 * Throws VariantRequestError for an unknown class or a prop the motor cannot turn.
 */
export function chooseMotor(d: Design, request: string | undefined, propMm: number): MotorChoice {
  const { cls: sourceClass, matchesPattern } = designMotorClass(d);
  const req = (request ?? 'auto').trim().toLowerCase();
  if (req === 'keep') {
    if (matchesPattern.length && !matchesPattern.some((c) => classTurnsProp(c, propMm))) {
      const lo = Math.min(...matchesPattern.map((c) => c.propsIn[0]));
      const hi = Math.max(...matchesPattern.map((c) => c.propsIn[1]));
      throw new VariantRequestError(
        '--props',
        inches(propMm),
        `is outside what the kept motor mount (${d.motor.boltCircleMm.join('×')} mm circles, ${d.motor.boltSize}: class ${matchesPattern.map((c) => c.name).join(' or ')}) turns, ${lo} to ${hi} in; give a motor class with --motor (${motorClassNames()}) or --motor auto`,
      );
    }
    return { sourceClass, variantClass: sourceClass, massG: d.motorMassG, how: 'kept', changes: [] };
  }
  if (req === 'auto') {
    const row = motorForProp(propMm);
    if (!row) throw new VariantRequestError('--props', inches(propMm), `is outside the prop-size table (${PROP_TABLE_RANGE_IN[0]} to ${PROP_TABLE_RANGE_IN[1]} in)`);
    const target = classNamed(row.className);
    const sourceRow = motorForProp(d.props.diameterMm);
    if (target === sourceClass && sourceRow === row) return { sourceClass, variantClass: target, massG: d.motorMassG, how: 'kept', changes: [] };
    const why = `prop-size table: ${inches(propMm)} props take ${target.name} motors of about ${row.massG} g (common practice)`;
    return { sourceClass, variantClass: target, massG: row.massG, how: 'prop table', changes: motorChanges(d, sourceClass, target, row.massG, why, row.circleMm) };
  }
  const target = motorClassOf(req);
  if (!target) throw new VariantRequestError('--motor', request, `is not a motor size class; use a size such as 2207, a class (${motorClassNames()}), auto or keep`);
  if (!classTurnsProp(target, propMm)) {
    throw new VariantRequestError(
      '--props',
      inches(propMm),
      `cannot be turned by motor class ${target.name} (${target.boltCirclesMm.join(' or ')} mm circles, ${target.boltSize}), which turns ${target.propsIn[0]} to ${target.propsIn[1]} in props`,
    );
  }
  if (target === sourceClass) return { sourceClass, variantClass: target, massG: d.motorMassG, how: 'kept', changes: [] };
  const row = MOTOR_BY_PROP.find((r) => r.className === target.name && propMm / MM_PER_INCH >= r.fromIn - 0.01 && propMm / MM_PER_INCH < r.toIn + 0.01);
  const massG = row?.massG ?? target.massG;
  return { sourceClass, variantClass: target, massG, how: 'requested', changes: motorChanges(d, sourceClass, target, massG, `motor class ${target.name} as requested (motor table, common practice)`, row?.circleMm ?? target.boltCirclesMm[0]) };
}

/**
 * Edits that put a motor of class `c` and mass `massG` on the design. A mount that already fits the
 * class is kept; otherwise a two-circle mount takes the class's two circles (slots too, when the
 * router bit can cut a slot as narrow as the new bolt's clearance hole), else `circleMm`.
 */
function motorChanges(d: Design, from: MotorClass, c: MotorClass, massG: number, why: string, circleMm: number): Change[] {
  const out: Change[] = [];
  const fits = d.motor.boltSize === c.boltSize && d.motor.boltCircleMm.every((x) => c.boltCirclesMm.some((y) => Math.abs(x - y) < 1e-9));
  if (!fits) {
    const slotCuttable = clearanceHoleMm(c.boltSize, d.cutting.holeSeries) >= d.cutting.toolDiameterMm;
    const twoCircles = d.motor.boltCircleMm.length === 2 && c.boltCirclesMm.length === 2 && (!d.motor.slotted || slotCuttable);
    const circles = twoCircles ? [...c.boltCirclesMm] : [circleMm];
    out.push({ path: ['motor', 'boltCircleMm'], old: [...d.motor.boltCircleMm], new: circles, why });
    out.push({ path: ['motor', 'boltSize'], old: d.motor.boltSize, new: c.boltSize, why });
    if (d.motor.slotted && circles.length !== 2) {
      const reason = c.boltCirclesMm.length === 2 ? `${c.boltSize} slots (${clearanceHoleMm(c.boltSize, d.cutting.holeSeries)} mm) are narrower than the ${d.cutting.toolDiameterMm} mm bit` : `${c.name} has one bolt circle; slots need two`;
      out.push({ path: ['motor', 'slotted'], old: true, new: false, why: `${reason}: round holes on the ${circleMm} mm circle` });
    }
    const pad = tipPadMarginMm(c.boltSize, d.cutting.holeSeries, d.checks);
    if (d.arms.tipPadMarginMm < pad) out.push({ path: ['arms', 'tipPadMarginMm'], old: d.arms.tipPadMarginMm, new: pad, why: `${c.boltSize} motor bolts: the tip pad keeps the hole-edge rule's e/D round them` });
  }
  if (c !== from) {
    out.push({ path: ['motor', 'bellDiameterMm'], old: d.motor.bellDiameterMm, new: c.bellDiameterMm, why: `${why}: typical bell` });
    const circles = (out.find((x) => x.path[1] === 'boltCircleMm')?.new as number[] | undefined) ?? d.motor.boltCircleMm;
    const plate = d.arms.construction === 'separate' ? d.arms.thicknessMm : d.body.thicknessMm;
    const bore = motorBoreMm(circles, c.boltSize, d.cutting.holeSeries, d.checks, plate, c.boreMm);
    out.push({ path: ['motor', 'threadDepthMm'], old: d.motor.threadDepthMm, new: c.threadDepthMm, why: `${why}: typical thread depth in the motor base` });
    out.push({ path: ['motor', 'boreMm'], old: d.motor.boreMm, new: bore, why: `${why}: typical shaft-clip bore${bore < c.boreMm ? `, kept ${bore} mm to leave the web rule's web to the bolt holes` : ''}` });
  }
  out.push({ path: ['motor', 'massG'], old: d.motor.massG ?? d.motorMassG, new: massG, why });
  return out;
}
