import { readdirSync } from 'node:fs';
import { spawn, spawnSync } from 'node:child_process';
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

/** runCli without blocking the test process, so independent runs overlap (the machine has two cores or more). */
export function runCliAsync(args: string[], input?: string | Buffer): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [join(REPO, 'dist', 'cli', 'main.js'), ...args], { cwd: REPO });
    const out: Buffer[] = [];
    const err: Buffer[] = [];
    child.stdout.on('data', (b: Buffer) => out.push(b));
    child.stderr.on('data', (b: Buffer) => err.push(b));
    child.on('close', (code) => done({ code: code ?? -1, stdout: Buffer.concat(out).toString('utf8'), stderr: Buffer.concat(err).toString('utf8') }));
    child.stdin.on('error', () => {}); // a command that refuses its input early closes standard input
    child.stdin.end(input);
  });
}
