import { spawnSync } from 'node:child_process';
import { performance } from 'node:perf_hooks';
import type { BenchFigure, Timed } from './types.js';

/** The median of some numbers (the upper one of the middle two). */
export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Wall-clock milliseconds of one run; a process that exits non-zero is an error (a broken case is not a fast one). */
export async function timeOnce(t: Timed): Promise<number> {
  const t0 = performance.now();
  if (typeof t === 'function') {
    await t();
    return performance.now() - t0;
  }
  const r = spawnSync(t.argv[0], t.argv.slice(1), { cwd: t.cwd, input: t.input, stdio: ['pipe', 'ignore', 'pipe'], maxBuffer: 1 << 26 });
  const ms = performance.now() - t0;
  if (!(t.exitCodes ?? [0, 1]).includes(r.status ?? -1)) throw new Error(`${t.argv.join(' ')} exited ${r.status}: ${String(r.stderr).slice(0, 300)}`);
  return ms;
}

/**
 * Median times of a subject and its peer, run alternately (subject, peer, subject, ...) so that a
 * machine busy with other work slows both alike. One warm-up run of each is not counted.
 */
export async function timePair(subject: Timed, peer: Timed, reps: number): Promise<{ subjectMs: number; peerMs: number }> {
  await timeOnce(subject);
  await timeOnce(peer);
  const s: number[] = [];
  const p: number[] = [];
  for (let i = 0; i < reps; i++) {
    s.push(await timeOnce(subject));
    p.push(await timeOnce(peer));
  }
  return { subjectMs: median(s), peerMs: median(p) };
}

/**
 * A figures-table row for "subject takes at most `maxRatio` × its peer": both timed alternately in
 * the same run (`reps` each, medians compared).
 */
export function ratioFigure(o: Readonly<{ figure: string; order: number; subject: Timed; peer: Timed; peerName: string; maxRatio: number; reps?: number }>): BenchFigure {
  return {
    figure: o.figure,
    goal: `≤ ${o.maxRatio}× ${o.peerName}`,
    order: o.order,
    measure: async () => {
      const { subjectMs, peerMs } = await timePair(o.subject, o.peer, o.reps ?? 9);
      const ratio = subjectMs / peerMs;
      return { value: `${subjectMs.toFixed(0)} ms`, peer: `${peerMs.toFixed(0)} ms ${o.peerName}`, ratio: `${ratio.toFixed(2)}×`, met: ratio <= o.maxRatio };
    },
  };
}

/** A process of this package's built CLI, for timing. */
export const cli = (cliPath: string, ...args: string[]): Timed => ({ argv: [process.execPath, cliPath, ...args] });

/** The peer of every start-up figure: node itself doing nothing. */
export const BARE_NODE: Timed = { argv: [process.execPath, '-e', '0'] };
