#!/usr/bin/env node
import { codeCacheStatus, loadProgram, programFor, writeCodeCaches, type Program } from './program.js';

/** Set to true by scripts/bundle-cli.mjs; absent when the sources run directly (`npm run dev`). */
declare const FRAMEWRIGHT_BUNDLE: boolean | undefined;

// No top-level await here: the bundle of this file is the `bin`, a CommonJS script (starting an ES
// module costs every run a few milliseconds more; scripts/bundle-cli.mjs).
async function main(): Promise<void> {
  const kind = programFor(process.argv.slice(2));
  if (process.env.FRAMEWRIGHT_WRITE_CODE_CACHE === '1') {
    // A build's training run (scripts/train-code-cache.mjs) starts node with a fixed string hash seed: a
    // code cache holds hash-ordered tables, so a random seed would make every build's cache bytes
    // differ. The seed is taken when node starts; setting the flag back to its default (0, random)
    // now leaves that seed in use and gives the cache the flag hash of an ordinary run, which V8
    // compares before it takes a cache.
    const { setFlagsFromString } = await import('node:v8');
    setFlagsFromString('--hash-seed=0');
  }
  if (kind !== 'help') {
    // Most runs last a fraction of a second: V8's optimising compiler, tuned for long-lived pages,
    // would spend more CPU compiling hot functions (on a second thread, competing for the core)
    // than the optimised code then saves. A 15× larger interrupt budget (the bytecode a function
    // runs before V8 considers optimising it; Node 20's default is 67,584) lets short commands
    // finish in the interpreter and baseline code, while long runs (nesting, modes) still get
    // optimised code after a few milliseconds more. Measured in DEVELOPERS.md "Start-up"; only the
    // command line sets it, never the library. Printing help is too short to care, and skips
    // loading node:v8. A code cache records V8's flags: the build's training runs take this path.
    const { setFlagsFromString } = await import('node:v8');
    setFlagsFromString('--interrupt-budget=1000000');
  }

  // A reader that stops early (`framewright schema | head`) closes the pipe: end quietly, as a
  // shell tool does, instead of a stack trace for the write that could not be delivered.
  for (const stream of [process.stdout, process.stderr]) {
    stream.on('error', (e: NodeJS.ErrnoException) => {
      if (e.code !== 'EPIPE') throw e;
      process.exit(typeof process.exitCode === 'number' ? process.exitCode : 0);
    });
  }

  // The built package runs its bundled program scripts with their code caches (program.ts); the
  // sources run as they are.
  const program: Program = typeof FRAMEWRIGHT_BUNDLE !== 'undefined' ? loadProgram(kind) : await import('./run.js');
  process.exitCode = await program.runCommandLine(process.argv);

  // The build's training runs (scripts/train-code-cache.mjs) and the check of which cache V8 took.
  if (process.env.FRAMEWRIGHT_WRITE_CODE_CACHE === '1') writeCodeCaches();
  if (process.env.FRAMEWRIGHT_CODE_CACHE_STATUS === '1') process.stderr.write(`code cache: ${JSON.stringify(codeCacheStatus())}\n`);
}

// runCommandLine reports every error of a command itself; what reaches here is a broken install (a
// program script or its record missing): one line and exit 3 (a bug), no stack trace.
main().catch((e: unknown) => {
  process.stderr.write(`framewright: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 3;
});
