import type { Command } from 'commander';
import { existsSync, statSync } from 'node:fs';
import { basename, extname, join } from 'node:path';
import { fmt } from '../../export/format.js';
import { DesignError } from '../../params/errors.js';
import type { RangeRow, VariantRefusal, VariantRequest, VariantResult } from '../../variant/index.js';
import { readText, UsageError, writeAllAtomically, type OutputFile } from '../io.js';
import { textTable } from '../table.js';

type VariantOptions = {
  props: string;
  wheelbase: string;
  wheelbaseStep: string;
  motor: string;
  out?: string;
  json?: boolean;
  force?: boolean;
};

/** The stages this command uses, loaded when it runs (DEVELOPERS.md, "How to add a command"). */
async function loadStages() {
  const [variant, { rangeSheetSvg }, { rangeChartSvg }, { checkFrame }] = await Promise.all([
    import('../../variant/index.js'),
    import('../../export/svgRangeSheet.js'),
    import('../../export/svgRangeChart.js'),
    import('../../checks/index.js'),
  ]);
  return { ...variant, rangeSheetSvg, rangeChartSvg, checkFrame };
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

/** An invalid variant's file begins by saying so. */
const invalidText = (text: string, r: VariantRefusal): string =>
  `# INVALID: this ${r.props} variant fails its checks (${r.attempt?.errors ?? '?'} errors); written only because --force was given. See \`framewright check\`.\n${text}`;

function changeTable(V: Stages, v: VariantResult): string {
  const show = (x: unknown) => (typeof x === 'number' ? fmt(x, 3) : typeof x === 'string' ? x : JSON.stringify(x));
  return textTable(
    ['parameter', 'old', 'new', 'why'],
    v.changes.map((c) => [V.pathText(c.path), show(c.old), show(c.new), c.why]),
  );
}

function comparisonTable(V: Stages, rows: readonly RangeRow[]): string {
  return textTable(
    ['frame', 'props in', 'wheelbase mm', 'arm widths × t mm', 'motor g', 'mass g', 'arm f1 Hz', 'f1 asked Hz', 'rotation band Hz', 'checks'],
    rows.map((r) => [
      r.label,
      fmt(r.propsIn, 2),
      fmt(r.wheelbaseMm, 1),
      V.armSizeText(r),
      fmt(r.motorMassG, 1),
      fmt(r.massG, 1),
      fmt(r.armFrequencyHz, 1),
      fmt(r.requiredHz, 1),
      `${fmt(r.bandLowHz, 0)}-${fmt(r.bandHighHz, 0)}`,
      r.status === 'not checked' ? 'not checked' : `${r.errors} errors, ${r.warnings} warnings`,
    ]),
  );
}

function variantJson(V: Stages, v: VariantResult, file: string) {
  const a = v.arms;
  return {
    file,
    name: v.design.name,
    propDiameterMm: v.propDiameterMm,
    wheelbase: v.wheelbase,
    motorClass: { source: v.motor.sourceClass.name, variant: v.motor.variantClass.name, massG: v.motor.massG, how: v.motor.how },
    changes: v.changes.map((c) => ({ parameter: V.pathText(c.path), old: c.old, new: c.new, why: c.why })),
    armRule: {
      rule: "arm f1 keeps the source's ratio to the motors' rotation band (band ∝ 1/D); tip deflection under 2 × full thrust over the free length within the source's ratio (at least 1 % allowed)",
      allowedDeflectionRatio: a.rule.allowedDeflectionRatio,
      sourceHz: a.rule.sourceHz,
      requiredHz: a.rule.requiredHz,
      achievedHz: a.measure.frequencyHz,
      rotationBandHz: { low: a.rule.band.lowHz, high: a.rule.band.highHz },
      sourceRotationBandHz: { low: a.rule.sourceBand.lowHz, high: a.rule.sourceBand.highHz },
      bandRatio: a.rule.bandRatio,
      fullThrustN: a.rule.fullThrustN,
      tipDeflectionMm: a.measure.deflectionMm,
      allowedTipDeflectionMm: a.measure.allowedDeflectionMm,
      thicknessMm: a.section.thicknessMm,
      widthFactor: a.section.widthFactor,
      rootReachMm: a.rootReachMm,
      sectionsTried: a.tried,
    },
    body: { factor: v.body.factor, clearanceMm: v.body.clearanceMm, requiredClearanceMm: v.body.requiredClearanceMm },
    massG: v.massG,
    sourceMassG: v.sourceMassG,
    checks: v.report.summary,
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

/** Make one size; a refusal is returned (not thrown) so ranges can collect every size's outcome. Bad requests throw UsageError. */
function attempt(V: Stages, text: string, req: VariantRequest, source: string): VariantResult | VariantRefusal {
  try {
    return V.makeVariant(text, req, source);
  } catch (e) {
    if (e instanceof V.VariantRefusal) return e;
    if (e instanceof V.VariantRequestError) throw new UsageError(`cannot make the ${req.props} variant; nothing was written.\n${e.message}`);
    throw e;
  }
}

export function registerVariant(program: Command): void {
  program
    .command('variant')
    .description('derive a frame for other props from an existing design: motor from the prop size, wheelbase from the tip gap, arms by the size rule, hardware kept; every check must pass')
    .argument('<design>', 'source design file (YAML or JSON)')
    .requiredOption('--props <sizes>', 'prop diameter with a unit, 1 to 13 in (7in, 178mm), or a comma list for a size range (3in,4in,5in)')
    .option('--wheelbase <auto|mm>', "auto: smallest keeping the design's tip gap and the props clear of the body hardware; or a wheelbase in mm", 'auto')
    .option('--wheelbase-step <mm>', 'round the auto wheelbase up to a multiple of this (0: exact)', '1')
    .option('--motor <class>', 'auto (motor class and mass from the prop-size table), keep, or a class (2207, 22xx, 20xx-24xx)', 'auto')
    .option('--out <path>', 'new design file (one size; default out/<design>-<props>.yaml) or directory (size range; default out/<design>-range)')
    .option('--force', 'write a variant that fails its checks anyway, marked INVALID in its first line (exit code 1 all the same)')
    .option('--json', 'print a JSON report instead of the tables')
    .action(async (designPath: string, opts: VariantOptions) => {
      const text = readText(designPath, 'a design file (YAML or JSON)');
      const sizes = opts.props.split(',').map((s) => s.trim()).filter((s) => s.length > 0);
      if (sizes.length === 0) throw new UsageError('--props: give at least one prop size, e.g. 7in');
      if (new Set(sizes).size !== sizes.length) throw new UsageError(`--props: ${opts.props} lists a size twice`);
      const base: Omit<VariantRequest, 'props'> = { wheelbase: parseWheelbase(opts.wheelbase), wheelbaseStepMm: parseStep(opts.wheelbaseStep), motor: opts.motor };
      if (sizes.length > 1 && base.wheelbase !== 'auto') throw new UsageError('--wheelbase: a size range (several --props) takes only --wheelbase auto');
      const V = await loadStages();
      const stem = basename(designPath, extname(designPath));
      if (sizes.length === 1) singleVariant(V, text, designPath, stem, { ...base, props: sizes[0] }, opts);
      else sizeRange(V, text, designPath, stem, sizes, base, opts);
    });
}

function refusalText(r: VariantRefusal, wrote: string | null): string {
  const head = wrote ? `INVALID variant written to ${wrote} (--force): ${r.props} fails its checks.` : `cannot make a ${r.props} variant that passes every check; nothing was written.`;
  return `${head}\nUnmet: ${r.constraint}\nNearest valid alternative: ${r.alternative}\n`;
}

function singleVariant(V: Stages, text: string, designPath: string, stem: string, req: VariantRequest, opts: VariantOptions): void {
  const name = `${stem}-${propsSlug(req.props)}.yaml`;
  // --out may name the file or a directory to put it in.
  const file = opts.out === undefined ? join('out', name) : existsSync(opts.out) && statSync(opts.out).isDirectory() ? join(opts.out, name) : opts.out;
  const v = attempt(V, text, req, designPath);
  if (v instanceof V.VariantRefusal) {
    const write = opts.force && v.attempt;
    if (write) writeAllAtomically([{ path: file, data: invalidText(v.attempt!.text, v) }]);
    const out = refusalText(v, write ? file : null);
    if (write) process.stdout.write(out);
    else process.stderr.write(`framewright: ${out}`);
    process.exitCode = 1;
    return;
  }
  writeAllAtomically([{ path: file, data: v.text }]);
  if (opts.json) {
    process.stdout.write(`${JSON.stringify(variantJson(V, v, file), null, 2)}\n`);
    return;
  }
  const rows = [V.sourceRow(v, V.checkFrame(v.sourceFrame)), V.variantRow(v)];
  const out = [
    `${v.sourceDesign.name} -> ${v.design.name}: ${file}`,
    '',
    changeTable(V, v),
    '',
    wheelbaseLine(v),
    v.body.line,
    `Motor: ${v.motor.how === 'kept' ? 'kept' : `${v.motor.variantClass.name}, ${v.motor.massG} g (${v.motor.how})`}.`,
    ...v.arms.lines,
    `Hardware kept: stack mounts, standoffs, camera width, strap slots, root bolts${v.motor.changes.some((c) => c.path[1] === 'boltCircleMm') ? '' : ', motor pattern and bolts'}.`,
    '',
    comparisonTable(V, rows),
    '',
    `Checks on the variant: 0 errors, ${v.report.summary.warnings} warnings (every check passes; \`framewright check ${file}\` lists the warnings).`,
    ...CAUTIONS,
  ];
  process.stdout.write(`${out.join('\n')}\n`);
}

function sizeRange(V: Stages, text: string, designPath: string, stem: string, sizes: readonly string[], base: Omit<VariantRequest, 'props'>, opts: VariantOptions): void {
  const outcomes: Array<VariantResult | VariantRefusal> = [];
  const problems: string[] = [];
  sizes.forEach((props, i) => {
    try {
      outcomes.push(attempt(V, text, { ...base, props }, designPath));
    } catch (e) {
      if (e instanceof UsageError || e instanceof DesignError) problems.push(`${props}: ${e.message.replace(/^cannot make the .* variant; nothing was written\.\n/, '')}`);
      else throw e;
    }
    progress(i + 1, sizes.length, props);
  });
  if (problems.length) throw new UsageError(`cannot make ${problems.length === 1 ? 'one size' : `${problems.length} sizes`} of the range; nothing was written.\n${problems.join('\n')}`);
  const refusals = outcomes.filter((o): o is VariantRefusal => o instanceof V.VariantRefusal);
  const dir = opts.out ?? join('out', `${stem}-range`);
  if (existsSync(dir) && !statSync(dir).isDirectory()) throw new UsageError(`--out: ${dir} is a file; a size range needs a directory`);
  if (refusals.length && !(opts.force && refusals.every((r) => r.attempt))) {
    process.stderr.write(`framewright: cannot make ${refusals.length === 1 ? 'one size' : `${refusals.length} sizes`} of the range pass every check; nothing was written.\n${refusals.map((r) => refusalText(r, null)).join('')}`);
    process.exitCode = 1;
    return;
  }
  const results = outcomes.filter((o): o is VariantResult => !(o instanceof V.VariantRefusal));
  const files: OutputFile[] = outcomes.map((o, i) => ({ path: join(dir, `${stem}-${propsSlug(sizes[i])}.yaml`), data: o instanceof V.VariantRefusal ? invalidText(o.attempt!.text, o) : o.text }));
  const head = refusals.length ? `INVALID sizes written (--force): ${refusals.map((r) => r.props).join(', ')} fail their checks.\n` : '';
  if (results.length === 0) {
    writeAllAtomically(files);
    process.stdout.write(`${head}${refusals.map((r) => refusalText(r, join(dir, `${stem}-${propsSlug(r.props)}.yaml`))).join('')}`);
    process.exitCode = 1;
    return;
  }
  const first = results[0];
  const rows = [V.sourceRow(first, V.checkFrame(first.sourceFrame)), ...results.map(V.variantRow)];
  const sheet = [
    { label: rows[0].label, notes: notesOf(V, rows[0]), frame: first.sourceFrame },
    ...results.map((v, i) => ({ label: v.design.name, notes: notesOf(V, rows[i + 1]), frame: v.frame })),
  ];
  const sheetPath = join(dir, 'range-sheet.svg');
  const chartPath = join(dir, 'range-chart.svg');
  const title = `${first.sourceDesign.name}: size range`;
  files.push({ path: sheetPath, data: V.rangeSheetSvg(sheet, { title, footer: CAUTIONS }) });
  const inches = rows.map((r) => r.propsIn);
  const chartPoints = rows.map((r, i) => ({ label: r.label, propsIn: r.propsIn, wheelbaseMm: r.wheelbaseMm, massG: r.massG, armFrequencyHz: r.armFrequencyHz, requiredHz: r.requiredHz, source: i === 0 }));
  files.push({ path: chartPath, data: V.rangeChartSvg(chartPoints, V.bandSamples(Math.min(...inches), Math.max(...inches)), { title: `${title}: wheelbase, mass, arm f1 and the motors' rotation band`, footer: CAUTIONS }) });
  writeAllAtomically(files);
  if (opts.json) {
    process.stdout.write(`${JSON.stringify({ units: 'mm', source: designPath, sheet: sheetPath, chart: chartPath, invalid: refusals.map((r) => r.props), cautions: CAUTIONS, rows, variants: results.map((v) => variantJson(V, v, files[outcomes.indexOf(v)].path)) }, null, 2)}\n`);
  } else {
    const out = [
      `${head}${first.sourceDesign.name}: ${results.length} sizes in ${dir} (sheet: ${sheetPath}, chart: ${chartPath})`,
      '',
      comparisonTable(V, rows),
      '',
      "Arm f1: first bending frequency of the softest arm with its motor (Euler-Bernoulli cantilever, tip-mass frequency equation); 'f1 asked'",
      "is what the size rule requires: the source's f1 scaled with the motors' rotation band, which falls as 1/D.",
      refusals.length ? 'The sizes marked INVALID fail their checks (see below); every other size passes every check.' : 'Every size passes every check.',
      'Run with one --props for its change table and the rule\'s numbers.',
      ...refusals.map((r) => refusalText(r, join(dir, `${stem}-${propsSlug(r.props)}.yaml`))),
      ...CAUTIONS,
    ];
    process.stdout.write(`${out.join('\n')}\n`);
  }
  if (refusals.length) process.exitCode = 1;
}

function notesOf(V: Stages, r: RangeRow): string[] {
  return [
    `props ${fmt(r.propsIn, 2)} in, wheelbase ${fmt(r.wheelbaseMm, 1)} mm`,
    `arms ${V.armSizeText(r)} mm, f1 ${fmt(r.armFrequencyHz, 0)} Hz`,
    `${fmt(r.massG, 0)} g, checks: ${r.status}`,
  ];
}
