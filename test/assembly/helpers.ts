import { join } from 'node:path';
import { buildAssembly, type Assembly, type PlacedPlate } from '../../src/assembly/index.js';
import { checkFrame, type CheckReport } from '../../src/checks/index.js';
import { buildFrame, flattenLoop, transformLoop, type Frame, type Loop } from '../../src/geometry/index.js';
import { parseDesignText, validateDesign, type Design } from '../../src/params/index.js';
import { readFileSync } from 'node:fs';
import { designWith } from '../helpers/demo.js';

export const FIXTURES = join(import.meta.dirname, '..', 'fixtures', 'assembly');

export type Built = { design: Design; frame: Frame; assembly: Assembly; report: CheckReport };

/** A design from a file (fixtures folder when the name has no slash) or a validated object, fully built and checked. */
export function built(source: string | Record<string, unknown>): Built {
  const design = typeof source === 'string' ? parseDesignText(readFileSync(source.includes('/') ? source : join(FIXTURES, source), 'utf8')) : validateDesign(source);
  const frame = buildFrame(design);
  const assembly = buildAssembly(design, frame);
  return { design, frame, assembly, report: checkFrame(frame, {}, assembly) };
}

/** The Tessel 5 demo with a patch, built and checked. */
export const tesselWith = (patch: Record<string, unknown>): Built => built(designWith('tessel-5.yaml', patch));

/** A ring list ([outline, ...holes]) of a placed horizontal plate, finely flattened, for Shapely. */
export function plateRings(p: PlacedPlate, chordMm = 0.002): number[][][] {
  const pl = p.placement;
  const tf = { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY };
  const loops: Loop[] = [transformLoop(p.part.outline, tf), ...p.part.features.map((f) => transformLoop(f.loop, tf))];
  return loops.map((l) => flattenLoop(l, chordMm).map(([x, y]) => [x, y]));
}

/** A finely flattened circle as one ring. */
export function circleRing(c: readonly [number, number], r: number, n = 2000): number[][] {
  return Array.from({ length: n }, (_, k) => [c[0] + r * Math.cos((2 * Math.PI * k) / n), c[1] + r * Math.sin((2 * Math.PI * k) / n)]);
}
