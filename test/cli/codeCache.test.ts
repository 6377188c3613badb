import { spawnSync } from 'node:child_process';
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REPO } from '../helpers/demo.js';
import { STACK_LINE } from '../helpers/cli.js';
// @ts-expect-error a build script in plain JavaScript, without declarations
import { trainCodeCache } from '../../scripts/train-code-cache.mjs';

/**
 * The V8 code caches the build ships beside the program scripts (src/cli/program.ts,
 * scripts/train-code-cache.mjs): the same bytes from every build, taken by an ordinary run, and
 * refused without harm (the script is compiled as usual, same output) when they do not fit the
 * node that runs them. All in real processes: only a process shows which cache V8 took.
 */

const CLI_DIR = join(REPO, 'dist', 'cli');
const TESSEL = join(REPO, 'designs', 'tessel-5.yaml');
type Entry = { script: string; cache: string };
/** dist/cli/programs.json of a package folder: each program's script and cache. */
const programs = (packageDir: string): Record<'help' | 'check' | 'full', Entry> =>
  JSON.parse(readFileSync(join(packageDir, 'dist', 'cli', 'programs.json'), 'utf8')) as Record<'help' | 'check' | 'full', Entry>;

const tmp = mkdtempSync(join(tmpdir(), 'fw-code-cache-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

/** The launcher, the record and the help and check programs with their caches, in a package folder of their own (no node_modules: neither program loads a package). */
function packageCopy(name: string): string {
  const dir = join(tmp, name);
  mkdirSync(join(dir, 'dist', 'cli'), { recursive: true });
  writeFileSync(join(dir, 'package.json'), JSON.stringify({ name: 'framewright', version: '0.0.0' }));
  cpSync(join(REPO, 'designs'), join(dir, 'designs'), { recursive: true });
  const record = programs(REPO);
  for (const f of ['framewright.cjs', 'programs.json', record.help.script, record.help.cache, record.check.script, record.check.cache]) cpSync(join(CLI_DIR, f), join(dir, 'dist', 'cli', f));
  return dir;
}

/** `framewright check` on Tessel 5 as JSON, with the launcher's note of which cache V8 took. */
function check(packageDir: string, nodeFlags: string[] = []): { code: number; stdout: string; cache: string } {
  const { NODE_OPTIONS: _, ...env } = process.env;
  const r = spawnSync(process.execPath, [...nodeFlags, join(packageDir, 'dist', 'cli', 'framewright.cjs'), 'check', TESSEL, '--json'], {
    cwd: tmp,
    encoding: 'utf8',
    env: { ...env, FRAMEWRIGHT_CODE_CACHE_STATUS: '1' },
  });
  const note = /^code cache: (.*)$/m.exec(r.stderr);
  return { code: r.status ?? -1, stdout: r.stdout, cache: note ? (JSON.parse(note[1]) as { check: string }).check : `no note in: ${r.stderr}` };
}

describe('the code caches of the built command line', () => {
  let ordinary: ReturnType<typeof check>;
  beforeAll(() => {
    ordinary = check(REPO);
  });

  it('are taken by an ordinary run of the node that built them', () => {
    expect(ordinary.code, ordinary.stdout).toBe(0);
    expect(ordinary.cache).toBe('used');
  });

  it('are taken in a package folder elsewhere (where npm installs it), and come out the same from every training run there', () => {
    const dir = packageCopy('moved');
    expect(check(dir).cache).toBe('used');
    const record = programs(dir);
    for (const kind of ['help', 'check'] as const) {
      const cache = join(dir, 'dist', 'cli', record[kind].cache);
      trainCodeCache(dir, kind);
      const first = readFileSync(cache);
      trainCodeCache(dir, kind);
      // V8 keeps the script's file name in the cache: the bytes are those of a build in this folder.
      expect(readFileSync(cache).equals(first), kind).toBe(true);
    }
    expect(check(dir).cache).toBe('used');
  });

  /** The check's run must not tell: exit 0 and the ordinary run's output, byte for byte. */
  const sameAsOrdinary = (run: ReturnType<typeof check>, cache: string): void => {
    expect(run.cache).toBe(cache);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe(ordinary.stdout);
  };

  /** A package copy whose check cache `damage` rewrote; returns the cache's path. */
  const damagedCopy = (name: string, damage: (bytes: Buffer) => Buffer): string => {
    const dir = packageCopy(name);
    const cache = join(dir, 'dist', 'cli', programs(dir).check.cache);
    writeFileSync(cache, damage(readFileSync(cache)));
    return cache;
  };

  it('are refused under other V8 flags, and the run gives the same output', () => {
    // Any V8 flag off its default changes the flag hash a cache records (V8 src/snapshot/code-serializer.cc, SanityCheck).
    sameAsOrdinary(check(REPO, ['--stack-size=900']), 'rejected');
  });

  it('are refused when made by another V8 version, and the run gives the same output', () => {
    const cache = damagedCopy('other-version', (bytes) => {
      // The version hash is the header's second uint32 (V8 src/snapshot/code-serializer.h, SerializedCodeData kVersionHashOffset = 4).
      bytes.writeUInt32LE(bytes.readUInt32LE(4) ^ 0x5a5a5a5a, 4);
      return bytes;
    });
    sameAsOrdinary(check(join(cache, '..', '..', '..')), 'rejected');
  });

  it('are refused when cut short, and a missing one is no cache at all; the output is the same', () => {
    const cache = damagedCopy('cut-short', (bytes) => bytes.subarray(0, 4096));
    const dir = join(cache, '..', '..', '..');
    sameAsOrdinary(check(dir), 'rejected');
    rmSync(cache);
    sameAsOrdinary(check(dir), 'none');
  });

  it('a program script missing from the install is one line and exit 3 (a bug), no stack trace', () => {
    const dir = packageCopy('broken');
    rmSync(join(dir, 'dist', 'cli', programs(dir).check.script));
    const r = spawnSync(process.execPath, [join(dir, 'dist', 'cli', 'framewright.cjs'), 'check', TESSEL], { cwd: tmp, encoding: 'utf8' });
    expect(r.status).toBe(3);
    expect(r.stderr).toMatch(/^framewright: internal error: .*check-[0-9a-f]{12}\.cjs.*\n$/);
    expect(r.stderr).not.toMatch(STACK_LINE);
  });
});
