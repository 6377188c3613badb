import type { Design } from '../params/design.js';
import { MM_PER_INCH } from '../params/units.js';
import {
  classTurnsProp,
  MOTOR_CLASSES,
  motorClassesForPattern,
  motorClassNames,
  motorClassOf,
  type MotorClass,
} from '../params/motorTable.js';
import { VariantRequestError } from './errors.js';
import type { Change } from './changes.js';

/** The motor of the source and of the variant, and the design changes that swap it. */
export type MotorChoice = Readonly<{
  sourceClass: MotorClass;
  variantClass: MotorClass;
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
 * Decide the variant's motor. `request` undefined keeps the motor (the prop must be in the range of
 * a class the kept mount serves); "auto" keeps it when it can turn the prop and otherwise takes the
 * first class that can; a class ("2207", "22xx", "20xx-24xx") is taken as given. Motor pattern, bolt
 * size, bell and bore change only when the class changes. Throws VariantRequestError when the
 * motor cannot turn the prop.
 */
export function chooseMotor(d: Design, request: string | undefined, propMm: number): MotorChoice {
  const { cls: sourceClass, matchesPattern } = designMotorClass(d);
  if (request === undefined) {
    if (matchesPattern.length && !matchesPattern.some((c) => classTurnsProp(c, propMm))) {
      const lo = Math.min(...matchesPattern.map((c) => c.propsIn[0]));
      const hi = Math.max(...matchesPattern.map((c) => c.propsIn[1]));
      throw new VariantRequestError(
        '--props',
        inches(propMm),
        `is outside what the kept motor mount (${d.motor.boltCircleMm.join('×')} mm circles, ${d.motor.boltSize}: class ${matchesPattern.map((c) => c.name).join(' or ')}) turns, ${lo} to ${hi} in; give a motor class with --motor (${motorClassNames()}) or --motor auto`,
      );
    }
    return { sourceClass, variantClass: sourceClass, changes: [] };
  }
  let target: MotorClass | null;
  if (request.trim().toLowerCase() === 'auto') {
    const keep = matchesPattern.find((c) => classTurnsProp(c, propMm));
    if (keep) return { sourceClass, variantClass: keep, changes: [] };
    target = MOTOR_CLASSES.find((c) => classTurnsProp(c, propMm)) ?? null;
    if (!target) {
      const lo = MOTOR_CLASSES[0].propsIn[0];
      const hi = MOTOR_CLASSES[MOTOR_CLASSES.length - 1].propsIn[1];
      throw new VariantRequestError('--props', inches(propMm), `is outside every motor class in the table (${lo} to ${hi} in)`);
    }
  } else {
    target = motorClassOf(request);
    if (!target) throw new VariantRequestError('--motor', request, `is not a motor size class; use a size such as 2207, a class (${motorClassNames()}) or auto`);
    if (!classTurnsProp(target, propMm)) {
      throw new VariantRequestError(
        '--props',
        inches(propMm),
        `cannot be turned by motor class ${target.name} (${target.boltCirclesMm.join(' or ')} mm circles, ${target.boltSize}), which turns ${target.propsIn[0]} to ${target.propsIn[1]} in props`,
      );
    }
  }
  if (matchesPattern.includes(target)) return { sourceClass, variantClass: target, changes: [] };
  return { sourceClass, variantClass: target, changes: motorChanges(d, target) };
}

function motorChanges(d: Design, c: MotorClass): Change[] {
  const why = `motor class ${c.name} (motor table, common practice)`;
  const twoCircles = d.motor.boltCircleMm.length === 2 && c.boltCirclesMm.length === 2;
  const circles = twoCircles ? [...c.boltCirclesMm] : [c.boltCirclesMm[0]];
  const out: Change[] = [
    { path: ['motor', 'boltCircleMm'], old: [...d.motor.boltCircleMm], new: circles, why },
    { path: ['motor', 'boltSize'], old: d.motor.boltSize, new: c.boltSize, why },
    { path: ['motor', 'bellDiameterMm'], old: d.motor.bellDiameterMm, new: c.bellDiameterMm, why: `${why}: typical bell` },
    { path: ['motor', 'boreMm'], old: d.motor.boreMm, new: c.boreMm, why: `${why}: typical shaft-clip bore` },
  ];
  if (d.motor.massG !== undefined) out.push({ path: ['motor', 'massG'], old: d.motor.massG, new: c.massG, why: `${why}: typical mass` });
  if (d.motor.slotted && circles.length !== 2) out.push({ path: ['motor', 'slotted'], old: true, new: false, why: `${c.name} has one bolt circle; slots need two` });
  return out;
}
