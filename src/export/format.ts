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

/** Escape text for XML content and attribute values. */
export const xmlEscape = (s: string): string =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
