// The training runs that make the V8 code caches of the built command line (scripts/bundle-cli.mjs
// runs them at build time; test/cli/codeCache.test.ts runs them again in a copy of the package and
// compares the bytes). Each program's cache holds what a typical run of it compiles, made by the
// built CLI itself so that V8's version and flags match the runs to come.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** Each program's training run (src/cli/program.ts `programFor` must send it to that program); OUT is a fresh folder. */
export const TRAINING = {
  help: ['--help'],
  check: ['check', 'designs/tessel-5.yaml', 'designs/mote-3.yaml', 'designs/farline-7.yaml'],
  full: ['build', 'designs/tessel-5.yaml', '--out', 'OUT'],
};

/**
 * A fixed string hash seed for the training runs: with node's random one, the hash-ordered tables in a
 * code cache make every build's bytes differ. src/cli/main.ts sets the flag back to its default
 * before the cache is written, so the cache carries an ordinary run's flag hash.
 */
export const TRAINING_HASH_SEED = 20260;

/**
 * Run the built CLI in `packageDir` once for `kind`, writing that program's code cache beside its
 * script (dist/cli/KIND-HASH.cache, named in dist/cli/programs.json). Throws when the run fails.
 */
export function trainCodeCache(packageDir, kind) {
  const cliDir = join(packageDir, 'dist', 'cli');
  // A run that loaded an earlier cache would compile less and write other bytes: start from none.
  rmSync(join(cliDir, JSON.parse(readFileSync(join(cliDir, 'programs.json'), 'utf8'))[kind].cache), { force: true });
  // V8 flags in NODE_OPTIONS would be recorded in the cache's flag hash, and an ordinary run would reject it.
  const { NODE_OPTIONS: _, ...env } = process.env;
  const scratch = mkdtempSync(join(tmpdir(), 'framewright-training-'));
  try {
    const args = TRAINING[kind].map((a) => (a === 'OUT' ? join(scratch, 'out') : a));
    const r = spawnSync(process.execPath, [`--hash-seed=${TRAINING_HASH_SEED}`, join(cliDir, 'framewright.cjs'), ...args], {
      cwd: packageDir,
      env: { ...env, FRAMEWRIGHT_WRITE_CODE_CACHE: '1' },
      stdio: ['ignore', 'ignore', 'pipe'],
      encoding: 'utf8',
    });
    // 1 is a design with errors: still a full run.
    if (r.status !== 0 && r.status !== 1) throw new Error(`training run framewright ${args.join(' ')} failed (${r.status}): ${r.stderr}`);
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}
