import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { BARE_NODE, cli, median, ratioFigure, timeOnce } from './measure.js';
import type { BenchFigure } from './types.js';

const CLI = fileURLToPath(new URL('../cli/framewright.cjs', import.meta.url));
const REPO = fileURLToPath(new URL('../../', import.meta.url));
const TESSEL = fileURLToPath(new URL('../../designs/tessel-5.yaml', import.meta.url));

/** The wall time of the last `npm test` in this clone, from the report test/run-suite.mjs leaves behind. */
function lastSuiteSeconds(): { seconds: number; tests: number } | null {
  const file = `${REPO}out/vitest-results.json`;
  if (!existsSync(file)) return null;
  const j = JSON.parse(readFileSync(file, 'utf8')) as { startTime: number; numTotalTests: number; testResults: Array<{ endTime: number }> };
  const end = Math.max(...j.testResults.map((t) => t.endTime));
  return { seconds: (end - j.startTime) / 1000, tests: j.numTotalTests };
}

/** Start-up and suite figures of issue 15: every command pays node's own start-up; the goal is what it adds. */
export const figures: BenchFigure[] = [
  ratioFigure({ figure: '`framewright --help`', order: 1, subject: cli(CLI, '--help'), peer: BARE_NODE, peerName: 'bare `node -e 0`', maxRatio: 1.5, reps: 15 }),
  ratioFigure({ figure: '`check designs/tessel-5.yaml`', order: 2, subject: cli(CLI, 'check', TESSEL), peer: BARE_NODE, peerName: 'bare `node -e 0`', maxRatio: 3, reps: 9 }),
  refusalFigure('`build /dev/zero` refused', () => '/dev/zero', 5),
  refusalFigure('`check` of a 50 MB random file refused', () => {
    const file = join(mkdtempSync(join(tmpdir(), 'fw-bench-')), 'random.dxf');
    writeFileSync(file, randomBytes(50 * 1024 * 1024));
    return file;
  }, 5.1),
  {
    figure: '`npm test` (the last run in this clone)',
    goal: '≤ 180 s on a fresh clone',
    order: 90,
    measure: async () => {
      const s = lastSuiteSeconds();
      if (!s) return { value: 'not run', peer: '-', met: false, note: 'run `npm test` first; it leaves out/vitest-results.json' };
      return { value: `${s.seconds.toFixed(0)} s`, peer: '-', met: s.seconds <= 180, note: `${s.tests} tests, vitest's wall time without the build` };
    },
  },
];

/** A row for "bad input is refused within a second, whole process included" (exit 2 expected). */
function refusalFigure(figure: string, input: () => string, order: number): BenchFigure {
  return {
    figure,
    goal: '< 1 s, exit 2',
    order,
    measure: async () => {
      const path = input();
      const command = figure.includes('check') ? 'check' : 'build';
      const times: number[] = [];
      for (let i = 0; i < 5; i++) times.push(await timeOnce({ argv: [process.execPath, CLI, command, path, ...(command === 'build' ? ['--out', join(tmpdir(), 'fw-never')] : [])], exitCodes: [2] }));
      const node: number[] = [];
      for (let i = 0; i < 5; i++) node.push(await timeOnce(BARE_NODE));
      const ms = median(times);
      return { value: `${ms.toFixed(0)} ms`, peer: `${median(node).toFixed(0)} ms bare \`node -e 0\``, met: ms < 1000 };
    },
  };
}
