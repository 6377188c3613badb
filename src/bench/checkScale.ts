import { checkOptions, checkParts } from '../checks/index.js';
import { bitReachRule } from '../checks/bitReach.js';
import { loopChords } from '../checks/chords.js';
import { boltHoles, holeEdgeRule, holeStressRule } from '../checks/holes.js';
import { indexPart, type PartIndex } from '../checks/partIndex.js';
import { weaveRule } from '../checks/weave.js';
import { webRule } from '../checks/webs.js';
import { importDxf } from '../import/index.js';
import { median } from './measure.js';
import { drilledPlate, drilledPlateDxf, type HoleGrid } from './plates.js';

/** What the growth figures time, one row each: the shared index, each part rule, and the whole DXF check. */
export const RULES = {
  'index': 'part index (contours, segment grid)',
  'chords': 'necks and gaps (double-normal chords)',
  'web-width': 'rule web-width',
  'hole-edge-distance': 'rule hole-edge-distance (e/D, pitch)',
  'hole-stress': 'rule hole-stress (member bands, ligaments)',
  'bit-reach': 'rule bit-reach',
  'weave-direction': 'rule weave-direction',
  'check-dxf': '`check` of a drilled plate DXF after start-up',
} as const;
export type RuleName = keyof typeof RULES;

const grid = (holes: number): HoleGrid => ({ holes, pitchMm: 10, diameterMm: 6 });
const options = checkOptions({ toolDiameterMm: 3.175 });
const CHORD_REACH_MM = 3 * Math.max(1.875, 3.175);

/** One run of a rule on the plate (its inputs prepared outside the timing). */
function runner(rule: RuleName, holes: number): () => unknown {
  if (rule === 'check-dxf') {
    const text = drilledPlateDxf(grid(holes));
    return () => JSON.stringify(checkParts(importDxf(text, { name: 'plate', thicknessMm: 2 }).parts, options));
  }
  const part = drilledPlate(grid(holes));
  if (rule === 'index') return () => indexPart(part);
  const ix: PartIndex = indexPart(part);
  const chords = loopChords(ix, CHORD_REACH_MM);
  const bolts = boltHoles(ix);
  switch (rule) {
    case 'chords':
      return () => loopChords(ix, CHORD_REACH_MM);
    case 'web-width':
      return () => webRule(ix, options, chords);
    case 'hole-edge-distance':
      return () => holeEdgeRule(ix, options, bolts);
    case 'hole-stress':
      return () => holeStressRule(ix, options, bolts);
    case 'bit-reach':
      return () => bitReachRule(ix, options, chords);
    case 'weave-direction':
      return () => weaveRule(part, options);
  }
}

/**
 * `node dist/bench/checkScale.js RULE HOLES`: prints the processor ms of one run in steady state: after a
 * warm-up, batches of back-to-back runs (each batch at least 150 ms), the least batch's time over its
 * runs (noise only adds to a deterministic run). Back to back, each run pays its share of the garbage
 * collection it causes. (Timing single runs each after a forced collection was tried and read as
 * growth that is not there: the collection shrinks the young generation, and the next large run then
 * pays for growing it again: the part index read 10× from 8,000 to 32,000 holes, where back-to-back
 * runs in one process gave 4.05×.)
 */
if (process.argv[1] && process.argv[1].endsWith('checkScale.js')) {
  const rule = process.argv[2] as RuleName;
  if (!(rule in RULES)) throw new Error(`unknown rule ${rule}`);
  const run = runner(rule, Number(process.argv[3]));
  // Warm up until the compiler has settled: at least 5 runs and 300 ms, so small plates are not timed cold.
  let warm = 0;
  const w0 = performance.now();
  for (; warm < 5 || performance.now() - w0 < 300; warm++) run();
  const perRun = (performance.now() - w0) / warm;
  const batch = Math.max(1, Math.ceil(150 / Math.max(perRun, 1e-3)));
  const times: number[] = [];
  for (let i = 0; i < 5; i++) {
    // Processor time of this process: on a machine shared with other work, wall time mostly measures the others.
    const t0 = process.cpuUsage();
    for (let k = 0; k < batch; k++) run();
    const used = process.cpuUsage(t0);
    times.push((used.user + used.system) / 1000 / batch);
  }
  process.stdout.write(`${Math.min(...times)}\n`);
}
