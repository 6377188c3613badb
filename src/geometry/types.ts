/**
 * The one geometry representation every stage uses: plain readonly data, millimetres and radians,
 * y up. Arcs stay arcs; a full circle is a loop of one arc with |sweepRad| = 2π.
 * Orientation: outer loops counter-clockwise, inner loops clockwise (material is always on the left).
 */

export type Vec2 = readonly [number, number];

export type Line = Readonly<{ kind: 'line'; start: Vec2; end: Vec2 }>;

/** Circular arc from angle startRad, turning by sweepRad (positive = counter-clockwise). */
export type Arc = Readonly<{ kind: 'arc'; center: Vec2; radius: number; startRad: number; sweepRad: number }>;

export type Segment = Line | Arc;

/** A closed chain: each segment ends where the next begins, the last ends where the first begins. */
export type Loop = readonly Segment[];

export type BBox = readonly [minX: number, minY: number, maxX: number, maxY: number];

/** For the default branch of an exhaustive switch: reaching it is a bug. */
export function assertNever(x: never): never {
  throw new Error(`unexpected value: ${JSON.stringify(x)}`);
}
