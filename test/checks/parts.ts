import { flattenLoop, reverseLoop } from '../../src/geometry/loop.js';
import type { Feature, FeaturePurpose, Material, Member, Part } from '../../src/geometry/part.js';
import { circle, polygon } from '../../src/geometry/primitives.js';
import type { Loop, Vec2 } from '../../src/geometry/types.js';

/** Woven 0/90 check material of reference-values.md (E1 = E2 70, G12 5 GPa, ν12 0.10). */
export const WOVEN_70: Material = { name: 'woven-70', e1Gpa: 70, e2Gpa: 70, g12Gpa: 5, nu12: 0.1, densityGPerCm3: 1.6 };

/** A test part from a counter-clockwise outline and counter-clockwise hole shapes (reversed here). */
export function testPart(
  outline: Loop,
  holes: ReadonlyArray<{ shape: Loop; purpose?: FeaturePurpose; kind?: Feature['kind']; center?: Vec2; diameter?: number; screw?: Feature['screw'] }>,
  extra: Partial<Part> = {},
): Part {
  return {
    name: 'test',
    role: 'imported',
    quantity: 1,
    thicknessMm: 2,
    material: WOVEN_70,
    weaveRad: 0,
    outline,
    features: holes.map((h) => ({
      loop: reverseLoop(h.shape),
      kind: h.kind ?? 'hole',
      purpose: h.purpose ?? 'imported',
      ...(h.center ? { centerMm: h.center } : {}),
      ...(h.diameter !== undefined ? { diameterMm: h.diameter } : {}),
      ...(h.screw ? { screw: h.screw } : {}),
    })),
    members: [] as Member[],
    placements: [],
    sourcePath: 'test',
    ...extra,
  };
}

/** A round hole of diameter d at c. */
export const roundHole = (c: Vec2, d: number, purpose: FeaturePurpose = 'imported') => ({ shape: circle(c, d / 2), center: c, diameter: d, purpose });

/** Axis-aligned rectangle, counter-clockwise, sharp corners. */
export const rect = (x0: number, y0: number, x1: number, y1: number): Loop => polygon([[x0, y0], [x1, y0], [x1, y1], [x0, y1]]);

/** Fine polygon of a loop for the reference tools (chord error 0.0005 mm ≪ the 0.01 mm tolerance). */
export const fine = (l: Loop): number[][] => flattenLoop(l, 0.0005).map((p) => [p[0], p[1]]);
