import { isMap, isScalar, isSeq, type Document } from 'yaml';

/** One edit of the design file: the path of the key, old and new values, and why it changed. */
export type Change = Readonly<{
  path: readonly (string | number)[];
  old: unknown;
  new: unknown;
  why: string;
}>;

export const pathText = (path: readonly (string | number)[]): string => path.map(String).join('.');

const same = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);

/** Keep only changes whose value really differs. */
export const realChanges = (changes: readonly Change[]): Change[] => changes.filter((c) => !same(c.old, c.new));

/**
 * Apply changes to a YAML document in place, keeping comments, key order and the style of every
 * untouched node. An existing scalar keeps its node (so its comment stays); a new array is written
 * in flow style (`[16, 19]`) like the demo designs. Keys that did not exist are appended to their map.
 */
export function applyChanges(doc: Document, changes: readonly Change[]): void {
  for (const c of realChanges(changes)) {
    const node = doc.getIn(c.path, true);
    if (isScalar(node) && (typeof c.new === 'number' || typeof c.new === 'string' || typeof c.new === 'boolean')) {
      node.value = c.new;
      continue;
    }
    const created = doc.createNode(c.new);
    if (isSeq(created) || isMap(created)) created.flow = true;
    if (node && (isSeq(node) || isMap(node)) && (isSeq(created) || isMap(created))) {
      created.flow = node.flow ?? created.flow;
      created.comment = node.comment;
      created.commentBefore = node.commentBefore;
    }
    doc.setIn(c.path, created);
  }
}
