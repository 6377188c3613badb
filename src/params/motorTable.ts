import type { ScrewSize } from './types.js';
import { MM_PER_INCH } from './units.js';

/**
 * Motor-size classes, named by the stator diameter in mm (the first two digits of the trade's
 * four-digit motor size: a "2207" has a 22 mm stator, 7 mm tall). Bolt circles and bolt sizes are
 * common practice (no published source; see ../shared/domain.md "Motor mounts"). Prop ranges, bell
 * diameters, bores and masses are typical values, common practice, no source.
 */
export type MotorClass = Readonly<{
  /** Label as users write it, e.g. "20xx-24xx". */
  name: string;
  statorMinMm: number;
  statorMaxMm: number;
  /** Bolt circles in use for this class, ascending; the first is the commoner single pattern. */
  boltCirclesMm: readonly number[];
  boltSize: ScrewSize;
  /** Prop diameters this class is built to turn. inches. */
  propsIn: readonly [number, number];
  /** Typical bell outer diameter. mm. */
  bellDiameterMm: number;
  /** Typical centre bore clearing the shaft clip. mm. */
  boreMm: number;
  /** Typical motor mass, the arm's tip mass in the stiffness rule. g. */
  massG: number;
  /** Typical depth of the threaded holes in the motor base (a longer motor screw reaches the windings). mm. */
  threadDepthMm: number;
}>;

/**
 * common practice, no source (bolt circles and bolt sizes per ../shared/domain.md; the smallest and
 * largest rows, their bells, bores and masses, and every thread depth from memory: domain.md gives
 * 3–5 mm of thread in a motor base).
 */
export const MOTOR_CLASSES: readonly MotorClass[] = [
  { name: '08xx-11xx', statorMinMm: 8, statorMaxMm: 11, boltCirclesMm: [9], boltSize: 'M2', propsIn: [1, 2.5], bellDiameterMm: 14, boreMm: 3, massG: 5, threadDepthMm: 2.5 },
  { name: '12xx-18xx', statorMinMm: 12, statorMaxMm: 18, boltCirclesMm: [9, 12], boltSize: 'M2', propsIn: [2.5, 4.5], bellDiameterMm: 19, boreMm: 5, massG: 12, threadDepthMm: 2.5 },
  { name: '20xx-24xx', statorMinMm: 20, statorMaxMm: 24, boltCirclesMm: [16], boltSize: 'M3', propsIn: [4.5, 6.5], bellDiameterMm: 28, boreMm: 7, massG: 33, threadDepthMm: 3.5 },
  { name: '25xx-28xx', statorMinMm: 25, statorMaxMm: 28, boltCirclesMm: [16, 19], boltSize: 'M3', propsIn: [6, 8], bellDiameterMm: 33, boreMm: 8, massG: 50, threadDepthMm: 4 },
  { name: '30xx-35xx', statorMinMm: 30, statorMaxMm: 35, boltCirclesMm: [19, 25], boltSize: 'M3', propsIn: [7.5, 10.5], bellDiameterMm: 37, boreMm: 9, massG: 75, threadDepthMm: 4.5 },
  { name: '36xx-46xx', statorMinMm: 36, statorMaxMm: 46, boltCirclesMm: [25, 30], boltSize: 'M3', propsIn: [10, 13], bellDiameterMm: 46, boreMm: 10, massG: 115, threadDepthMm: 5 },
];

/**
 * One row of the prop-size table: props from `fromIn` up to (not including) `toIn` take a motor of
 * this class and mass, on this single bolt circle when one circle is needed.
 */
export type PropMotorRow = Readonly<{ fromIn: number; toIn: number; className: string; massG: number; circleMm: number }>;

/**
 * The motor a frame for a given prop usually carries: class (and so bolt pattern, bell and bore),
 * mass and the usual single bolt circle by prop diameter. Common practice, no source; masses from
 * memory (e.g. a 5-inch frame's 22xx motors about 32 g, a 7-inch frame's 28xx about 50 g). The
 * last row includes its upper end.
 */
export const MOTOR_BY_PROP: readonly PropMotorRow[] = [
  { fromIn: 1, toIn: 2.5, className: '08xx-11xx', massG: 4, circleMm: 9 },
  { fromIn: 2.5, toIn: 3.5, className: '12xx-18xx', massG: 10, circleMm: 9 },
  { fromIn: 3.5, toIn: 4.5, className: '12xx-18xx', massG: 18, circleMm: 12 },
  { fromIn: 4.5, toIn: 5.5, className: '20xx-24xx', massG: 32, circleMm: 16 },
  { fromIn: 5.5, toIn: 6.5, className: '20xx-24xx', massG: 38, circleMm: 16 },
  { fromIn: 6.5, toIn: 8, className: '25xx-28xx', massG: 50, circleMm: 16 },
  { fromIn: 8, toIn: 10, className: '30xx-35xx', massG: 72, circleMm: 19 },
  { fromIn: 10, toIn: 13, className: '36xx-46xx', massG: 110, circleMm: 25 },
];

/** Prop sizes the prop-size table covers. inches. */
export const PROP_TABLE_RANGE_IN = [MOTOR_BY_PROP[0].fromIn, MOTOR_BY_PROP[MOTOR_BY_PROP.length - 1].toIn] as const;

/**
 * The prop-size table's row for a prop (mm), or null outside 1 to 13 in. 0.01 in slack at the ends
 * absorbs unit rounding (a 330.2 mm prop is 13 in).
 * @example motorForProp(127)?.className // '20xx-24xx'
 */
export function motorForProp(propMm: number): PropMotorRow | null {
  const inches = propMm / MM_PER_INCH;
  const last = MOTOR_BY_PROP.length - 1;
  if (inches < MOTOR_BY_PROP[0].fromIn - 0.01 || inches > MOTOR_BY_PROP[last].toIn + 0.01) return null;
  return MOTOR_BY_PROP.find((r, i) => inches < r.toIn || i === last) ?? null;
}

/** The class named in a prop-size row. */
export const classNamed = (name: string): MotorClass => {
  const c = MOTOR_CLASSES.find((k) => k.name === name);
  if (!c) throw new Error(`motor table has no class ${name}`);
  return c;
};

/** Every class name, comma separated, for messages. */
export const motorClassNames = (): string => MOTOR_CLASSES.map((c) => c.name).join(', ');

/**
 * The class of a motor size as users write it: "2207", "2806.5", "22xx", or a class name such as
 * "20xx-24xx". Returns null when the text names no class in the table.
 * @example motorClassOf('2207')?.boltCirclesMm // [16]
 */
export function motorClassOf(text: string): MotorClass | null {
  const t = text.trim().toLowerCase();
  const named = MOTOR_CLASSES.find((c) => c.name === t);
  if (named) return named;
  const m = /^(\d{2})(?:\d{2}(?:\.\d+)?|xx)$/.exec(t);
  if (!m) return null;
  const stator = Number(m[1]);
  return MOTOR_CLASSES.find((c) => stator >= c.statorMinMm && stator <= c.statorMaxMm) ?? null;
}

/**
 * Classes whose mounting matches a design's motor: every bolt circle of the design is one of the
 * class's circles and the bolt size agrees. Several classes can match (16 mm M3 fits 20xx–28xx).
 */
export function motorClassesForPattern(boltCirclesMm: readonly number[], boltSize: ScrewSize): MotorClass[] {
  return MOTOR_CLASSES.filter((c) => c.boltSize === boltSize && boltCirclesMm.every((d) => c.boltCirclesMm.some((e) => Math.abs(e - d) < 1e-9)));
}

/** Whether a prop (mm) lies in the class's prop range (inches, inclusive, 0.01 in slack for unit rounding). */
export const classTurnsProp = (c: MotorClass, propMm: number): boolean =>
  propMm / MM_PER_INCH >= c.propsIn[0] - 0.01 && propMm / MM_PER_INCH <= c.propsIn[1] + 0.01;

/**
 * The class a design's mount most likely belongs to when nothing else tells: the first (smallest)
 * class whose bolt circles and bolt size match, or null.
 */
export const patternClass = (boltCirclesMm: readonly number[], boltSize: ScrewSize): MotorClass | null => motorClassesForPattern(boltCirclesMm, boltSize)[0] ?? null;

/**
 * Typical mass of one motor with a bell of this diameter: the table row whose bell is nearest
 * (common practice, no source). Used only when a design gives no `motor.massG`.
 */
export function typicalMotorMassG(bellDiameterMm: number): number {
  let best = MOTOR_CLASSES[0];
  for (const c of MOTOR_CLASSES) if (Math.abs(c.bellDiameterMm - bellDiameterMm) < Math.abs(best.bellDiameterMm - bellDiameterMm)) best = c;
  return best.massG;
}
