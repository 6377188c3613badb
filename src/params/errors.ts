/** One problem with a design file: where, what was given, and what is allowed. */
export type DesignIssue = Readonly<{ path: string; value: unknown; message: string }>;

/** Bad input. The CLI prints every issue and exits with code 2; nothing is written. */
export class DesignError extends Error {
  constructor(readonly issues: readonly DesignIssue[]) {
    super(issues.map(formatIssue).join('\n'));
    this.name = 'DesignError';
  }
}

/** One issue as a line: "path: value message". */
export function formatIssue(i: DesignIssue): string {
  const full = i.value === undefined ? '(missing)' : shownValue(i.value);
  // A whole file pasted where a value belongs (a DXF given as a design) must not flood the terminal.
  const shown = full.length > 60 ? `${full.slice(0, 57)}...` : full;
  return `${i.path || '(design)'}: ${shown} ${i.message}`;
}

/** A value as the user wrote it: JSON, except the numbers JSON cannot spell (YAML's .nan and .inf). */
function shownValue(v: unknown): string {
  if (typeof v === 'number' && !Number.isFinite(v)) return Number.isNaN(v) ? '.nan' : v > 0 ? '.inf' : '-.inf';
  try {
    return JSON.stringify(v) ?? String(v);
  } catch {
    return String(v);
  }
}

/** A DesignError with a single issue. */
export const designError = (path: string, value: unknown, message: string): DesignError =>
  new DesignError([{ path, value, message }]);
