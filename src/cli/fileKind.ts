/**
 * What the bytes of an input file are, before anything tries to read them as YAML or DXF: a
 * user who passes a PDF, a photo, a spreadsheet or a UTF-16 file by mistake is told what the file
 * is instead of seeing its bytes echoed back. Pure functions over bytes.
 */

/** Unicode encodings a text input may arrive in. */
export type TextEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'utf-32le' | 'utf-32be';

/** File signatures ("magic numbers") at offset 0, each with a plain name for the message. */
const SIGNATURES: ReadonlyArray<readonly [readonly number[], string]> = [
  [[0x25, 0x50, 0x44, 0x46, 0x2d], 'a PDF document'], // "%PDF-" (ISO 32000-1, 7.5.2)
  [[0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], 'a PNG image'], // PNG specification, 5.2
  [[0xff, 0xd8, 0xff], 'a JPEG image'], // SOI marker, ITU T.81 B.1.1.3
  [[0x47, 0x49, 0x46, 0x38], 'a GIF image'], // "GIF8"
  [[0x50, 0x4b, 0x03, 0x04], 'a ZIP archive (office documents and 3MF files are ZIP archives)'], // local file header, APPNOTE 4.3.7
  [[0x1f, 0x8b], 'gzip-compressed data'], // RFC 1952, 2.3.1
  [[0x7f, 0x45, 0x4c, 0x46], 'an executable program'], // ELF identification
];

/** Binary drawing files open with a version string "AC1" + three characters; named only when the bytes are binary anyway. */
const BINARY_DRAWING = [0x41, 0x43, 0x31];

/** A binary DXF opens with a 22-byte sentinel whose tail is "Binary DXF", CR LF, SUB, NUL (DXF reference). */
const BINARY_DXF_TAIL = [...Buffer.from('Binary DXF\r\n\u001a\u0000', 'latin1')];

const startsWith = (b: Uint8Array, sig: readonly number[], at = 0): boolean => b.length >= at + sig.length && sig.every((x, i) => b[at + i] === x);

/**
 * The encoding of a text stream by its first bytes, as YAML 1.2 (section 5.2, "Character
 * Encodings") detects it: a byte order mark, or the pattern of zero bytes around the first ASCII
 * character. Without either it is UTF-8.
 */
export function detectEncoding(head: Uint8Array): TextEncoding {
  const [a, b, c, d] = [head[0], head[1], head[2], head[3]];
  if (head.length >= 4 && a === 0 && b === 0 && ((c === 0xfe && d === 0xff) || (c === 0 && d !== 0))) return 'utf-32be';
  if (head.length >= 4 && ((a === 0xff && b === 0xfe && c === 0 && d === 0) || (a !== 0 && b === 0 && c === 0 && d === 0))) return 'utf-32le';
  if (head.length >= 2 && ((a === 0xfe && b === 0xff) || (a === 0 && b !== 0))) return 'utf-16be';
  if (head.length >= 2 && ((a === 0xff && b === 0xfe) || (a !== 0 && b === 0))) return 'utf-16le';
  return 'utf-8';
}

/**
 * What a file is when it is not text, from its first bytes (up to a few kilobytes), or null when
 * it may be text. Known formats are named; other data is "binary data" when it holds NUL bytes
 * or mostly control characters.
 */
export function binaryKind(head: Uint8Array): string | null {
  for (const [sig, name] of SIGNATURES) if (startsWith(head, sig)) return name;
  for (let at = 0; at <= 12; at++) if (startsWith(head, BINARY_DXF_TAIL, at)) return 'a binary DXF file (only ASCII DXF is read; save it again as ASCII DXF)';
  if (detectEncoding(head) !== 'utf-8') return null;
  if (!looksBinary(head)) return null;
  return startsWith(head, BINARY_DRAWING) ? 'a binary CAD drawing, not DXF text (export it as ASCII DXF)' : 'binary data';
}

/** Text does not hold NUL, and control characters other than tab, line feed, form feed and return are rare in it. */
function looksBinary(units: ArrayLike<number>): boolean {
  let controls = 0;
  for (let i = 0; i < units.length; i++) {
    const x = units[i];
    if (x === 0) return true;
    if (x < 0x20 && x !== 0x09 && x !== 0x0a && x !== 0x0d && x !== 0x0c) controls++;
  }
  return controls > units.length / 20;
}

/**
 * Text decoded from bytes, or why it cannot be: `kind` names binary content ("a PDF document"),
 * `problem` describes text in an encoding that cannot be read (both complete "the file is ...").
 */
export type Decoded = Readonly<{ text: string; encoding: TextEncoding } | { kind: string } | { problem: string }>;

/**
 * Decode an input file that YAML (or JSON, which is YAML) will read: UTF-8, or UTF-16 in either
 * byte order as YAML 1.2 requires (a byte order mark is dropped). UTF-32, which Node's decoder does
 * not know, and bytes that are not valid in their encoding are refused with the byte offset.
 */
export function decodeText(bytes: Uint8Array): Decoded {
  const kind = binaryKind(bytes.subarray(0, 4096));
  if (kind) return { kind };
  const encoding = detectEncoding(bytes);
  if (encoding === 'utf-32le' || encoding === 'utf-32be') return { problem: 'UTF-32 text; save it as UTF-8' };
  try {
    // fatal: a byte sequence that is not valid in the encoding throws instead of becoming U+FFFD.
    const text = new TextDecoder(encoding, { fatal: true, ignoreBOM: false }).decode(bytes);
    const head = text.slice(0, 4096);
    if (looksBinary(Array.from(head, (ch) => ch.charCodeAt(0)))) return { kind: 'binary data' };
    if (text.includes('\u0000')) return { kind: `binary data (a NUL character at character ${text.indexOf('\u0000')})` };
    return { text, encoding };
  } catch {
    // Random bytes often look like UTF-16 by their first two; only UTF-8 gets a position.
    if (encoding !== 'utf-8') return { kind: 'binary data' };
    return { problem: `not valid UTF-8 text (at byte ${firstInvalidUtf8(bytes)}); save it as UTF-8` };
  }
}

/**
 * The offset of the first byte that starts an invalid UTF-8 sequence (for the message), by the
 * well-formed byte sequences of RFC 3629, section 4.
 */
function firstInvalidUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i];
    const [n, lo, hi] = b < 0x80 ? [0, 0, 0] : b >= 0xc2 && b <= 0xdf ? [1, 0x80, 0xbf] : b === 0xe0 ? [2, 0xa0, 0xbf] : b === 0xed ? [2, 0x80, 0x9f] : b >= 0xe1 && b <= 0xef ? [2, 0x80, 0xbf] : b === 0xf0 ? [3, 0x90, 0xbf] : b === 0xf4 ? [3, 0x80, 0x8f] : b >= 0xf1 && b <= 0xf3 ? [3, 0x80, 0xbf] : [-1, 0, 0];
    if (n < 0 || i + n >= bytes.length + (n === 0 ? 1 : 0)) return i;
    if (n > 0 && (bytes[i + 1] < lo || bytes[i + 1] > hi)) return i;
    for (let k = 2; k <= n; k++) if (bytes[i + k] < 0x80 || bytes[i + k] > 0xbf) return i;
    i += n + 1;
  }
  return i;
}
