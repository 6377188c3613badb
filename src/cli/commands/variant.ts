import type { Command } from 'commander';
import { existsSync, statSync } from 'node:fs';
import { basename, extname, join } from 'node:path';
import type { CheckReport } from '../../checks/index.js';
import type { Frame } from '../../geometry/frame.js';
import { fmt } from '../../export/format.js';
import { DesignError } from '../../params/errors.js';
import type { FamilyRow, VariantRequest, VariantResult } from '../../variant/index.js';
import { readText, UsageError, writeAllAtomically, type OutputFile } from '../io.js';
import { textTable } from '../table.js';

type VariantOptions = {
  props: string;
  wheelbase: string;
  wheelbaseStep: string;
  motor?: string;
  out?: string;
  json?: boolean;
};

type FrameChecker = (frame: Frame) => CheckReport;

/** The stages this command uses, loaded when it runs (DEVELOPERS.md, "How to add a command"). */
async function loadStages() {
  const [variant, { familySheetSvg }] = await Promise.all([import('../../variant/index.js'), import('../../export/svgFamily.js')]);
  return { ...variant, familySheetSvg };
}
type Stages = Awaited<ReturnType<typeof loadStages>>;

const CAUTIONS = [
  'Structural figures are estimates from idealised beam models, not certification. Test a new frame with the props off first.',
  'Cutting carbon makes respirable, conductive dust: cut wet or with HEPA extraction, wear a P3/P100 respirator and eye protection; follow local rules and your shop.',
];

const propsSlug = (p: string): string => p.trim().toLowerCase().replace(/[^a-z0-9.]+/g, '').replace(/\./g, 'p');

function parseWheelbase(text: string): 'auto' | number {
  if (text.trim().toLowerCase() === 'auto') return 'auto';
  const v = Number(text);
  if (!Number.isFinite(v) || v <= 0) throw new UsageError(`--wheelbase: ${JSON.stringify(text)} must be auto or a length in mm (e.g. 300)`);
  return v;
}

function parseStep(text: string): number {
  const v = Number(text);
  if (!Number.isFinite(v) || v < 0 || v > 50) throw new UsageError(`--wheelbase-step: ${JSON.stringify(text)} must be a length from 0 (exact) to 50 mm`);
  return v;
}

/** Progress on stderr, only when a person is watching (a TTY); scripts see nothing. */
function progress(done: number, total: number, what: string): void {
  if (!process.stderr.isTTY || total < 2) return;
  const width = 24;
  const filled = Math.round((done / total) * width);
  process.stderr.write(`\r[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${done}/${total} ${what.padEnd(12)}`);
  if (done === total) process.stderr.write('\n');
}

function runOne(V: Stages, text: string, req: VariantRequest, source: string): VariantResult {
  try {
    return V.makeVariant(text, req, source);
  } catch (e) {
    if (e instanceof V.VariantRequestError) throw new UsageError(`cannot make the ${req.props} variant; nothing was written.\n${e.message}`);
    throw e;
  }
}

function changeTable(V: Stages, v: VariantResult): string {
  const show = (x: unknown) => (typeof x === 'number' ? fmt(x, 3) : typeof x === 'string' ? x : JSON.stringify(x));
  return textTable(
    ['parameter', 'old', 'new', 'why'],
    v.changes.map((c) => [V.pathText(c.path), show(c.old), show(c.new), c.why]),
  );
}

function comparisonTable(V: Stages, rows: readonly FamilyRow[]): string {
  return textTable(
    ['frame', 'props in', 'wheelbase mm', 'arm widths × t mm', 'mass g', 'arm f1 Hz', 'f1 rule', 'checks'],
    rows.map((r) => [
      r.label,
      fmt(r.propsIn, 2),
      fmt(r.wheelbaseMm, 1),
      V.armSizeText(r),
      fmt(r.massG, 1),
      fmt(r.armFrequencyHz, 1),
      r.stiffnessRule,
      r.status === 'not checked' ? 'not checked' : `${r.errors} errors, ${r.warnings} warnings`,
    ]),
  );
}

function variantJson(V: Stages, v: VariantResult, report: CheckReport | null, file: string) {
  return {
    file,
    name: v.design.name,
    propDiameterMm: v.propDiameterMm,
    wheelbase: v.wheelbase,
    motorClass: { source: v.motor.sourceClass.name, variant: v.motor.variantClass.name },
    changes: v.changes.map((c) => ({ parameter: V.pathText(c.path), old: c.old, new: c.new, why: c.why })),
    stiffness: {
      rule: 'first bending frequency of the softest arm with its motor kept at or above the source',
      targetHz: v.arms.targetHz,
      achievedHz: v.arms.achieved.frequencyHz,
      idealThicknessMm: v.arms.idealThicknessMm,
      thicknessMm: v.arms.thicknessMm,
      widthFactor: v.arms.widthFactor,
      met: v.arms.met,
      tipDeflectionMmPerN: { source: v.arms.complianceMmPerN[0], variant: v.arms.complianceMmPerN[1] },
    },
    body: { factor: v.body.factor, clearanceMm: v.body.clearanceMm, requiredClearanceMm: v.body.requiredClearanceMm },
    massG: v.massG,
    sourceMassG: v.sourceMassG,
    checks: report ? report.summary : null,
    cautions: CAUTIONS,
  };
}

function wheelbaseLine(v: VariantResult): string {
  const w = v.wheelbase;
  return [
    `Wheelbase: ${fmt(w.chosenMm, 3)} mm, set by ${w.bound} (source ${fmt(w.sourceMm, 2)} mm). Smallest for the ${w.requestedGapMm} mm tip gap: ${fmt(w.minimumMm, 3)} mm;`,
    `  smallest keeping the props clear of standoffs and stack with the body kept: ${fmt(w.bodyKeptMm, 3)} mm; auto rounds up to ${w.stepMm} mm. Smallest prop tip gap now ${w.achievedGapMm.toFixed(2)} mm.`,
  ].join('\n');
}

function checkLine(report: CheckReport | null): string {
  if (!report) return 'Checks: not run.';
  return `Checks on the variant: ${report.summary.errors} errors, ${report.summary.warnings} warnings${report.summary.errors ? ' (run `framewright check` on the new file for the findings)' : ''}.`;
}

export function registerVariant(program: Command): void {
  program
    .command('variant')
    .description('derive a frame for other props from an existing design: wheelbase from the tip gap, arms by a stiffness rule, hardware kept; checks re-run')
    .argument('<design>', 'source design file (YAML or JSON)')
    .requiredOption('--props <sizes>', 'prop diameter with a unit (7in, 178mm), or a comma list for a family (3in,4in,5in)')
    .option('--wheelbase <auto|mm>', 'auto: smallest keeping the design\'s tip gap and the props clear of the body hardware; or a wheelbase in mm', 'auto')
    .option('--wheelbase-step <mm>', 'round the auto wheelbase up to a multiple of this (0: exact)', '1')
    .option('--motor <class>', 'motor size class (2207, 22xx, 20xx-24xx) or auto; default keeps the motor')
    .option('--out <path>', 'new design file (one size; default out/<design>-<props>.yaml) or directory (family; default out/<design>-family)')
    .option('--json', 'print a JSON report instead of the tables')
    .action(async (designPath: string, opts: VariantOptions) => {
      const text = readText(designPath, 'a design file (YAML or JSON)');
      const sizes = opts.props.split(',').map((s) => s.trim()).filter((s) => s.length > 0);
      if (sizes.length === 0) throw new UsageError('--props: give at least one prop size, e.g. 7in');
      if (new Set(sizes).size !== sizes.length) throw new UsageError(`--props: ${opts.props} lists a size twice`);
      const base: Omit<VariantRequest, 'props'> = {
        wheelbase: parseWheelbase(opts.wheelbase),
        wheelbaseStepMm: parseStep(opts.wheelbaseStep),
        ...(opts.motor !== undefined ? { motor: opts.motor } : {}),
      };
      if (sizes.length > 1 && base.wheelbase !== 'auto') throw new UsageError('--wheelbase: a family (several --props) takes only --wheelbase auto');
      const [V, { checkFrame }] = await Promise.all([loadStages(), import('../../checks/index.js')]);
      const check: FrameChecker = checkFrame;
      const stem = basename(designPath, extname(designPath));
      if (sizes.length === 1) singleVariant(V, text, designPath, stem, { ...base, props: sizes[0] }, opts, check);
      else family(V, text, designPath, stem, sizes, base, opts, check);
    });
}

function singleVariant(V: Stages, text: string, designPath: string, stem: string, req: VariantRequest, opts: VariantOptions, check: FrameChecker | null): void {
  const v = runOne(V, text, req, designPath);
  const report = check ? check(v.frame) : null;
  const name = `${stem}-${propsSlug(req.props)}.yaml`;
  // --out may name the file or a directory to put it in.
  const file = opts.out === undefined ? join('out', name) : existsSync(opts.out) && statSync(opts.out).isDirectory() ? join(opts.out, name) : opts.out;
  writeAllAtomically([{ path: file, data: v.text }]);
  if (opts.json) {
    process.stdout.write(`${JSON.stringify(variantJson(V, v, report, file), null, 2)}\n`);
  } else {
    const rows = [V.sourceRow(v, check ? check(v.sourceFrame) : null), V.variantRow(v, report)];
    const out = [
      `${v.sourceDesign.name} -> ${v.design.name}: ${file}`,
      '',
      changeTable(V, v),
      '',
      wheelbaseLine(v),
      v.body.line,
      ...v.arms.lines,
      `Hardware kept: stack mounts, standoffs, camera width, strap slots, root bolts${v.motor.changes.length ? '' : ', motor pattern and bolts'}.`,
      '',
      comparisonTable(V, rows),
      '',
      checkLine(report),
      ...CAUTIONS,
    ];
    process.stdout.write(`${out.join('\n')}\n`);
  }
  if (report && report.summary.errors > 0) process.exitCode = 1;
}

function family(V: Stages, text: string, designPath: string, stem: string, sizes: readonly string[], base: Omit<VariantRequest, 'props'>, opts: VariantOptions, check: FrameChecker | null): void {
  const results: VariantResult[] = [];
  const reports: Array<CheckReport | null> = [];
  const problems: string[] = [];
  sizes.forEach((props, i) => {
    try {
      const v = V.makeVariant(text, { ...base, props }, designPath);
      results.push(v);
      reports.push(check ? check(v.frame) : null);
    } catch (e) {
      if (e instanceof V.VariantRequestError) problems.push(`${props}: ${e.message}`);
      else if (e instanceof DesignError) problems.push(`${props}: ${e.message}`);
      else throw e;
    }
    progress(i + 1, sizes.length, props);
  });
  if (problems.length) throw new UsageError(`cannot make ${problems.length === 1 ? 'one member' : `${problems.length} members`} of the family; nothing was written.\n${problems.join('\n')}`);
  const sourceReport = check ? check(results[0].sourceFrame) : null;
  const dir = opts.out ?? join('out', `${stem}-family`);
  if (existsSync(dir) && !statSync(dir).isDirectory()) throw new UsageError(`--out: ${dir} is a file; a family needs a directory`);
  const files: OutputFile[] = results.map((v, i) => ({ path: join(dir, `${stem}-${propsSlug(sizes[i])}.yaml`), data: v.text }));
  const rows = [V.sourceRow(results[0], sourceReport), ...results.map((v, i) => V.variantRow(v, reports[i]))];
  const members = [
    { label: rows[0].label, notes: notesOf(V, rows[0]), frame: results[0].sourceFrame },
    ...results.map((v, i) => ({ label: v.design.name, notes: notesOf(V, rows[i + 1]), frame: v.frame })),
  ];
  const svgPath = join(dir, 'family.svg');
  files.push({ path: svgPath, data: V.familySheetSvg(members, { title: `${results[0].sourceDesign.name}: size family`, footer: CAUTIONS }) });
  writeAllAtomically(files, dir);
  if (opts.json) {
    process.stdout.write(`${JSON.stringify({ units: 'mm', source: designPath, sheet: svgPath, cautions: CAUTIONS, rows, variants: results.map((v, i) => variantJson(V, v, reports[i], files[i].path)) }, null, 2)}\n`);
  } else {
    const out = [
      `${results[0].sourceDesign.name}: ${results.length} variants in ${dir} (sheet: ${svgPath})`,
      '',
      comparisonTable(V, rows),
      '',
      'Arm f1: first bending frequency of the softest arm with its motor (Euler-Bernoulli cantilever, tip-mass frequency equation).',
      'Each variant keeps the source arm\'s f1 or more; run with one --props for its change table and rule numbers.',
      ...CAUTIONS,
    ];
    process.stdout.write(`${out.join('\n')}\n`);
  }
  if (reports.some((r) => r && r.summary.errors > 0)) process.exitCode = 1;
}

function notesOf(V: Stages, r: FamilyRow): string[] {
  return [
    `props ${fmt(r.propsIn, 2)} in, wheelbase ${fmt(r.wheelbaseMm, 1)} mm`,
    `arms ${V.armSizeText(r)} mm, f1 ${fmt(r.armFrequencyHz, 0)} Hz`,
    `${fmt(r.massG, 0)} g, checks: ${r.status}`,
  ];
}
