import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { parseDesignText, type Design } from '../params/index.js';
import { DesignError } from '../params/errors.js';

/** Bad usage or input: printed without a stack trace, exit code 2. */
export class UsageError extends Error {}

export function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new UsageError(`cannot read ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
}

export function readDesign(path: string): Design {
  return parseDesignText(readText(path), path);
}

/** One output file to write: its path and its bytes. */
export type OutputFile = Readonly<{ path: string; data: string | Uint8Array }>;

/**
 * Write every file or none: each goes to a temporary name beside its target, and only when all
 * are written are they renamed into place. A failure removes the temporaries.
 */
export function writeAllAtomically(files: readonly OutputFile[]): void {
  const temps: Array<{ tmp: string; path: string }> = [];
  try {
    for (const f of files) {
      mkdirSync(dirname(f.path), { recursive: true });
      const tmp = join(dirname(f.path), `.${process.pid}.${temps.length}.tmp`);
      writeFileSync(tmp, f.data);
      temps.push({ tmp, path: f.path });
    }
    for (const t of temps) renameSync(t.tmp, t.path);
  } catch (e) {
    for (const t of temps) rmSync(t.tmp, { force: true });
    throw e;
  }
}

/** Turn an error into a message and exit code; a bug (anything unexpected) keeps its stack. */
export function reportError(e: unknown): number {
  if (e instanceof DesignError) {
    process.stderr.write(`framewright: the design has ${e.issues.length === 1 ? 'a problem' : `${e.issues.length} problems`}; nothing was written.\n${e.message}\n`);
    return 2;
  }
  if (e instanceof UsageError) {
    process.stderr.write(`framewright: ${e.message}\n`);
    return 2;
  }
  process.stderr.write(`framewright: internal error (please report it with the design file):\n${(e as Error)?.stack ?? String(e)}\n`);
  return 3;
}
