import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, watch, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { recoverOutputs, SET_MARKER, writeAllAtomically } from '../../src/cli/outputSet.js';
import { UsageError } from '../../src/cli/usageError.js';
import { runCli } from '../helpers/cli.js';
import { REPO } from '../helpers/demo.js';
import { rng } from '../helpers/random.js';

const tmp = (): string => mkdtempSync(join(tmpdir(), 'fw-set-'));
/** A pid above Linux's largest (2^22), so no process has it: its temporaries are stale. */
const DEAD_PID = 4_194_400;

/** A folder's files (one level) as name → bytes; null when the folder does not exist. */
function snapshot(dir: string): Map<string, string> | null {
  if (!existsSync(dir)) return null;
  return new Map(readdirSync(dir).sort().map((f) => [f, readFileSync(join(dir, f), 'latin1')]));
}
const same = (a: Map<string, string> | null, b: Map<string, string> | null): boolean =>
  a !== null && b !== null && a.size === b.size && [...a].every(([k, v]) => b.get(k) === v);
const temporaries = (parent: string): string[] => readdirSync(parent).filter((f) => f.includes('.fw-'));

describe('output sets (library)', () => {
  it('a set replaces the whole folder: files of the old set that the new one lacks are gone', () => {
    const out = join(tmp(), 'set');
    writeAllAtomically([{ path: join(out, 'a.txt'), data: 'a1' }, { path: join(out, 'sub', 'b.txt'), data: 'b1' }], out);
    writeAllAtomically([{ path: join(out, 'c.txt'), data: 'c2' }, { path: join(out, 'a.txt'), data: 'a2' }], out);
    expect(readdirSync(out).sort()).toEqual([SET_MARKER, 'a.txt', 'c.txt']);
    expect(readFileSync(join(out, 'a.txt'), 'utf8')).toBe('a2');
    expect(temporaries(join(out, '..'))).toEqual([]);
  });

  it('a folder that holds files framewright did not write is refused and left untouched', () => {
    const out = tmp();
    writeFileSync(join(out, 'my-own-drawing.dxf'), 'mine');
    expect(() => writeAllAtomically([{ path: join(out, 'arm.dxf'), data: 'x' }, { path: join(out, 'arm.svg'), data: 'y' }], out)).toThrow(UsageError);
    expect(readdirSync(out)).toEqual(['my-own-drawing.dxf']);
    expect(temporaries(join(out, '..')).filter((f) => f.includes(out.split('/').pop()!))).toEqual([]);
  });

  it('stale temporaries of a killed run are deleted by the next run; an old set moved aside is put back first', () => {
    const parent = tmp();
    const out = join(parent, 'o');
    // A run killed between its two renames: the old set aside, the target missing, the new set complete beside it.
    mkdirSync(join(parent, `.o.fw-old-${DEAD_PID}-0`));
    writeFileSync(join(parent, `.o.fw-old-${DEAD_PID}-0`, 'old.txt'), 'old');
    writeFileSync(join(parent, `.o.fw-old-${DEAD_PID}-0`, SET_MARKER), 'm');
    mkdirSync(join(parent, `.o.fw-new-${DEAD_PID}-0`));
    writeFileSync(join(parent, `.o.fw-tmp-${DEAD_PID}-3`), 'half a file');
    recoverOutputs(out);
    expect(readdirSync(out).sort()).toEqual([SET_MARKER, 'old.txt']);
    expect(temporaries(parent)).toEqual([]);
    // The same for a single file: its stale temporary goes on the next write.
    writeFileSync(join(parent, `.f.json.fw-tmp-${DEAD_PID}-1`), '{');
    writeAllAtomically([{ path: join(parent, 'f.json'), data: '{}' }]);
    expect(readdirSync(parent).sort()).toEqual(['f.json', 'o']);
  });

  it('temporaries of a process that still runs are left alone', () => {
    const parent = tmp();
    const live = join(parent, `.o.fw-new-${process.ppid}-0`);
    mkdirSync(live);
    writeAllAtomically([{ path: join(parent, 'o', 'x.txt'), data: 'x' }, { path: join(parent, 'o', 'y.txt'), data: 'y' }], join(parent, 'o'));
    expect(existsSync(live)).toBe(true);
  });
});

/** Files of a made-up set for the fast kill trials: 30 files of 64 KB (a longer write window than a build's). */
const WRITER = (dir: string, gen: number): string => `
import { writeAllAtomically } from ${JSON.stringify(join(REPO, 'dist', 'cli', 'outputSet.js'))};
const files = Array.from({ length: 30 - ${gen} }, (_, i) => ({ path: ${JSON.stringify(dir)} + '/part-' + i + '.txt', data: String(${gen}).repeat(65536) + i }));
writeAllAtomically(files, ${JSON.stringify(dir)});`;

/**
 * One trial: the old set in place, a command writing a new set into it, SIGKILL `delayMs` after
 * start or, when `atWrite`, after the new set's temporary folder appears (a build's write window is
 * a few milliseconds at the end of its run, so uniform moments alone would rarely hit it). Returns
 * the folder as the kill left it, the old set moved aside if any, and the folder after the
 * recovery that the next run does first.
 */
function killTrial(oldSet: ReadonlyMap<string, string>, args: readonly string[], delayMs: number, atWrite: boolean) {
  const parent = tmp();
  const out = join(parent, 'o');
  mkdirSync(out);
  for (const [name, data] of oldSet) writeFileSync(join(out, name), data, 'latin1');
  return new Promise<{ before: Map<string, string> | null; aside: Map<string, string> | null; after: Map<string, string> | null; parent: string }>((done) => {
    const child = spawn(process.execPath, args.map((a) => a.replaceAll('{out}', out)), { cwd: REPO, stdio: 'ignore' });
    let timer: NodeJS.Timeout | undefined;
    const kill = () => child.kill('SIGKILL');
    const watcher = atWrite
      ? watch(parent, (_e, name) => {
          if (timer === undefined && name?.startsWith('.o.fw-new-')) timer = setTimeout(kill, delayMs);
        })
      : null;
    if (!atWrite) timer = setTimeout(kill, delayMs);
    child.on('exit', () => {
      clearTimeout(timer);
      watcher?.close();
      const asideName = readdirSync(parent).find((f) => f.startsWith('.o.fw-old-'));
      const before = snapshot(out);
      const aside = asideName ? snapshot(join(parent, asideName)) : null;
      recoverOutputs(out);
      done({ before, aside, after: snapshot(out), parent });
    });
  });
}

/**
 * How long a command's write window lasts on this machine now: from its new set's temporary folder
 * appearing to the process's exit, the median of three runs over an old set. Kill moments drawn
 * over twice this window land before and after the swap about equally, whatever the machine's speed
 * (a fixed window missed the swap on an idle machine, where the writer takes longer to finish than
 * the fixed window from the folder's appearance).
 */
async function writeWindowMs(oldSet: ReadonlyMap<string, string>, args: readonly string[]): Promise<number> {
  const once = () => {
    const parent = tmp();
    const out = join(parent, 'o');
    mkdirSync(out);
    for (const [name, data] of oldSet) writeFileSync(join(out, name), data, 'latin1');
    return new Promise<number>((done) => {
      let appeared: number | undefined;
      const watcher = watch(parent, (_e, name) => {
        if (appeared === undefined && name?.startsWith('.o.fw-new-')) appeared = performance.now();
      });
      const child = spawn(process.execPath, args.map((a) => a.replaceAll('{out}', out)), { cwd: REPO, stdio: 'ignore' });
      child.on('exit', () => {
        watcher.close();
        done(appeared === undefined ? 0 : performance.now() - appeared);
      });
    });
  };
  const w = [await once(), await once(), await once()].sort((a, b) => a - b);
  return w[1];
}

/** Run seeded kill trials and check every outcome; returns how often each set survived. */
async function killTrials(seed: number, trials: number, oldSet: Map<string, string>, newSet: Map<string, string>, args: readonly string[], windowMs: number, runMs: number) {
  const random = rng(seed);
  const outcomes = { old: 0, new: 0, asideRestored: 0 };
  for (let i = 0; i < trials; i++) {
    const atWrite = i % 4 !== 3;
    const delay = Math.floor(random() * (atWrite ? windowMs : runMs * 1.2));
    const r = await killTrial(oldSet, args, delay, atWrite);
    const label = `trial ${i} (seed ${seed}): kill ${delay} ms after ${atWrite ? 'the new set appeared' : 'start'}`;
    if (r.before === null) {
      // Killed between the two renames: the old set waits, complete, under its temporary name.
      expect(same(r.aside, oldSet), label).toBe(true);
      outcomes.asideRestored++;
    } else {
      expect(same(r.before, oldSet) || same(r.before, newSet), label).toBe(true);
    }
    expect(same(r.after, oldSet) || same(r.after, newSet), label).toBe(true);
    if (same(r.after, oldSet)) outcomes.old++;
    else outcomes.new++;
    expect(temporaries(r.parent), label).toEqual([]);
  }
  return outcomes;
}

describe('a kill at any moment leaves one complete set (SIGKILL at seeded random moments; KILL_TRIALS=n for more)', () => {
  const scale = Number(process.env.KILL_TRIALS ?? 8) / 8;

  it('the built CLI: build killed while it writes, the folder is the old set or the new set, never a mixture', async () => {
    const dir = tmp();
    expect(runCli(['build', 'designs/mote-3.yaml', '--out', join(dir, 'old')]).code).toBe(0);
    const t0 = performance.now();
    expect(runCli(['build', 'designs/tessel-5.yaml', '--out', join(dir, 'new')]).code).toBe(0);
    const runMs = performance.now() - t0;
    const [oldSet, newSet] = [snapshot(join(dir, 'old'))!, snapshot(join(dir, 'new'))!];
    expect(same(oldSet, newSet)).toBe(false);
    const outcomes = await killTrials(15, Math.round(6 * scale), oldSet, newSet, [join(REPO, 'dist', 'cli', 'main.js'), 'build', 'designs/tessel-5.yaml', '--out', '{out}'], 12, runMs);
    expect(outcomes.old + outcomes.new).toBe(Math.round(6 * scale));
  }, 120_000);

  it('the writer alone, many more moments: 30 files of 64 KB replaced by 29 others', async () => {
    const dir = tmp();
    const make = (gen: number, out: string) => spawn(process.execPath, ['--input-type=module', '-e', WRITER(out, gen)], { stdio: 'ignore' });
    const finish = (p: ReturnType<typeof make>) => new Promise<void>((r) => p.on('exit', () => r()));
    await finish(make(1, join(dir, 'old')));
    const t0 = performance.now();
    await finish(make(2, join(dir, 'new')));
    const runMs = performance.now() - t0;
    const [oldSet, newSet] = [snapshot(join(dir, 'old'))!, snapshot(join(dir, 'new'))!];
    const args = ['--input-type=module', '-e', WRITER('{out}', 2)];
    const windowMs = Math.max(4, Math.ceil(2 * (await writeWindowMs(oldSet, args))));
    const outcomes = await killTrials(16, Math.round(24 * scale), oldSet, newSet, args, windowMs, runMs);
    if (process.env.KILL_TRIALS) console.log(JSON.stringify({ windowMs, ...outcomes }));
    // Both outcomes must have happened, or the kills missed the write window altogether.
    expect(outcomes.old, JSON.stringify(outcomes)).toBeGreaterThan(0);
    expect(outcomes.new, JSON.stringify(outcomes)).toBeGreaterThan(0);
  }, 120_000);
});
