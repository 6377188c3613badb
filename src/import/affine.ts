import type { Vec2 } from '../geometry/types.js';

/**
 * A plane affine map x' = a x + c y + e, y' = b x + d y + f, stored as [a, b, c, d, e, f].
 * Block inserts (translate, rotate, scale, mirror, non-uniform scale), the OCS flip of entities
 * drawn with a −Z extrusion, and the unit conversion to mm are all maps of this kind.
 */
export type Affine = readonly [number, number, number, number, number, number];

export const IDENTITY: Affine = [1, 0, 0, 1, 0, 0];

export const applyAffine = (m: Affine, p: Vec2): Vec2 => [m[0] * p[0] + m[2] * p[1] + m[4], m[1] * p[0] + m[3] * p[1] + m[5]];

/** The linear part applied to a direction (no translation). */
export const applyLinear = (m: Affine, v: Vec2): Vec2 => [m[0] * v[0] + m[2] * v[1], m[1] * v[0] + m[3] * v[1]];

/** outer ∘ inner: apply inner first. */
export function compose(outer: Affine, inner: Affine): Affine {
  const [a1, b1, c1, d1, e1, f1] = outer;
  const [a2, b2, c2, d2, e2, f2] = inner;
  return [a1 * a2 + c1 * b2, b1 * a2 + d1 * b2, a1 * c2 + c1 * d2, b1 * c2 + d1 * d2, a1 * e2 + c1 * f2 + e1, b1 * e2 + d1 * f2 + f1];
}

export const translation = (v: Vec2): Affine => [1, 0, 0, 1, v[0], v[1]];
export const scaling = (sx: number, sy: number): Affine => [sx, 0, 0, sy, 0, 0];
export const rotation = (rad: number): Affine => [Math.cos(rad), Math.sin(rad), -Math.sin(rad), Math.cos(rad), 0, 0];
/** x → −x: an entity's object coordinate system when its extrusion is (0, 0, −1) (DXF arbitrary axis algorithm). */
export const MIRROR_X: Affine = [-1, 0, 0, 1, 0, 0];

export const determinant = (m: Affine): number => m[0] * m[3] - m[1] * m[2];

/**
 * Uniform scale factor when the map is a similarity (rotation, uniform scale, optional mirror),
 * else null: circles stay circles only under a similarity.
 */
export function similarityScale(m: Affine, relTol = 1e-9): number | null {
  const [a, b, c, d] = m;
  const s = Math.sqrt(Math.abs(determinant(m)));
  if (s === 0) return null;
  const tol = relTol * s;
  const rotational = Math.abs(a - d) <= tol && Math.abs(b + c) <= tol;
  const reflective = Math.abs(a + d) <= tol && Math.abs(b - c) <= tol;
  return rotational || reflective ? s : null;
}

/** Insert transform of the DXF Reference: p → insert + R(rotation)·(S(sx, sy)·(p − base) + arrayOffset). */
export function insertTransform(base: Vec2, insert: Vec2, sx: number, sy: number, rotRad: number, arrayOffset: Vec2 = [0, 0]): Affine {
  const local = compose(translation(arrayOffset), compose(scaling(sx, sy), translation([-base[0], -base[1]])));
  return compose(translation(insert), compose(rotation(rotRad), local));
}
