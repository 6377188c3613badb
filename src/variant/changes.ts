import YAML, { isCollection, isScalar, parseDocument, Scalar } from 'yaml';

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
 * and the style of every untouched value stay byte-identical. Keys that do not exist yet are added
 * through the `yaml` document API (appended to their map; comments kept).
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
      missing.push(c);
    }
  }
  splices.sort((a, b) => b.start - a.start);
  for (let i = 1; i < splices.length; i++) {
    if (splices[i].end > splices[i - 1].start) throw new Error('overlapping design edits (a value and a part of it changed together)');
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
