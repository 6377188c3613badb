import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { REPO } from './demo.js';
import { SET_MARKER } from '../../src/cli/outputSet.js';

/** Run the built CLI (dist/, made by `npm test`'s build step) from the repository root. */
export function runCli(args: string[], input?: string): { code: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [join(REPO, 'dist', 'cli', 'main.js'), ...args], {
    cwd: REPO,
    encoding: 'utf8',
    input,
    maxBuffer: 64 * 1024 * 1024,
  });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

/** A stack trace line, which users must never see for bad input. */
export const STACK_LINE = /^\s+at .+\(.+:\d+:\d+\)$/m;

/** The files a command wrote into an output folder (sorted), without the marker every output set carries. */
export function outputNames(dir: string): string[] {
  return readdirSync(dir)
    .filter((f) => f !== SET_MARKER)
    .sort();
}
