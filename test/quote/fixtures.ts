import { readFileSync } from 'node:fs';
import { buildFrame, circle, polygon, reverseLoop, roundedRect, slot, type Feature, type Loop, type Part, type Vec2 } from '../../src/geometry/index.js';
import { parseDesignText } from '../../src/params/index.js';
import { parseShopText, type ShopProfile } from '../../src/params/shop.js';

export const WOVEN = { name: 'woven-cf', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 } as const;

export const roundHole = (center: Vec2, diameterMm: number, extra: Partial<Feature> = {}): Feature => ({
  loop: circle(center, diameterMm / 2, false),
  kind: 'hole',
  purpose: 'imported',
  centerMm: center,
  diameterMm,
  ...extra,
});

export const cutout = (ccwShape: Loop, kind: 'slot' | 'cutout' = 'cutout'): Feature => ({ loop: reverseLoop(ccwShape), kind, purpose: 'imported' });

/** A plain test plate; thickness and weave as given. */
export function plate(name: string, outline: Loop, features: Feature[], thicknessMm = 2, weaveRad = 0, quantity = 1): Part {
  return { name, role: 'imported', quantity, thicknessMm, material: WOVEN, weaveRad, outline, features, members: [], placements: [], sourcePath: 'test' };
}

export const demoFrame = (name: string) => buildFrame(parseDesignText(readFileSync(new URL(`../../designs/${name}.yaml`, import.meta.url), 'utf8')));

/** The example shop profile in designs/, through the real loader. */
export const exampleShop = (): ShopProfile => parseShopText(readFileSync(new URL('../../designs/hollin-row-shop.yaml', import.meta.url), 'utf8'));

export { polygon, roundedRect, slot };
