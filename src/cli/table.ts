/** Plain-text table with right-aligned numeric columns, for terminal summaries. */
export function textTable(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const numeric = header.map((_, i) => rows.length > 0 && rows.every((r) => /^-?[0-9.,]+( ?[a-z%²]*)?$/i.test(r[i] ?? '') || r[i] === ''));
  const line = (cells: readonly string[]) =>
    cells.map((c, i) => (numeric[i] ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join('  ').trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}
