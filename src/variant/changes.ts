import YAML, { isCollection, isMap, isPair, isScalar, isSeq, parseDocument, Scalar, type Document, type Node as YamlNode } from 'yaml';

/** One edit of the design file: the path of the key, old and new values, and why it changed. */
export type Change = Readonly<{
  path: readonly (string | number)[];
  old: unknown;
  new: unknown;
  why: string;
}>;

/** A change's path as users see it in the change table: `layout.wheelbaseMm`, `stacks.0.place`. */
export const pathText = (path: readonly (string | number)[]): string => path.map(String).join('.');

const same = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);

/** Keep only changes whose value really differs. */
export const realChanges = (changes: readonly Change[]): Change[] => changes.filter((c) => !same(c.old, c.new));

/** A value as YAML flow text: `10.5`, `7in`, `"a: b"`, `[16, 19]`, `{ xMm: 5 }`; double quotes where the old node had them (JSON sources). */
function flowText(v: unknown, doubleQuoted: boolean): string {
  if (Array.isArray(v)) return `[${v.map((x) => flowText(x, doubleQuoted)).join(', ')}]`;
  if (v !== null && typeof v === 'object') {
    const pairs = Object.entries(v).map(([k, x]) => `${flowText(k, doubleQuoted)}: ${flowText(x, doubleQuoted)}`);
    return pairs.length ? `{ ${pairs.join(', ')} }` : '{}';
  }
  if (typeof v === 'string' && doubleQuoted) return JSON.stringify(v);
  if (typeof v === 'number' || typeof v === 'boolean' || typeof v === 'string') return YAML.stringify(v).trimEnd();
  throw new Error(`cannot write ${JSON.stringify(v)} into a design file`);
}

type Splice = { start: number; end: number; text: string };

/**
 * Apply changes to design text (YAML or JSON) and return the new text. A value whose key exists is
 * replaced in place, character range for character range, so every comment, blank line, key order
 * and the style of every untouched value stay byte-identical. A change whose `new` is `undefined`
 * removes the key (or list item); a key that does not exist yet is added after the last key of its
 * map (a missing parent map is added as a flow map), in the map's own style. Only where the text
 * offers no place to splice (a parent that is not a map) does the `yaml` document API add the key.
 * Throws Error for text with YAML errors or changes that overlap (a value and a part of it).
 */
export function editDesignText(text: string, changes: readonly Change[]): string {
  const doc = parseDocument(text);
  if (doc.errors.length) throw new Error(`cannot edit a design with YAML errors: ${doc.errors[0].message}`);
  const json = text.trimStart().startsWith('{');
  const splices: Splice[] = [];
  const missing: Change[] = [];
  for (const c of realChanges(changes)) {
    const splice = c.new === undefined ? removalSplice(doc, text, c.path) : replacementSplice(doc, text, c, json) ?? insertionSplice(doc, text, c.path, c.new, json);
    if (splice) splices.push(splice);
    else if (c.new !== undefined) missing.push(c);
  }
  // Right to left, so earlier offsets stay valid; insertions at one place keep the order of the changes.
  const order = splices.map((s, i) => ({ s, i })).sort((a, b) => b.s.start - a.s.start || b.i - a.i);
  for (let k = 1; k < order.length; k++) {
    if (order[k].s.end > order[k - 1].s.start) throw new Error('overlapping design edits (a value and a part of it changed together)');
  }
  let out = text;
  for (const { s } of order) out = out.slice(0, s.start) + s.text + out.slice(s.end);
  if (missing.length === 0) return out;
  const doc2 = parseDocument(out);
  for (const c of missing) {
    const node = doc2.createNode(c.new);
    if (isCollection(node)) node.flow = true;
    doc2.setIn(c.path, node);
  }
  return doc2.toString({ flowCollectionPadding: false });
}

/** The new value spliced over the old one's characters, or null when the key does not exist. */
function replacementSplice(doc: Document, text: string, c: Change, json: boolean): Splice | null {
  const node = doc.getIn(c.path, true);
  if (!((isScalar(node) || isCollection(node)) && node.range)) return null;
  const quoted = isScalar(node) && node.type === Scalar.QUOTE_DOUBLE;
  // A block collection's range runs through its last line break; keep that white space so the
  // next key stays on its own line (a flow value on the line below its key is valid YAML).
  const trailing = /\s*$/.exec(text.slice(node.range[0], node.range[1]))![0];
  const value = flowText(c.new, quoted || (isCollection(node) && json));
  return { start: node.range[0], end: node.range[1], text: isCollection(node) && !node.flow ? value + trailing : value };
}

/** Where each item of a map or list starts and where its value ends (character offsets). */
function itemSpans(coll: YamlNode): Array<{ key: unknown; start: number; end: number }> {
  const items = (isMap(coll) || isSeq(coll) ? coll.items : []) as unknown[];
  return items.map((item, i) => {
    if (isPair(item)) {
      const k = item.key as YamlNode | null;
      const v = item.value as YamlNode | null;
      const start = k?.range?.[0] ?? v?.range?.[0] ?? 0;
      return { key: isScalar(k) ? k.value : k, start, end: v?.range?.[1] ?? k?.range?.[1] ?? start };
    }
    const r = (item as YamlNode).range ?? [0, 0, 0];
    return { key: i, start: r[0], end: r[1] };
  });
}

/** Offset just past the line break ending the line that holds offset `at` (a block value may already end there). */
function lineEndAfter(text: string, at: number): number {
  if (at > 0 && text[at - 1] === '\n') return at;
  const nl = text.indexOf('\n', at);
  return nl < 0 ? text.length : nl + 1;
}

const lineStartOf = (text: string, at: number): number => text.lastIndexOf('\n', at - 1) + 1;

/** Remove a key or list item with its own line(s) (block style) or its comma (flow style). */
function removalSplice(doc: Document, text: string, path: readonly (string | number)[]): Splice | null {
  const parent = path.length > 1 ? doc.getIn(path.slice(0, -1), true) : doc.contents;
  if (!isCollection(parent)) return null;
  const spans = itemSpans(parent as YamlNode);
  const i = spans.findIndex((s) => s.key === path[path.length - 1]);
  if (i < 0) return null;
  const s = spans[i];
  if (parent.flow) {
    if (i + 1 < spans.length) return { start: s.start, end: spans[i + 1].start, text: '' };
    if (i > 0) return { start: spans[i - 1].end, end: s.end, text: '' };
    return { start: s.start, end: s.end, text: '' };
  }
  const lineStart = lineStartOf(text, s.start);
  const before = text.slice(lineStart, s.start);
  if (/^\s*$/.test(before) || (isSeq(parent) && /^\s*-\s*$/.test(before))) {
    if (spans.length === 1) return { start: s.start, end: s.end, text: isSeq(parent) ? '[]' : '{}' };
    return { start: lineStart, end: lineEndAfter(text, s.end), text: '' };
  }
  // The first key of a map that is a list item (`- place: middle`): the next key moves up.
  if (i + 1 < spans.length) return { start: s.start, end: spans[i + 1].start, text: '' };
  return { start: s.start, end: s.end, text: '{}' };
}

/**
 * Add a key that does not exist: to the deepest map on its path that does, after that map's last
 * key, in that map's style (a line at the keys' indentation, or `, key: value` in a flow map).
 * The rest of the path becomes nested flow maps. Null when the parent is not a map.
 */
function insertionSplice(doc: Document, text: string, path: readonly (string | number)[], value: unknown, json: boolean): Splice | null {
  let depth = path.length - 1;
  while (depth > 0 && !isCollection(doc.getIn(path.slice(0, depth), true))) depth--;
  const parent = depth > 0 ? doc.getIn(path.slice(0, depth), true) : doc.contents;
  if (!isMap(parent) && !(isSeq(parent) && depth === path.length - 1 && path[depth] === parent.items.length)) return null;
  let nested: unknown = value;
  for (let k = path.length - 1; k > depth; k--) nested = { [String(path[k])]: nested };
  const key = path[depth];
  const spans = itemSpans(parent as YamlNode);
  const entry = isMap(parent) ? `${flowText(String(key), json)}: ${flowText(nested, json)}` : flowText(nested, json);
  if (spans.length === 0) {
    const r = (parent as YamlNode).range;
    if (!r || !(parent as { flow?: boolean }).flow) return null;
    return { start: r[0], end: r[1], text: isMap(parent) ? `{ ${entry} }` : `[${entry}]` };
  }
  const last = spans[spans.length - 1];
  if ((parent as { flow?: boolean }).flow) return { start: last.end, end: last.end, text: `, ${entry}` };
  const first = spans[0];
  const column = first.start - lineStartOf(text, first.start);
  const at = lineEndAfter(text, last.end);
  const lead = at === text.length && !text.endsWith('\n') ? '\n' : '';
  const dash = isSeq(parent) ? '- ' : '';
  const indent = ' '.repeat(Math.max(0, column - dash.length));
  return { start: at, end: at, text: `${lead}${indent}${dash}${entry}\n` };
}

/**
 * Set values in design text by dotted path (`layout.wheelbaseMm`, `stacks.0.place`), keeping every
 * comment and the formatting of everything else (see `editDesignText`); `undefined` removes a key so
 * its default applies. Keys that contain a dot need `editDesignText` with an array path.
 * @example setDesignValues(text, { 'layout.wheelbaseMm': 250, 'props.diameter': '6in' })
 */
export function setDesignValues(text: string, values: Readonly<Record<string, unknown>>): string {
  const changes: Change[] = Object.entries(values).map(([dotted, v]) => ({
    path: dotted.split('.').map((k) => (/^\d+$/.test(k) ? Number(k) : k)),
    old: null,
    new: v,
    why: 'set',
  }));
  return editDesignText(text, changes);
}
