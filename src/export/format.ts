/**
 * The one number formatter every writer uses: fixed decimals, trailing zeros trimmed, no "-0",
 * so the same geometry always gives the same bytes.
 */
export function fmt(x: number, decimals = 6): string {
  if (!Number.isFinite(x)) throw new Error(`cannot write a non-finite number (${x})`);
  let s = x.toFixed(decimals);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}

/**
 * Characters no output file may carry: C0 controls except tab, line feed and carriage return, DEL,
 * C1 controls, U+FFFE/U+FFFF and unpaired surrogates. The C0 ones, U+FFFE/FFFF and lone
 * surrogates are not allowed in XML 1.0 at all (section 2.2, "Char"); the others are discouraged
 * there and mean nothing in DXF or PDF text.
 */
const UNPRINTABLE = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\ufffe\uffff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

/** Text with every unprintable character (see UNPRINTABLE) dropped: what every writer puts in a file. */
export const printable = (s: string): string => s.replace(UNPRINTABLE, '');

/** One line of printable text (tabs and line breaks become spaces), for DXF group values and PDF text. */
export const plainLine = (s: string): string => printable(s).replace(/[\t\r\n]+/g, ' ');

/** Escape text for XML content and attribute values; unprintable characters are dropped, so the file stays well-formed. */
export const xmlEscape = (s: string): string =>
  printable(s).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/**
 * DXF comment (999) lines for some notes: printable, one line each, split at spaces into pieces of
 * at most 255 characters (the string length R12 readers take).
 */
export function dxfCommentLines(notes: readonly string[]): string[] {
  const out: string[] = [];
  for (const note of notes) {
    let rest = plainLine(note).trim();
    while (rest.length > 255) {
      const cut = rest.lastIndexOf(' ', 255);
      const at = cut > 0 ? cut : 255;
      out.push(rest.slice(0, at));
      rest = rest.slice(at).trimStart();
    }
    out.push(rest);
  }
  return out;
}
