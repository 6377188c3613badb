import { parseDocument } from 'yaml';
import type { z } from 'zod';
import { DesignError, type DesignIssue } from './errors.js';

/**
 * Deepest nesting of collections an input file may have. A design nests five levels; the limit
 * keeps a hostile file (thousands of nested brackets) from exhausting the parser's stack.
 */
export const MAX_YAML_DEPTH = 64;

/**
 * Parse YAML or JSON text (JSON is YAML) into plain data: mappings, sequences, strings, finite
 * numbers, booleans and null, nothing else. Throws DesignError naming `sourceName` for a syntax
 * error, an unknown or non-plain tag (`!foo`, `!!binary`, `!!python/object`, ...), more than
 * MAX_YAML_DEPTH levels of nesting, `.nan` / `.inf`, and control characters in text. No warning is
 * ever printed: everything the parser notices is an error here.
 *
 * @example parseYamlText('name: Tessel 5\nprops: { diameter: 5.1in }', 'tessel-5.yaml')
 */
export function parseYamlText(text: string, sourceName: string): unknown {
  const bad = (message: string, path = ''): DesignError => new DesignError([{ path, value: path ? undefined : sourceName, message }]);
  const deep = nestingBeyond(text, MAX_YAML_DEPTH);
  if (deep) throw bad(`nests collections more than ${MAX_YAML_DEPTH} levels deep (line ${deep.line}, column ${deep.column}); a design file needs fewer than ten`);
  // resolveKnownTags: false leaves the YAML 1.1 extras (!!binary, !!set, !!timestamp...) unresolved, so they are refused below.
  const doc = parseDocument(text, { prettyErrors: true, resolveKnownTags: false, uniqueKeys: true });
  const problem = doc.errors[0] ?? doc.warnings[0];
  if (problem) {
    const where = problem.linePos?.[0] ? ` (line ${problem.linePos[0].line}, column ${problem.linePos[0].col})` : '';
    const first = problem.message.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '');
    if (problem.code === 'RESOURCE_EXHAUSTION') throw bad(`nests too deeply to read${where}`);
    if (problem.code === 'TAG_RESOLVE_FAILED') throw bad(`uses a tag framewright does not read${where}: ${first.replace(/^Unresolved tag: /, '')}; write plain values (numbers, text, lists, mappings)`);
    throw bad(`is not valid YAML or JSON${where}: ${first}`);
  }
  let value: unknown;
  try {
    value = doc.toJS({ maxAliasCount: 100 });
  } catch (e) {
    throw bad(`cannot be read: ${(e as Error).message.split('\n')[0]}`);
  }
  const issues: DesignIssue[] = [];
  plainDataIssues(value, [], issues, new Set());
  if (issues.length) throw new DesignError(issues.slice(0, 20));
  return value;
}

/** C0 controls but tab and line feed, DEL and C1 controls: characters no design text needs, and that break terminals and XML. */
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;

/** Anything in parsed data that is not plain: non-finite numbers, control characters, objects from tags. */
function plainDataIssues(v: unknown, path: readonly string[], out: DesignIssue[], open: Set<object>): void {
  const at = path.join('.');
  if (v === null || typeof v === 'boolean') return;
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) out.push({ path: at, value: v, message: 'is not a finite number; give a number' });
    return;
  }
  if (typeof v === 'string') {
    const m = CONTROL.exec(v);
    if (m) out.push({ path: at, value: v, message: `contains the control character U+${m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}; only printable text is allowed` });
    return;
  }
  const collection = Array.isArray(v) || (typeof v === 'object' && Object.getPrototypeOf(v) === Object.prototype);
  if (collection && open.has(v as object)) {
    out.push({ path: at, value: '(alias)', message: 'contains itself (an alias inside its own anchor); write the value out' });
    return;
  }
  if (collection) open.add(v as object);
  if (Array.isArray(v)) {
    v.forEach((x, i) => plainDataIssues(x, [...path, String(i)], out, open));
  } else if (collection) {
    for (const [k, x] of Object.entries(v as Record<string, unknown>)) {
      const m = CONTROL.exec(k);
      if (m) out.push({ path: [...path, k].join('.'), value: k, message: 'is a key with a control character; only printable text is allowed' });
      else plainDataIssues(x, [...path, k], out, open);
    }
  }
  if (collection) {
    open.delete(v as object);
    return;
  }
  out.push({ path: at, value: String(v), message: 'is not a plain value (number, text, list or mapping)' });
}

/**
 * Where the nesting of collections first goes deeper than `max`, or null. Counts flow brackets
 * outside quotes and comments, plus block levels (indentation steps and compact "- " entries);
 * an over-estimate is harmless at a limit this far above real designs.
 */
export function nestingBeyond(text: string, max: number): { line: number; column: number } | null {
  const indents: number[] = [];
  let flow = 0;
  let quote: '"' | "'" | null = null;
  let line = 1;
  let lineStart = 0;
  let atLineStart = true;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '\n') {
      line++;
      lineStart = i + 1;
      atLineStart = true;
      continue;
    }
    if (quote) {
      if (ch === '\\' && quote === '"') i++;
      else if (ch === quote) quote = null;
      continue;
    }
    if (atLineStart && flow === 0) {
      if (ch === ' ' || ch === '\t' || ch === '\r') continue;
      if (ch === '#') {
        const nl = text.indexOf('\n', i);
        i = (nl < 0 ? text.length : nl) - 1;
        continue;
      }
      atLineStart = false;
      const col = i - lineStart;
      while (indents.length && indents[indents.length - 1] >= col) indents.pop();
      indents.push(col);
      // Compact sequences ("- - - x") open one level per dash on the same line.
      let j = i;
      while (text[j] === '-' && (text[j + 1] === ' ' || text[j + 1] === '\t')) {
        indents.push(col + (j - i) + 1);
        j += 2;
        while (text[j] === ' ' || text[j] === '\t') j++;
      }
    }
    if (ch === '"' || ch === "'") quote = ch;
    else if (ch === '#' && (i === 0 || /\s/.test(text[i - 1]))) {
      const nl = text.indexOf('\n', i);
      i = (nl < 0 ? text.length : nl) - 1;
    } else if (ch === '[' || ch === '{') {
      flow++;
    } else if (ch === ']' || ch === '}') flow = Math.max(0, flow - 1);
    if (indents.length + flow > max) return { line, column: i - lineStart + 1 };
  }
  return null;
}

/**
 * zod issues as design issues: the dotted path (after `prefix`), the value the user gave there,
 * and the schema's message (which states the allowed range).
 */
export function issuesFromZod(issues: readonly z.core.$ZodIssue[], raw: unknown, prefix: readonly string[] = [], unknownKeyHint = 'see `framewright schema` for the allowed ones'): DesignIssue[] {
  return issues.map((i) => {
    const path = [...prefix, ...i.path.map(String)].join('.');
    if (i.code === 'unrecognized_keys') {
      return { path, value: i.keys, message: `unknown key${i.keys.length > 1 ? 's' : ''}; ${unknownKeyHint}` };
    }
    const value = valueAt(raw, i.path as PropertyKey[]);
    let message = i.message;
    if (value === undefined && (i.code === 'invalid_union' || (i.code === 'invalid_type' && !/required/.test(i.message)))) {
      message = i.code === 'invalid_type' ? `is required (${String(i.expected)})` : 'is required';
    }
    return { path, value, message };
  });
}

function valueAt(raw: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = raw;
  for (const k of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[k];
  }
  return v;
}
