import { readFileSync } from 'node:fs';
import { buildAssembly } from '../assembly/index.js';
import { fitFindings, optionsForDesign, propSweepFindings, assemblyPrisms } from '../checks/index.js';
import { buildFrame, type Frame } from '../geometry/index.js';
import { parseDesignText } from '../params/index.js';
import type { BenchCase } from './types.js';

/** Frames built ahead, one per repetition, so no cache on a part carries over (a `check` run is cold). */
type Cold = { frames: Frame[]; next: number };

/** The stage, and the CPU time it took (the wall time on a busy machine includes waiting for a core). */
function stage(frame: Frame): { findings: unknown[]; cpuMs: number } {
  const c0 = process.cpuUsage();
  const o = optionsForDesign(frame.design);
  const a = buildAssembly(frame.design, frame);
  const prisms = assemblyPrisms(a);
  const findings = [...propSweepFindings(a, o, 'prop-clearance', prisms), ...fitFindings(frame, a, o, prisms)];
  const c = process.cpuUsage(c0);
  return { findings, cpuMs: (c.user + c.system) / 1000 };
}

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
    // One run on a frame of its own first, as the other cases' first repetition warms the compiler.
    stage(buildFrame(d));
    return { frames: Array.from({ length: 8 }, () => buildFrame(d)), next: 0 };
  },
  run: (state) => {
    const s = state as Cold;
    return stage(s.frames[s.next++ % s.frames.length]);
  },
  note: (r) => {
    const x = r as ReturnType<typeof stage>;
    return `${x.findings.length} fit findings; last run ${x.cpuMs.toFixed(1)} ms of CPU`;
  },
});

export const cases: BenchCase[] = ['tessel-5', 'mote-3', 'farline-7'].map(addedToCheck);
