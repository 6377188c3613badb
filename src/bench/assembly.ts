import { readFileSync } from 'node:fs';
import { buildAssembly } from '../assembly/index.js';
import { fitFindings, optionsForDesign, propSweepFindings, assemblyPrisms } from '../checks/index.js';
import { buildFrame, type Frame } from '../geometry/index.js';
import { parseDesignText } from '../params/index.js';
import type { BenchCase } from './types.js';

/** Frames built ahead, one per repetition, so no cache on a part carries over (a `check` run is cold). */
type Cold = { frames: Frame[]; next: number };

/**
 * What the assembly stage adds to `check`: building the assembly, the prop sweep against every
 * solid and the fit rules (interference, stack, camera, battery, motor screws), on a freshly built
 * frame each time.
 */
const addedToCheck = (design: string): BenchCase => ({
  name: `assembly + fit checks, ${design}`,
  target: 'adds under 20 ms to check',
  budgetMs: 20,
  setup: (): Cold => {
    const d = parseDesignText(readFileSync(new URL(`../../designs/${design}.yaml`, import.meta.url), 'utf8'));
    return { frames: Array.from({ length: 8 }, () => buildFrame(d)), next: 0 };
  },
  run: (state) => {
    const s = state as Cold;
    const frame = s.frames[s.next++ % s.frames.length];
    const o = optionsForDesign(frame.design);
    const a = buildAssembly(frame.design, frame);
    const prisms = assemblyPrisms(a);
    return [...propSweepFindings(a, o, 'prop-clearance', prisms), ...fitFindings(frame, a, o)];
  },
  note: (r) => `${(r as unknown[]).length} fit findings`,
});

export const cases: BenchCase[] = ['tessel-5', 'mote-3', 'farline-7'].map(addedToCheck);
