import type { CheckReport, Finding } from './types.js';

/** The cautions every check report ends with (see README, Safety). */
export const CHECK_CAUTIONS: readonly string[] = [
  'Structural figures are estimates from idealised models, not a certification.',
  'Carbon dust is respirable and conductive: cut wet or with on-tool H-class/HEPA extraction, wear a P3/P100 respirator and eye protection, keep electronics sealed.',
  'Test a new frame with the props off first; follow local regulations and your shop\'s practice.',
];

const num = (x: number | null, unit: string): string => {
  if (x === null) return '—';
  // Two decimals, a third when it carries information (a 3.175 mm tool is not "3.17").
  const v = Math.abs(x) >= 100 ? x.toFixed(1) : x.toFixed(3).replace(/(\.\d\d)0$/, '$1');
  return unit === 'mm' ? `${v} mm` : unit ? `${v} ${unit}` : v;
};

/** Findings that say the same thing at several places print once, with every place. */
function grouped(fs: readonly Finding[]): Array<{ f: Finding; at: Array<readonly [number, number]> }> {
  const out: Array<{ f: Finding; at: Array<readonly [number, number]> }> = [];
  const byKey = new Map<string, { f: Finding; at: Array<readonly [number, number]> }>();
  for (const f of fs) {
    const key = JSON.stringify([f.severity, f.rule, f.measured, f.limit, f.unit, f.message]);
    let g = byKey.get(key);
    if (!g) {
      g = { f, at: [] };
      byKey.set(key, g);
      out.push(g);
    }
    if (f.atMm) g.at.push(f.atMm);
  }
  return out;
}

function line(g: { f: Finding; at: ReadonlyArray<readonly [number, number]> }): string {
  const f = g.f;
  const sev = f.severity === 'error' ? 'ERROR  ' : f.severity === 'warning' ? 'warning' : 'info   ';
  const value = f.measured === null ? '' : ` ${num(f.measured, f.unit)}${f.limit === null ? '' : ` (limit ${num(f.limit, f.unit)})`}`;
  const pts = g.at.map((p) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`);
  const at = pts.length === 0 ? '' : pts.length === 1 ? ` at ${pts[0]}` : ` ×${pts.length} at ${pts.join(' ')}`;
  return `  ${sev} ${f.rule}${value}${at}\n           ${f.message}`;
}

/** One-line summary, e.g. "2 errors, 5 warnings, 9 notes". */
export function summaryLine(r: CheckReport): string {
  const notes = r.findings.filter((f) => f.severity === 'info').length;
  const plural = (n: number, w: string): string => `${n} ${w}${n === 1 ? '' : 's'}`;
  return `${plural(r.summary.errors, 'error')}, ${plural(r.summary.warnings, 'warning')}, ${plural(notes, 'note')}`;
}

/**
 * The report as plain text for a terminal: findings grouped by part (severity, rule, measured
 * value, limit, location, advice; the same finding at several places printed once with each place; part coordinates for parts, frame coordinates for "frame"), a
 * footer with the counts and the safety cautions. Deterministic.
 */
export function formatCheckReport(r: CheckReport, heading: string): string {
  const out: string[] = [heading, ''];
  const names = [...r.parts.map((p) => p.name), ...new Set(r.findings.map((f) => f.part).filter((n) => !r.parts.some((p) => p.name === n)))];
  for (const name of names) {
    const p = r.parts.find((q) => q.name === name);
    const m = p?.metrics;
    const facts = p
      ? ` (${p.thicknessMm} mm, ${p.contours} contours, min web ${num(m!.minWebMm, 'mm')}, min e/D ${num(m!.minEdgeRatio, '')})`
      : name === 'frame' ? ' (frame coordinates: x forward, y left)' : '';
    out.push(`${name || '(file)'}${facts}`);
    const fs = r.findings.filter((f) => f.part === name);
    if (fs.length === 0) out.push('  no findings');
    for (const g of grouped(fs)) out.push(line(g));
    out.push('');
  }
  out.push(`${summaryLine(r)}.`, '', ...CHECK_CAUTIONS.map((c) => `Caution: ${c}`), '');
  return out.join('\n');
}

/** What `build` does with a check report: refuse (exit 1), or write and say so in the files. */
export type BuildGate = Readonly<{ refuse: boolean; comment: string | undefined; message: string }>;

/**
 * The decision for `build`: with errors and no force, refuse and explain (the errors, one per
 * line); with errors and force, write the files with a comment naming the finding count.
 * @example const gate = buildGate(checkFrame(frame), opts.force === true); if (gate.refuse) { process.stderr.write(gate.message); process.exitCode = 1; return; }
 */
export function buildGate(report: CheckReport, force: boolean): BuildGate {
  const errors = report.findings.filter((f) => f.severity === 'error');
  if (errors.length === 0) return { refuse: false, comment: undefined, message: '' };
  const list = grouped(errors).map((g) => `  ${g.f.part}: ${g.f.rule}${g.at.length > 1 ? ` (×${g.at.length})` : ''}: ${g.f.message}`).join('\n');
  if (!force) {
    return { refuse: true, comment: undefined, message: `framewright: the design-rule checks found ${summaryLine(report)}; no cut files were written (see \`framewright check\`, or use --force):\n${list}\n` };
  }
  return {
    refuse: false,
    comment: `written with --force although the design-rule checks found ${summaryLine(report)}`,
    message: `framewright: written with --force despite ${errors.length} error${errors.length === 1 ? '' : 's'}:\n${list}\n`,
  };
}
