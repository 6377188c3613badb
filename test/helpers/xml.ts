import { SaxesParser } from 'saxes';

/**
 * The first well-formedness error of an XML document, or null: checked by `saxes`, a strict XML 1.0
 * parser written elsewhere (it rejects "--" in comments, control characters, unescaped "<" and "&",
 * unbalanced tags and anything after the root element).
 */
export function xmlProblem(text: string): string | null {
  const parser = new SaxesParser({ xmlns: true, position: true });
  let problem: string | null = null;
  let roots = 0;
  let depth = 0;
  parser.on('error', (e) => {
    problem ??= e.message;
  });
  parser.on('opentag', () => {
    if (depth++ === 0) roots++;
  });
  parser.on('closetag', () => {
    depth--;
  });
  try {
    parser.write(text).close();
  } catch (e) {
    problem ??= (e as Error).message;
  }
  if (!problem && roots !== 1) problem = `${roots} root elements`;
  return problem;
}
