import type { Vec2 } from './types.js';

/** Sum of two vectors (mm). */
export const add = (a: Vec2, b: Vec2): Vec2 => [a[0] + b[0], a[1] + b[1]];
/** Difference a − b (mm). */
export const sub = (a: Vec2, b: Vec2): Vec2 => [a[0] - b[0], a[1] - b[1]];
/** Vector times a scalar. */
export const scale = (a: Vec2, k: number): Vec2 => [a[0] * k, a[1] * k];
/** Dot product. */
export const dot = (a: Vec2, b: Vec2): number => a[0] * b[0] + a[1] * b[1];
/** z of the cross product: positive when b turns counter-clockwise from a. */
export const cross = (a: Vec2, b: Vec2): number => a[0] * b[1] - a[1] * b[0];
/** Euclidean length (mm). */
export const len = (a: Vec2): number => Math.hypot(a[0], a[1]);
/** Distance between two points (mm). */
export const dist = (a: Vec2, b: Vec2): number => Math.hypot(a[0] - b[0], a[1] - b[1]);
/** Unit vector along a; the zero vector stays zero. */
export const unit = (a: Vec2): Vec2 => {
  const l = len(a);
  return l === 0 ? [0, 0] : [a[0] / l, a[1] / l];
};
/** Left-hand normal (rotate +90°). */
export const perp = (a: Vec2): Vec2 => [-a[1], a[0]];
/** Point at radius r (mm) and angle rad from the origin. */
export const polar = (r: number, rad: number): Vec2 => [r * Math.cos(rad), r * Math.sin(rad)];
/** a rotated counter-clockwise by rad about the origin. */
export const rotate = (a: Vec2, rad: number): Vec2 => {
  const c = Math.cos(rad);
  const s = Math.sin(rad);
  return [a[0] * c - a[1] * s, a[0] * s + a[1] * c];
};
/** Point at fraction t of the way from a to b. */
export const lerp = (a: Vec2, b: Vec2, t: number): Vec2 => [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t];

/** Angle normalised to [0, 2π). */
export function normAngle(rad: number): number {
  const t = rad % (2 * Math.PI);
  return t < 0 ? t + 2 * Math.PI : t;
}
