import YAML, { isCollection, isMap, isScalar, parseDocument, Scalar, type Document } from 'yaml';

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

/** A value as YAML flow text: `10.5`, `7in`, `"a: b"`, `[16, 19]`; double quotes where the old node had them (JSON sources). */
function flowText(v: unknown, doubleQuoted: boolean): string {
  if (Array.isArray(v)) return `[${v.map((x) => flowText(x, doubleQuoted)).join(', ')}]`;
  if (typeof v === 'string' && doubleQuoted) return JSON.stringify(v);
  if (typeof v === 'number' || typeof v === 'boolean' || typeof v === 'string') return YAML.stringify(v).trimEnd();
  throw new Error(`cannot write ${JSON.stringify(v)} into a design file`);
}

/**
 * Apply changes to design text (YAML or JSON) and return the new text. A value whose key exists is
 * replaced in place, character range for character range, so every comment, blank line, key order
 * and the style of every untouched value stay byte-identical. A key that does not exist yet is
 * inserted as a new line after the last entry of its block map (at that map's indentation); other
 * missing keys go through the `yaml` document API (appended to their map; comments kept).
 */
export function editDesignText(text: string, changes: readonly Change[]): string {
  const doc = parseDocument(text);
  if (doc.errors.length) throw new Error(`cannot edit a design with YAML errors: ${doc.errors[0].message}`);
  const splices: Array<{ start: number; end: number; text: string }> = [];
  const missing: Change[] = [];
  for (const c of realChanges(changes)) {
    const node = doc.getIn(c.path, true);
    if ((isScalar(node) || isCollection(node)) && node.range) {
      const quoted = isScalar(node) && node.type === Scalar.QUOTE_DOUBLE;
      // A block collection's range runs through its last line break; keep that white space so the
      // next key stays on its own line (a flow value on the line below its key is valid YAML).
      const trailing = /\s*$/.exec(text.slice(node.range[0], node.range[1]))![0];
      const value = flowText(c.new, quoted || (isCollection(node) && text.trimStart().startsWith('{')));
      splices.push({ start: node.range[0], end: node.range[1], text: isCollection(node) && !node.flow ? value + trailing : value });
    } else {
      const added = insertion(doc, text, c);
      if (added) splices.push(added);
      else missing.push(c);
    }
  }
  splices.sort((a, b) => b.start - a.start || b.end - a.end);
  for (let i = 1; i < splices.length; i++) {
    if (splices[i].end > splices[i - 1].start && splices[i].start !== splices[i].end) throw new Error('overlapping design edits (a value and a part of it changed together)');
  }
  let out = text;
  for (const s of splices) out = out.slice(0, s.start) + s.text + out.slice(s.end);
  if (missing.length === 0) return out;
  const doc2 = parseDocument(out);
  for (const c of missing) {
    const node = doc2.createNode(c.new);
    if (isCollection(node)) node.flow = true;
    doc2.setIn(c.path, node);
  }
  return doc2.toString({ flowCollectionPadding: false });
}

/**
 * A new `key: value` line for a key missing from an existing block map with entries: after the
 * map's last entry, at the indentation of its first key. Null when the parent is not such a map.
 */
function insertion(doc: Document, text: string, c: Change): { start: number; end: number; text: string } | null {
  const parent = doc.getIn(c.path.slice(0, -1), true);
  if (!isMap(parent) || parent.flow || parent.items.length === 0) return null;
  const first = parent.items[0].key;
  const last = parent.items[parent.items.length - 1];
  const lastNode = (last.value ?? last.key) as { range?: [number, number, number] } | null;
  if (!isScalar(first) || !first.range || !lastNode?.range) return null;
  const indent = first.range[0] - (text.lastIndexOf('\n', first.range[0] - 1) + 1);
  const line = `${' '.repeat(indent)}${flowText(String(c.path[c.path.length - 1]), false)}: ${flowText(c.new, false)}`;
  const end = lastNode.range[1];
  // A block collection's range already ends at the start of the next line.
  if (text[end - 1] === '\n') return { start: end, end, text: `${line}\n` };
  const eol = text.indexOf('\n', end);
  return eol < 0 ? { start: text.length, end: text.length, text: `\n${line}` } : { start: eol, end: eol, text: `\n${line}` };
}
