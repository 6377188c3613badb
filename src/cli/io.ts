import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { parseDesignText, type Design } from '../params/index.js';
import { DesignError } from '../params/errors.js';

/** Bad usage or input: printed without a stack trace, exit code 2. `path`: the option, file or parameter at fault, when known. */
export class UsageError extends Error {
  constructor(
    message: string,
    readonly path = '',
  ) {
    super(message);
  }
}

/** The command-line name for standard input. */
export const STDIN = '-';

/** Standard input as text (the design given as `-`). */
function readStdin(): string {
  try {
    return readFileSync(0, 'utf8');
  } catch (e) {
    throw new UsageError(`cannot read standard input: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, STDIN);
  }
}

/** A text file's contents; a missing or unreadable file is a UsageError naming it. */
export function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new UsageError(`cannot read ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, path);
  }
}

/**
 * Read and validate a design file, or standard input for `-`. A DXF drawing is refused with a
 * pointer to the commands that take one.
 */
export function readDesign(path: string): Design {
  if (path === STDIN) return parseDesignText(readStdin(), 'standard input');
  if (/\.dxf$/i.test(path)) {
    throw new UsageError(`${path} is a DXF drawing; this command takes a design file (YAML or JSON). For a DXF use \`framewright check\` or \`framewright modes\`.`);
  }
  return parseDesignText(readText(path), path);
}

/** One output file to write: its path and its bytes. */
export type OutputFile = Readonly<{ path: string; data: string | Uint8Array }>;

/**
 * Make a folder and its missing parents one level at a time (a recursive mkdir can spin forever on
 * special file systems). Returns the folders it created, outermost first. Throws UsageError.
 */
function ensureDir(dir: string): string[] {
  const missing: string[] = [];
  let d = resolve(dir);
  for (;;) {
    let st;
    try {
      st = statSync(d);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw new UsageError(`cannot write into ${dir}: ${(e as NodeJS.ErrnoException).code}`);
      missing.push(d);
      const up = dirname(d);
      if (up === d) break;
      d = up;
      continue;
    }
    if (!st.isDirectory()) throw new UsageError(`cannot write into ${dir}: ${d} is not a folder`);
    break;
  }
  const created: string[] = [];
  for (const m of missing.reverse()) {
    try {
      mkdirSync(m);
    } catch (e) {
      throw new UsageError(`cannot create ${m}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
    }
    created.push(m);
  }
  return created;
}

/**
 * Write every file or none: each goes to a temporary name beside its target; only when all are
 * written are they renamed into place, and a file that was already there is kept aside until the
 * end so a failed rename puts everything back as it was. File-system failures become UsageError
 * (exit 2) naming the path.
 */
export function writeAllAtomically(files: readonly OutputFile[]): void {
  const temps: Array<{ tmp: string; path: string; backup?: string }> = [];
  const createdDirs: string[] = [];
  const renamed: Array<{ tmp: string; path: string; backup?: string }> = [];
  try {
    for (const f of files) {
      createdDirs.push(...ensureDir(dirname(f.path)));
      const tmp = join(dirname(f.path), `.${process.pid}.${temps.length}.tmp`);
      writeFileSync(tmp, f.data);
      temps.push({ tmp, path: f.path });
    }
    for (const t of temps) {
      if (existsSync(t.path)) {
        t.backup = `${t.tmp}.previous`;
        renameSync(t.path, t.backup);
      }
      renameSync(t.tmp, t.path);
      renamed.push(t);
    }
  } catch (e) {
    for (const t of renamed.reverse()) {
      rmSync(t.path, { force: true });
      if (t.backup) renameSync(t.backup, t.path);
    }
    for (const t of temps) {
      rmSync(t.tmp, { force: true });
      if (t.backup && existsSync(t.backup) && !renamed.includes(t)) renameSync(t.backup, t.path);
    }
    for (const d of createdDirs.reverse()) rmSync(d, { recursive: true, force: true });
    if (e instanceof UsageError) throw e;
    const err = e as NodeJS.ErrnoException;
    throw new UsageError(`cannot write ${err.path ?? 'the output'}: ${err.code ?? err.message}; nothing was written`);
  }
  for (const t of temps) if (t.backup) rmSync(t.backup, { force: true });
}

/** The exit code an error stands for: 2 bad input or usage, 3 a defect. */
export const exitCodeOf = (e: unknown): number => (e instanceof DesignError || e instanceof UsageError ? 2 : 3);

/**
 * An error as the JSON object `--json` prints on standard output: `{ "error": { "message", "path" } }`,
 * plus every issue for a design with several problems. `path` names the parameter, option or file
 * at fault ('' when none is known).
 */
export function errorJson(e: unknown): { error: { message: string; path: string; issues?: Array<{ path: string; message: string }> } } {
  if (e instanceof DesignError) {
    return { error: { message: e.message, path: e.issues[0]?.path ?? '', issues: e.issues.map((i) => ({ path: i.path, message: i.message })) } };
  }
  const message = (e as Error)?.message ?? String(e);
  if (e instanceof UsageError) return { error: { message, path: e.path || (/^(--[a-z0-9-]+)\b/.exec(message)?.[1] ?? '') } };
  return { error: { message: `internal error (please report it with the design file): ${message}`, path: '' } };
}

/** Turn an error into a message and exit code; a bug (anything unexpected) keeps its stack. */
export function reportError(e: unknown): number {
  if (e instanceof DesignError) {
    process.stderr.write(`framewright: ${e.issues.length === 1 ? 'a problem' : `${e.issues.length} problems`} in the input; nothing was written.\n${e.message}\n`);
    return 2;
  }
  if (e instanceof UsageError) {
    process.stderr.write(`framewright: ${e.message}\n`);
    return 2;
  }
  process.stderr.write(`framewright: internal error (please report it with the design file):\n${(e as Error)?.stack ?? String(e)}\n`);
  return 3;
}
