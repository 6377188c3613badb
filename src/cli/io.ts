import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import type { Design } from '../params/design.js';
import { DesignError } from '../params/errors.js';
import { printable } from '../export/format.js';
import { binaryKind, decodeText } from './fileKind.js';
import { UsageError } from './usageError.js';

// This module is loaded by every command at start-up (main.ts imports reportError): keep it free
// of heavy imports. Stages are loaded with `await import()` where they are used.

export { UsageError };

/** Largest design or shop file read, bytes. A design is a few kilobytes; this leaves room for generated ones. */
export const MAX_DESIGN_BYTES = 1024 * 1024;

/**
 * Largest DXF read, bytes. Beyond the reader's 5 million group-code pairs (about 12 bytes a pair)
 * no drawing can be read anyway; a plate drawing is kilobytes, a full sheet a few megabytes.
 */
export const MAX_DXF_BYTES = 64 * 1024 * 1024;

/** The path that means standard input. */
export const STDIN_PATH = '-';

const CHUNK = 64 * 1024;
const MB = (n: number): string => `${(n / 1048576).toFixed(n < 1048576 ? 2 : 0)} MB`;
const shownName = (path: string): string => (path === STDIN_PATH ? 'standard input' : path);

/**
 * Read a whole file (or standard input for `-`) but never more than `maxBytes`: a regular file
 * is judged by its size before reading, anything else (a pipe, a device such as /dev/zero) is read
 * in chunks and refused as soon as it passes the limit, or as soon as its first chunk shows it is
 * binary when `refuseBinary` is set. `what` names the expected content in messages
 * ("a design file (YAML or JSON)"). Throws UsageError naming the file, exit code 2.
 *
 * @example readBounded('designs/tessel-5.yaml', MAX_DESIGN_BYTES, 'a design file (YAML or JSON)')
 */
export function readBounded(path: string, maxBytes: number, what: string, refuseBinary = true): Buffer {
  const name = shownName(path);
  let fd: number;
  try {
    fd = path === STDIN_PATH ? 0 : openSync(path, 'r');
  } catch (e) {
    throw new UsageError(`cannot read ${name}: ${errCode(e)}`);
  }
  try {
    const st = fstatSync(fd);
    if (st.isDirectory()) throw new UsageError(`${name} is a folder, not ${what}`);
    if (st.isFile() && st.size > maxBytes) throw new UsageError(`${name} is ${MB(st.size)}, more than the ${MB(maxBytes)} allowed for ${what}`);
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const buf = Buffer.allocUnsafe(CHUNK);
      const n = readChunk(fd, buf);
      if (n === 0) break;
      if (total === 0 && refuseBinary) {
        const kind = binaryKind(buf.subarray(0, n));
        if (kind) throw new UsageError(`${name} is ${kind}, not ${what}`);
      }
      chunks.push(buf.subarray(0, n));
      total += n;
      if (total > maxBytes) throw new UsageError(`${name} is more than the ${MB(maxBytes)} allowed for ${what}; nothing was read beyond that`);
    }
    return Buffer.concat(chunks, total);
  } catch (e) {
    if (e instanceof UsageError) throw e;
    throw new UsageError(`cannot read ${name}: ${errCode(e)}`);
  } finally {
    if (fd !== 0) closeSync(fd);
  }
}

/** One read; a non-blocking standard input that has nothing yet is waited for. */
function readChunk(fd: number, buf: Buffer): number {
  for (;;) {
    try {
      return readSync(fd, buf, 0, buf.length, null);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'EAGAIN') {
        Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 5);
        continue;
      }
      if (code === 'EOF') return 0;
      throw e;
    }
  }
}

const errCode = (e: unknown): string => (e as NodeJS.ErrnoException).code ?? (e as Error).message;

/**
 * A YAML or JSON input file's text (design, shop profile, sidecar): bounded by
 * MAX_DESIGN_BYTES, UTF-8 or UTF-16. A PDF, an image, a binary file or UTF-32 text is refused
 * saying what it is. Throws UsageError.
 */
export function readText(path: string, what = 'a YAML or JSON file'): string {
  const d = decodeText(readBounded(path, MAX_DESIGN_BYTES, what));
  if ('kind' in d) throw new UsageError(`${shownName(path)} is ${d.kind}, not ${what}`);
  if ('problem' in d) throw new UsageError(`${shownName(path)} is ${d.problem}`);
  return d.text;
}

/**
 * DXF text: bounded by MAX_DXF_BYTES; UTF-8 (R2007 and later) or, when that fails, the
 * single-byte code page older files use. Binary files are refused saying what they are.
 */
export function readDxfText(path: string): string {
  const bytes = readBounded(path, MAX_DXF_BYTES, 'a DXF drawing');
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return bytes.toString('latin1');
  }
}

/**
 * Read and validate a design file (the validation stage is loaded on first use). A DXF drawing is
 * refused with a pointer to the commands that take one. Throws UsageError or DesignError.
 */
export async function readDesign(path: string): Promise<Design> {
  if (/\.dxf$/i.test(path)) {
    throw new UsageError(`${path} is a DXF drawing; this command takes a design file (YAML or JSON). For a DXF use \`framewright check\` or \`framewright modes\`.`);
  }
  const text = readText(path, 'a design file (YAML or JSON)');
  const { parseDesignText } = await import('../params/design.js');
  return parseDesignText(text, shownName(path));
}

export { writeAllAtomically, recoverOutputs, SET_MARKER, type OutputFile } from './outputSet.js';

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
  if (e instanceof UsageError) return { error: { message, path: e.path || (/^(--[a-z0-9-]+)\b/.exec(message)?.[1] ?? /^cannot read (\S+):/.exec(message)?.[1] ?? '') } };
  return { error: { message: `internal error (please report it with the design file): ${message}`, path: '' } };
}

/** Turn an error into a message and exit code; a bug (anything unexpected) keeps its stack. */
export function reportError(e: unknown): number {
  if (e instanceof DesignError) {
    process.stderr.write(printable(`framewright: ${e.issues.length === 1 ? 'a problem' : `${e.issues.length} problems`} in the input; nothing was written.\n${e.message}\n`));
    return 2;
  }
  if (e instanceof UsageError) {
    // printable: a file name or value must not reach the terminal with control characters in it.
    process.stderr.write(printable(`framewright: ${e.message}\n`));
    return 2;
  }
  process.stderr.write(`framewright: internal error (please report it with the design file):\n${(e as Error)?.stack ?? String(e)}\n`);
  return 3;
}
