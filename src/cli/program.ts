import { existsSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { Script } from 'node:vm';
import { packagePath } from './packageRoot.js';

/**
 * The published command line is one bundled script per kind of run (scripts/bundle-cli.mjs):
 * `help` holds the argument parser and the command descriptions only, `check` the stages `check`
 * runs, `full` every stage. Each is compiled with a V8 code cache made at build time from a training run, so a `check` does
 * not spend a third of its time parsing and compiling the same code on every start (what
 * `module.enableCompileCache()` does from Node 22 on). A cache that does not fit this node (another
 * V8 version or flags) is rejected by V8 and the script is compiled as usual: only slower.
 */
export type ProgramKind = 'help' | 'check' | 'full';

/** What a program script exports: the whole command line (src/cli/run.ts). */
export type Program = Readonly<{ runCommandLine: (argv: readonly string[]) => Promise<number> }>;

/** The build's record of the program scripts: file names carry a hash of their content, so a cache never meets another build's script. */
type Manifest = Record<ProgramKind, { script: string; cache: string }>;

const HELP_FLAGS = new Set(['-h', '--help', '-V', '--version', 'help']);

/**
 * The program a command line needs: `help` when it can only print help or the version (no
 * arguments, a first argument -h/--help/-V/--version/help, or `COMMAND --help`), `check` for the
 * check command, else `full`. They all parse with the same code, so `full` running any command
 * line gives the same result, only slower.
 */
export function programFor(args: readonly string[]): ProgramKind {
  if (args.length === 0 || HELP_FLAGS.has(args[0])) return 'help';
  if (args.length === 2 && (args[1] === '-h' || args[1] === '--help') && /^[a-z]+$/.test(args[0])) return 'help';
  return args[0] === 'check' ? 'check' : 'full';
}

const loaded = new Map<ProgramKind, { program: Program; script: Script; cachePath: string; hadCache: boolean }>();

const manifest = (): Manifest => JSON.parse(readFileSync(packagePath('dist', 'cli', 'programs.json'), 'utf8')) as Manifest;

/** Load (once) and run the top level of a program script, with its code cache when there is one. */
export function loadProgram(kind: ProgramKind): Program {
  const done = loaded.get(kind);
  if (done) return done.program;
  const entry = manifest()[kind];
  const file = packagePath('dist', 'cli', entry.script);
  const cachePath = packagePath('dist', 'cli', entry.cache);
  // The build makes every script ASCII: Latin-1 reads it exactly and faster than UTF-8.
  const source = readFileSync(file, 'latin1');
  // The CommonJS module wrapper, on one line so the script's own line numbers stay as built.
  const hadCache = existsSync(cachePath);
  const script = new Script(`(function (exports, require, module, __filename, __dirname) {${source}\n})`, {
    filename: file,
    ...(hadCache ? { cachedData: readFileSync(cachePath) } : {}),
  });
  const module = { exports: {} as Program };
  (script.runInThisContext() as (...a: unknown[]) => void)(module.exports, createRequire(file), module, file, dirname(file));
  loaded.set(kind, { program: module.exports, script, cachePath, hadCache });
  return module.exports;
}

/**
 * Write the code cache of the programs this process ran, beside their scripts. Only the build
 * calls this (through FRAMEWRIGHT_WRITE_CODE_CACHE, after a training run), so the cache holds the
 * compiled code of what a typical run executes, made with the flags main.ts sets.
 */
export function writeCodeCaches(): void {
  for (const { script, cachePath } of loaded.values()) {
    const tmp = join(dirname(cachePath), `.${process.pid}.cache.tmp`);
    writeFileSync(tmp, script.createCachedData());
    renameSync(tmp, cachePath);
  }
}

/** Whether V8 took each loaded program's code cache (for the bench's note): 'used', 'rejected' or 'none'. */
export function codeCacheStatus(): Partial<Record<ProgramKind, 'used' | 'rejected' | 'none'>> {
  const out: Partial<Record<ProgramKind, 'used' | 'rejected' | 'none'>> = {};
  for (const [kind, { script, hadCache }] of loaded) out[kind] = !hadCache ? 'none' : script.cachedDataRejected ? 'rejected' : 'used';
  return out;
}
