import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildFrame, line, type Frame, type Loop, type Material, type Part } from '../../src/geometry/index.js';
import { parseDesignText } from '../../src/params/index.js';

export const REPO = join(import.meta.dirname, '..', '..');
export const DEMOS = ['tessel-5.yaml', 'mote-3.yaml', 'farline-7.yaml'] as const;

export const frameFrom = (path: string): Frame => buildFrame(parseDesignText(readFileSync(path, 'utf8'), path));
export const demoFrame = (file: string): Frame => frameFrom(join(REPO, 'designs', file));
export const fixtureFrame = (file: string): Frame => frameFrom(join(import.meta.dirname, 'fixtures', file));

/** The demo designs' woven sheet (designs/*.yaml). */
export const WOVEN: Material = { name: 'woven-cf', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 };

export function rectangle(lengthMm: number, widthMm: number): Loop {
  return [line([0, 0], [lengthMm, 0]), line([lengthMm, 0], [lengthMm, widthMm]), line([lengthMm, widthMm], [0, widthMm]), line([0, widthMm], [0, 0])];
}

/** A plain plate part for analytic checks. */
export function platePart(outline: Loop, thicknessMm: number, material: Material = WOVEN, weaveRad = 0): Part {
  return { name: 'test-plate', role: 'imported', quantity: 1, thicknessMm, material, weaveRad, outline, features: [], members: [], placements: [], sourcePath: 'test' };
}
