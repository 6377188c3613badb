import { isMap, isScalar, isSeq, parseDocument, visit } from 'yaml';

/** Every comment of a YAML text, in order, as the `yaml` package's own parser sees it. */
export function yamlComments(text: string): string[] {
  const out: string[] = [];
  const doc = parseDocument(text);
  if (doc.commentBefore) out.push(doc.commentBefore);
  visit(doc, (_k, node) => {
    if ((isScalar(node) || isMap(node) || isSeq(node)) && (node.commentBefore || node.comment)) out.push(`${node.commentBefore ?? ''}|${node.comment ?? ''}`);
  });
  if (doc.comment) out.push(doc.comment);
  return out;
}
