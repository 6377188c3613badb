import type { Command } from 'commander';
import { basename, join } from 'node:path';
import type { CheckOptions, CheckReport } from '../../checks/index.js';
import type { Frame } from '../../geometry/index.js';
import { DesignError } from '../../params/errors.js';
import type { Design } from '../../params/design.js';
import { errorJson, readDesign, readDxfText, reportError, STDIN_PATH, UsageError, writeAllAtomically, type OutputFile } from '../io.js';
import { reliefLine, reliefStyle } from '../reliefFlag.js';
import { watchAndRun } from '../watch.js';
import type { CheckRun, DxfCheckFlags } from './checkDxf.js';

/** Flags of `check`; thickness, material, units and layers apply to DXF input only (checkDxf.ts). */
export type CheckCliOptions = DxfCheckFlags;

/** What `check` works on. The DXF import adds a branch here (a `.dxf` path gives parts without a frame). */
type CheckInput = Readonly<{ kind: 'design'; design: Design }>;

/** Load the thing to check from a path (the only file access of this command besides --annotate). */
async function loadCheckInput(path: string): Promise<CheckInput> {
  return { kind: 'design', design: await readDesign(path) };
}

/**
 * `--limit RULE.KEY=VALUE` pairs as a nested object (numbers and true/false), merged over the
 * design's `checks` section. Throws UsageError on a malformed pair; the schema judges the rest.
 */
export function parseLimitFlags(pairs: readonly string[]): Record<string, Record<string, unknown>> {
  const out: Record<string, Record<string, unknown>> = {};
  for (const pair of pairs) {
    const m = /^([a-z0-9-]+)\.([A-Za-z0-9]+)=(.+)$/.exec(pair.trim());
    if (!m) throw new UsageError(`--limit ${JSON.stringify(pair)}: expected RULE.KEY=VALUE, e.g. web-width.minMm=2`);
    const [, rule, key, text] = m;
    const value = text === 'true' ? true : text === 'false' ? false : Number(text);
    if (typeof value === 'number' && !Number.isFinite(value)) throw new UsageError(`--limit ${pair}: ${JSON.stringify(text)} is not a number (or true/false)`);
    (out[rule] ??= {})[key] = value;
  }
  return out;
}

/** The design's limits with the command-line ones on top; throws DesignError naming `checks.RULE.KEY`. */
export async function mergedOptions(design: Design, opts: CheckCliOptions): Promise<CheckOptions> {
  const { optionsForDesign, parseLimits } = await import('../../checks/index.js');
  const flags = parseLimitFlags(opts.limit ?? []);
  const base = design.checks as Record<string, Record<string, unknown>>;
  const merged: Record<string, unknown> = { ...base };
  for (const [rule, keys] of Object.entries(flags)) merged[rule] = { ...(base[rule] ?? {}), ...keys };
  const limits = parseLimits(merged);
  let toolDiameterMm: number | undefined;
  if (opts.tool !== undefined) {
    toolDiameterMm = Number(opts.tool);
    if (!Number.isFinite(toolDiameterMm) || toolDiameterMm < 0.3 || toolDiameterMm > 12) {
      throw new DesignError([{ path: '--tool', value: opts.tool, message: 'must be a router bit diameter from 0.3 to 12 mm' }]);
    }
  }
  return optionsForDesign(design, { limits, ...(toolDiameterMm !== undefined ? { toolDiameterMm } : {}) });
}

/** Annotated SVG files: one per part with its findings marked, and the overview with props and camera view. */
export async function annotatedFiles(frame: Frame, report: CheckReport, dir: string, o: CheckOptions): Promise<OutputFile[]> {
  const [{ CHECK_CAUTIONS, frameAnnotation, partMarkers }, { frameFindingsAnnotation, markersAnnotation }, { partToSvg, frameOverviewSvg }] = await Promise.all([
    import('../../checks/index.js'),
    import('../../export/svgFindings.js'),
    import('../../export/index.js'),
  ]);
  const files: OutputFile[] = frame.parts.map((p) => ({
    path: join(dir, `${p.name}.check.svg`),
    data: partToSvg(p, { annotation: { ...markersAnnotation(partMarkers(report, p.name)), notes: CHECK_CAUTIONS } }),
  }));
  const a = frameAnnotation(frame, report, o);
  files.push({ path: join(dir, 'overview.check.svg'), data: frameOverviewSvg(frame, { annotation: frameFindingsAnnotation(a) }) });
  return files;
}

/** A design check: limits, optional corner relief, the report, annotated drawings when asked. */
async function runDesignCheck(path: string, opts: CheckCliOptions): Promise<CheckRun> {
  const input = await loadCheckInput(path);
  // Limits are judged before the (slower) geometry is built, so bad input fails fast.
  const o = await mergedOptions(input.design, opts);
  const [{ buildFrame, relieveFrame }, { checkFrame, formatCheckReport }, { buildAssembly, massBalance, massBalanceText }] = await Promise.all([
    import('../../geometry/index.js'),
    import('../../checks/index.js'),
    import('../../assembly/index.js'),
  ]);
  let frame = buildFrame(input.design);
  let reliefNote = '';
  if (opts.relieveCorners) {
    const style = reliefStyle(opts.relieveCorners);
    const r = relieveFrame(frame, o.toolDiameterMm, style);
    frame = r.frame;
    reliefNote = reliefLine(style, r.added, r.skipped);
  }
  const assembly = buildAssembly(frame.design, frame);
  const report = checkFrame(frame, o, assembly);
  const balance = massBalance(assembly);
  if (opts.annotate) {
    const files = await annotatedFiles(frame, report, opts.annotate, o);
    writeAllAtomically(files, opts.annotate);
  }
  const heading = `framewright check: ${frame.name} rev ${frame.revision} (router bit ${o.toolDiameterMm.toFixed(3)} mm)`;
  return { report, json: report, text: `${reliefNote}${formatCheckReport(report, heading)}${massBalanceText(balance)}\n` };
}

/** Check one input: a design file, `-` for a design on standard input, or a DXF drawing. */
export async function runCheck(path: string, opts: CheckCliOptions): Promise<CheckRun> {
  if (/\.dxf$/i.test(path)) {
    // Read (bounded) before loading the stages, so a file that is not DXF is refused at once.
    const text = readDxfText(path);
    return (await import('./checkDxf.js')).runDxfCheck(path, text, opts, parseLimitFlags(opts.limit ?? []));
  }
  return runDesignCheck(path, opts);
}

/** File-name stem of an input, for its own annotation folder when several are checked. */
const stem = (path: string): string => (path === STDIN_PATH ? 'stdin' : basename(path).replace(/\.[^.]+$/, ''));

/**
 * Check every input and print the reports: one report (text, or the JSON contract) for one input;
 * for several, the text reports one after another, or a JSON array of reports each with its
 * `input` (a bad input as `{ "input", "error": { "message", "path" } }`). Returns the exit code:
 * 2 when an input is bad, else 1 when a report has errors, else 0.
 */
export async function checkInputs(paths: readonly string[], opts: CheckCliOptions): Promise<number> {
  if (paths.length === 1) {
    const { report, json, text } = await runCheck(paths[0], opts);
    process.stdout.write(opts.json ? `${JSON.stringify(json, null, 2)}\n` : text);
    return report.summary.errors > 0 ? 1 : 0;
  }
  const stems = paths.map(stem);
  let code = 0;
  const results: unknown[] = [];
  for (const [i, path] of paths.entries()) {
    const own = { ...opts, ...(opts.annotate ? { annotate: join(opts.annotate, stems.indexOf(stems[i]) === i ? stems[i] : `${stems[i]}-${i + 1}`) } : {}) };
    try {
      const { report, json, text } = await runCheck(path, own);
      code = Math.max(code, report.summary.errors > 0 ? 1 : 0);
      if (opts.json) results.push({ input: path, ...(json as object) });
      else process.stdout.write(`${i > 0 ? '\n' : ''}${text}`);
    } catch (e) {
      code = Math.max(code, reportError(e));
      if (opts.json) results.push({ input: path, ...errorJson(e) });
    }
  }
  if (opts.json) process.stdout.write(`${JSON.stringify(results, null, 2)}\n`);
  return code;
}

export function registerCheck(program: Command): void {
  program
    .command('check')
    .description('design-rule checks before cutting: webs, hole edges, router-bit reach, weave direction, hole stress, prop clearance, props in the camera view, and the fits of the assembled frame (interference, stack, camera, battery, motor screws)')
    .argument('<inputs...>', 'design files (YAML or JSON; - reads one from standard input), or DXF cut files drawn elsewhere (.dxf)')
    .option('--json', 'print the report as JSON (the report contract in the README; an array of reports for several inputs)')
    .option('--annotate <dir>', 'write an SVG per part with each finding marked, and an overview with prop discs and the camera view (a folder per input when several)')
    .option('--relieve-corners [style]', 'add reliefs sized to the tool at sharp inside corners of slots and cut-outs (dogbone, the default, or tbone), then check the edited parts')
    .option('--tool <mm>', 'router bit diameter in mm (default: cutting.toolDiameterMm of the design)')
    .option('--limit <rule.key=value>', 'override a limit of the checks section, e.g. --limit web-width.minMm=2 (repeat for more)', (v: string, acc: string[]) => [...acc, v], [] as string[])
    .option('--thickness <mm>', 'DXF only: plate thickness in mm (else the sidecar FILE.dxf.yaml, else 2 mm with a warning)')
    .option('--material <name>', 'DXF only: material name (woven-cf, or one defined in the sidecar)')
    .option('--units <unit>', 'DXF only: drawing units mm, cm, m, in, ft, mil, um, dm (overrides $INSUNITS)')
    .option('--layers <a,b>', 'DXF only: the layers that hold cut geometry (default: all but frozen, off and annotation layers)')
    .option('--watch', 'check again whenever an input file changes (Ctrl-C to stop)')
    .action(async (paths: string[], opts: CheckCliOptions & { watch?: boolean }) => {
      if (paths.filter((p) => p === STDIN_PATH).length > 1) throw new UsageError('standard input (-) can be read only once', STDIN_PATH);
      if (!opts.watch) {
        process.exitCode = await checkInputs(paths, opts);
        return;
      }
      await watchAndRun(paths, () => checkInputs(paths, opts), !!opts.json);
    });
}
