import { DxfReadError } from './errors.js';

/** One group-code pair of an ASCII DXF file; `line` is the 1-based line of the code. */
export type Pair = Readonly<{ code: number; value: string; line: number }>;

/** A binary DXF opens with a 22-byte sentinel ending in "Binary DXF", CR LF, SUB, NUL (DXF reference). */
const BINARY_SENTINEL = /^[^\r\n]{0,16}Binary DXF\r\n\u001a\u0000/;

/**
 * Split ASCII DXF text into group-code pairs. Tolerant of CRLF, leading spaces on codes and a
 * missing final newline; refuses binary DXF, text that is not DXF and files cut off mid-pair.
 * Throws DxfReadError naming the line.
 */
export function readPairs(text: string, maxPairs: number): Pair[] {
  if (BINARY_SENTINEL.test(text.slice(0, 32))) {
    throw new DxfReadError('this is a binary DXF file; only ASCII DXF is read (save it again as ASCII DXF)');
  }
  if (text.includes('\u0000')) throw new DxfReadError('the file contains binary data (NUL bytes); it is not an ASCII DXF file');
  const lines = text.split(/\r\n|\r|\n/);
  // A final newline leaves one empty string behind; so may trailing blank lines.
  let n = lines.length;
  while (n > 0 && lines[n - 1].trim() === '') n--;
  if (n === 0) throw new DxfReadError('the file is empty');
  const pairs: Pair[] = [];
  for (let i = 0; i < n; i += 2) {
    const codeText = lines[i].trim();
    if (!/^-?\d{1,4}$/.test(codeText)) {
      if (pairs.length === 0) {
        throw new DxfReadError(`not a DXF file: line 1 should be a group code (a whole number such as 0), found ${quote(codeText)}`);
      }
      throw new DxfReadError(`line ${i + 1}: expected a group code (a whole number), found ${quote(codeText)}; the file is damaged or not DXF`);
    }
    if (i + 1 >= n) throw new DxfReadError(`line ${i + 1}: group code ${codeText} has no value; the file looks truncated`);
    if (pairs.length >= maxPairs) throw new DxfReadError(`the file has more than ${maxPairs} group-code pairs, the reader's limit`);
    pairs.push({ code: Number(codeText), value: lines[i + 1], line: i + 1 });
  }
  if (pairs[0].code !== 0 && pairs[0].code !== 999) {
    throw new DxfReadError(`not a DXF file: it should begin with group code 0 (SECTION), found code ${pairs[0].code}`);
  }
  return pairs;
}

function quote(s: string): string {
  const shown = s.length > 40 ? `${s.slice(0, 40)}…` : s;
  return JSON.stringify(shown);
}

/** Parse a numeric group value; throws DxfReadError naming the line when it is not a finite number. */
export function num(p: Pair): number {
  const v = Number(p.value.trim());
  if (!Number.isFinite(v) || p.value.trim() === '') {
    throw new DxfReadError(`line ${p.line + 1}: group code ${p.code} needs a number, found ${quote(p.value.trim())}`);
  }
  return v;
}
