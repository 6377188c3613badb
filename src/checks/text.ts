import { plural } from '../params/words.js';
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
    const key = JSON.stringify([f.part, f.severity, f.rule, f.measured, f.limit, f.unit, f.message]);
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
  const sev = f.severity === 'error' ? 'ERROR  ' : f.severity === 'warning' ? 'warning' : 'note   ';
  const value = f.measured === null ? '' : ` ${num(f.measured, f.unit)}${f.limit === null ? '' : ` (limit ${num(f.limit, f.unit)})`}`;
  const pts = g.at.map((p) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`);
  const at = pts.length === 0 ? '' : pts.length === 1 ? ` at ${pts[0]}` : ` ×${pts.length} at ${pts.join(' ')}`;
  return `  ${sev} ${f.part || '(file)'}${value}${at}\n          ${f.message}`;
}

/** One-line summary, e.g. "2 errors, 5 warnings, 9 notes". */
export function summaryLine(r: CheckReport): string {
  const notes = r.findings.filter((f) => f.severity === 'info').length;
  return `${plural(r.summary.errors, 'error')}, ${plural(r.summary.warnings, 'warning')}, ${plural(notes, 'note')}`;
}

type RuleCount = { rule: string; errors: number; warnings: number; notes: number };

/** Finding counts per rule, errors first (then warnings, then notes, then the rule's name). */
export function countsByRule(r: CheckReport): RuleCount[] {
  const by = new Map<string, RuleCount>();
  for (const f of r.findings) {
    const c = by.get(f.rule) ?? { rule: f.rule, errors: 0, warnings: 0, notes: 0 };
    if (f.severity === 'error') c.errors++;
    else if (f.severity === 'warning') c.warnings++;
    else c.notes++;
    by.set(f.rule, c);
  }
  return [...by.values()].sort((a, b) => b.errors - a.errors || b.warnings - a.warnings || b.notes - a.notes || (a.rule < b.rule ? -1 : a.rule > b.rule ? 1 : 0));
}

const countWords = (c: RuleCount): string =>
  [c.errors ? plural(c.errors, 'error') : '', c.warnings ? plural(c.warnings, 'warning') : '', c.notes ? plural(c.notes, 'note') : ''].filter(Boolean).join(', ');

/**
 * The report as plain text for a terminal: the counts per rule (errors first), then the findings
 * grouped by rule in that order (severity, part, measured value, limit, places, message with its
 * fix; the same finding at several places printed once with each place), then each part's
 * measurements, the totals and the safety cautions. Places are part coordinates, or frame
 * coordinates (x forward, y left) for "frame". Deterministic.
 */
export function formatCheckReport(r: CheckReport, heading: string): string {
  const out: string[] = [heading, ''];
  const counts = countsByRule(r);
  out.push(`Summary: ${summaryLine(r)}.`);
  if (counts.length) {
    const w = Math.max(4, ...counts.map((c) => c.rule.length));
    out.push(`  ${'rule'.padEnd(w)}  errors  warnings  notes`);
    for (const c of counts) out.push(`  ${c.rule.padEnd(w)}  ${String(c.errors).padStart(6)}  ${String(c.warnings).padStart(8)}  ${String(c.notes).padStart(5)}`);
  }
  out.push('');
  const partOrder = new Map(r.parts.map((p, i) => [p.name, i]));
  for (const c of counts) {
    out.push(`${c.rule}: ${countWords(c)}`);
    const fs = r.findings
      .filter((f) => f.rule === c.rule)
      .sort((a, b) => SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity] || (partOrder.get(a.part) ?? r.parts.length) - (partOrder.get(b.part) ?? r.parts.length));
    for (const g of grouped(fs)) out.push(line(g));
    out.push('');
  }
  out.push('Parts (findings above give places in part coordinates; "frame" in frame coordinates: x forward, y left):');
  for (const p of r.parts) {
    const m = p.metrics;
    out.push(`${p.name}: ${p.thicknessMm} mm, ${p.contours} contours, min web ${num(m.minWebMm, 'mm')}, min e/D ${num(m.minEdgeRatio, '')}`);
  }
  out.push('', `${summaryLine(r)}.`, '', ...CHECK_CAUTIONS.map((c) => `Caution: ${c}`), '');
  return out.join('\n');
}

const SEVERITY_RANK = { error: 0, warning: 1, info: 2 } as const;

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
