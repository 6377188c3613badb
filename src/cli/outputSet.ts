import { lstatSync, mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, isAbsolute, join, relative, resolve, sep } from 'node:path';
import { UsageError } from './usageError.js';

/** One output file to write: its path and its bytes. */
export type OutputFile = Readonly<{ path: string; data: string | Uint8Array }>;

/**
 * The file that marks a folder as an output set. A folder that exists and holds anything else but
 * not this file is never replaced: it may be the user's own folder.
 */
export const SET_MARKER = '.framewright-set';
const MARKER_TEXT = 'This folder is one output set written by framewright; the next run into it replaces the whole folder.\n';

/** Temporary names beside a target: `.NAME.fw-new-PID-N` (set being written), `-old-` (set being replaced), `-tmp-` (one file). */
const TEMP = /^\.(.+)\.fw-(new|old|tmp)-(\d+)-(\d+)$/;
let counter = 0;
const tempName = (target: string, kind: 'new' | 'old' | 'tmp', n: number): string => join(dirname(target), `.${basename(target)}.fw-${kind}-${process.pid}-${n}`);

/**
 * Write a command's output files so that a reader, or a kill at any moment, sees the complete old
 * outputs or the complete new ones, never a mixture:
 *
 * - several files form a set, the folder `setDir` (default: the deepest folder holding them all):
 *   the whole set is written to a hidden folder beside it, then swapped in by two renames
 *   (old set aside, new set in) and the old set deleted. A run killed between the two renames
 *   leaves the old set under its temporary name; the next run into the same folder puts it back
 *   (`recoverOutputs`) before it starts, and deletes every other stale temporary.
 * - one file alone is written to a hidden temporary beside it and renamed over the target.
 *
 * An existing set folder is replaced only when it is empty or carries the SET_MARKER file, which
 * every set gets. Missing parent folders are made; on any failure everything made is removed and
 * a UsageError (exit 2) names the path: nothing was written.
 *
 * @example writeAllAtomically([{ path: 'out/arm.dxf', data: dxf }, { path: 'out/arm.svg', data: svg }], 'out')
 */
export function writeAllAtomically(files: readonly OutputFile[], setDir?: string): void {
  if (files.length === 0) return;
  if (setDir === undefined && files.length === 1) return writeOneFile(files[0]);
  writeSet(resolve(setDir ?? commonFolder(files.map((f) => f.path))), files);
}

function writeOneFile(f: OutputFile): void {
  const target = resolve(f.path);
  const created = ensureDir(dirname(target), f.path);
  const tmp = tempName(target, 'tmp', counter++);
  try {
    recoverOutputs(target);
    if (isDirectory(target)) throw new UsageError(`cannot write ${f.path}: it is a folder`);
    writeFileSync(tmp, f.data, { flag: 'wx' });
    renameSync(tmp, target);
  } catch (e) {
    rmSync(tmp, { force: true });
    removeMade(created);
    throw asUsageError(e, f.path);
  }
}

function writeSet(target: string, files: readonly OutputFile[]): void {
  if (dirname(target) === target) throw new UsageError('cannot write an output set as the root folder; give a folder inside it');
  const cwd = resolve('.');
  if (cwd === target || cwd.startsWith(target + sep)) throw new UsageError(`cannot write the outputs as ${target}: it holds the current folder; give another folder`);
  const created = ensureDir(dirname(target), target);
  const n = counter++;
  const fresh = tempName(target, 'new', n);
  const aside = tempName(target, 'old', n);
  let movedAside = false;
  try {
    recoverOutputs(target);
    const exists = pathKind(target);
    if (exists === 'other') throw new UsageError(`cannot write the outputs into ${target}: it is a file, not a folder`);
    if (exists === 'dir' && !replaceable(target)) {
      throw new UsageError(`${target} holds files framewright did not write (it has no ${SET_MARKER}); give a new or empty folder, or empty this one first`);
    }
    mkdirSync(fresh);
    for (const f of files) {
      const rel = relative(target, resolve(f.path));
      if (rel === '' || rel.startsWith('..') || isAbsolute(rel)) throw new Error(`output ${f.path} lies outside its set folder ${target}`);
      const path = join(fresh, rel);
      mkdirSync(dirname(path), { recursive: true });
      writeFileSync(path, f.data, { flag: 'wx' });
    }
    writeFileSync(join(fresh, SET_MARKER), MARKER_TEXT, { flag: 'wx' });
    if (exists === 'dir') {
      renameSync(target, aside);
      movedAside = true;
    }
    renameSync(fresh, target);
    movedAside = false;
  } catch (e) {
    if (movedAside) renameSync(aside, target);
    rmSync(fresh, { recursive: true, force: true });
    removeMade(created);
    throw asUsageError(e, target);
  }
  // The new set is in place; the old one is only garbage now (a kill here is cleaned up next time).
  rmSync(aside, { recursive: true, force: true });
}

/**
 * Clean up after runs that were killed while writing `target` (a set folder or a single file):
 * when the target is missing but a killed run had moved the old set aside, the old set is put
 * back; every other temporary of a process that no longer runs is deleted. Temporaries of a
 * process that still runs are left alone.
 */
export function recoverOutputs(target: string): void {
  const t = resolve(target);
  const parent = dirname(t);
  let names: string[];
  try {
    names = readdirSync(parent);
  } catch {
    return;
  }
  const stale = names
    .map((name) => ({ name, m: TEMP.exec(name) }))
    .filter((x): x is { name: string; m: RegExpExecArray } => x.m !== null && x.m[1] === basename(t) && !running(Number(x.m[3])))
    .sort((a, b) => Number(a.m[3]) - Number(b.m[3]) || Number(a.m[4]) - Number(b.m[4]) || a.name.localeCompare(b.name));
  const aside = stale.find((x) => x.m[2] === 'old');
  if (aside && pathKind(t) === 'none') renameSync(join(parent, aside.name), t);
  for (const x of stale) rmSync(join(parent, x.name), { recursive: true, force: true });
}

/** Whether a process still runs (our own process counts as not running: its writes are synchronous). */
function running(pid: number): boolean {
  if (pid === process.pid) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

function replaceable(dir: string): boolean {
  const names = readdirSync(dir);
  return names.length === 0 || names.includes(SET_MARKER);
}

function pathKind(p: string): 'none' | 'dir' | 'other' {
  try {
    return lstatSync(p).isDirectory() ? 'dir' : 'other';
  } catch {
    return 'none';
  }
}

const isDirectory = (p: string): boolean => pathKind(p) === 'dir';

/** The deepest folder that holds every path. */
function commonFolder(paths: readonly string[]): string {
  const split = paths.map((p) => dirname(resolve(p)).split(sep));
  const first = split[0];
  let k = 0;
  while (k < first.length && split.every((s) => s[k] === first[k])) k++;
  return first.slice(0, k).join(sep) || sep;
}

/**
 * Make a folder and its missing parents one level at a time (a recursive mkdir can spin forever on
 * special file systems). Returns the folders it created, outermost first. Throws UsageError.
 */
function ensureDir(dir: string, shown: string): string[] {
  const missing: string[] = [];
  let d = resolve(dir);
  for (;;) {
    let st;
    try {
      st = statSync(d);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw new UsageError(`cannot write into ${shown}: ${(e as NodeJS.ErrnoException).code}; nothing was written`);
      missing.push(d);
      const up = dirname(d);
      if (up === d) break;
      d = up;
      continue;
    }
    if (!st.isDirectory()) throw new UsageError(`cannot write into ${shown}: ${d} is not a folder; nothing was written`);
    break;
  }
  const created: string[] = [];
  for (const m of missing.reverse()) {
    try {
      mkdirSync(m);
    } catch (e) {
      removeMade(created);
      throw new UsageError(`cannot create ${m}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
    }
    created.push(m);
  }
  return created;
}

function removeMade(created: readonly string[]): void {
  for (const d of [...created].reverse()) rmSync(d, { recursive: true, force: true });
}

function asUsageError(e: unknown, shown: string): Error {
  if (e instanceof UsageError) return e;
  const err = e as NodeJS.ErrnoException;
  if (!err.code) return err;
  return new UsageError(`cannot write ${err.path ?? shown}: ${err.code}; nothing was written`);
}
