import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { REPO } from './demo.js';
import { requireTool } from './reference.js';

export type RunningLive = Readonly<{ url: string; port: number; proc: ChildProcess; output: () => string; stop: () => Promise<number | null> }>;

/** Start the built CLI's `live` command on a free port and wait for the URL it prints. */
export async function startLive(designPath: string, extra: string[] = []): Promise<RunningLive> {
  const proc = spawn(process.execPath, [join(REPO, 'dist', 'cli', 'main.js'), 'live', designPath, '--no-open', ...extra], { cwd: REPO, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  proc.stdout!.on('data', (c: Buffer) => (out += c.toString()));
  proc.stderr!.on('data', (c: Buffer) => (out += c.toString()));
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`live did not start:\n${out}`)), 30_000);
    const look = (): void => {
      const m = /at (http:\/\/\S+\/)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve(m[1]);
      }
    };
    proc.stdout!.on('data', look);
    proc.on('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`live exited with ${code}:\n${out}`));
    });
  });
  const exited = new Promise<number | null>((resolve) => proc.once('exit', (code) => resolve(code)));
  return {
    url,
    port: Number(new URL(url).port),
    proc,
    output: () => out,
    stop: async () => {
      if (proc.exitCode === null) proc.kill('SIGTERM');
      return exited;
    },
  };
}

/** Debian's Chromium, the browser of the end-to-end tests (`.ci/apt-packages.txt`). */
export const CHROMIUM = '/usr/bin/chromium';

/** Flags for a quiet, self-contained headless Chromium in a container. */
export const CHROMIUM_FLAGS = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'];

export const chromiumAvailable = (): boolean => requireTool(existsSync(CHROMIUM), 'chromium');

/** A fresh profile folder for one browser run, removed by the returned function. */
export function freshProfile(): { dir: string; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'fw-chromium-'));
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) };
}
