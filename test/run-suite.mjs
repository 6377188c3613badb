// Runs the whole vitest suite and ends with a plain "N passed, N failed" line that CI can read;
// the exit code is vitest's own.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync } from 'node:fs';

mkdirSync('out', { recursive: true });
const report = 'out/vitest-results.json';
rmSync(report, { force: true });
const r = spawnSync(
  process.execPath,
  ['node_modules/vitest/vitest.mjs', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)],
  { stdio: 'inherit' },
);
try {
  const j = JSON.parse(readFileSync(report, 'utf8'));
  const skipped = (j.numPendingTests ?? 0) + (j.numTodoTests ?? 0);
  console.log(`tests: ${j.numPassedTests} passed, ${j.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ''}`);
} catch {
  console.log('tests: 0 passed, 1 failed');
}
process.exit(r.status ?? 1);
