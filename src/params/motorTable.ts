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
}>;

/** common practice, no source (bolt circles and bolt sizes per ../shared/domain.md). */
export const MOTOR_CLASSES: readonly MotorClass[] = [
  { name: '12xx-18xx', statorMinMm: 12, statorMaxMm: 18, boltCirclesMm: [9, 12], boltSize: 'M2', propsIn: [2, 4], bellDiameterMm: 19, boreMm: 5, massG: 12 },
  { name: '20xx-24xx', statorMinMm: 20, statorMaxMm: 24, boltCirclesMm: [16], boltSize: 'M3', propsIn: [4, 6], bellDiameterMm: 28, boreMm: 7, massG: 33 },
  { name: '25xx-28xx', statorMinMm: 25, statorMaxMm: 28, boltCirclesMm: [16, 19], boltSize: 'M3', propsIn: [5, 8], bellDiameterMm: 33, boreMm: 8, massG: 50 },
  { name: '30xx-40xx', statorMinMm: 30, statorMaxMm: 40, boltCirclesMm: [19, 25], boltSize: 'M3', propsIn: [7, 12], bellDiameterMm: 37, boreMm: 9, massG: 85 },
];

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
 * Typical mass of one motor with a bell of this diameter: the table row whose bell is nearest
 * (common practice, no source). Used only when a design gives no `motor.massG`.
 */
export function typicalMotorMassG(bellDiameterMm: number): number {
  let best = MOTOR_CLASSES[0];
  for (const c of MOTOR_CLASSES) if (Math.abs(c.bellDiameterMm - bellDiameterMm) < Math.abs(best.bellDiameterMm - bellDiameterMm)) best = c;
  return best.massG;
}
