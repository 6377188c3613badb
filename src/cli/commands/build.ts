import type { Command } from 'commander';
import { join } from 'node:path';
import type { Frame } from '../../geometry/index.js';
import { readDesign, UsageError, writeAllAtomically, type OutputFile } from '../io.js';
import { textTable } from '../table.js';
import { watchAndRun } from '../watch.js';

export type BuildOptions = { out?: string; json?: boolean; r2000?: boolean; entities?: boolean; force?: boolean };

/** File-system-safe name for a design: lower case, words joined by hyphens. */
export const slug = (name: string): string =>
  name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'frame';

export type PartSummary = {
  name: string;
  role: string;
  quantity: number;
  thicknessMm: number;
  sizeMm: [number, number];
  areaMm2: number;
  massG: number;
  cutLengthMm: number;
  holes: number;
  files: string[];
};

/** Every output file of a build, and the summary rows, without touching the disk. */
export async function buildOutputs(frame: Frame, outDir: string, opts: BuildOptions, comment?: string): Promise<{ files: OutputFile[]; summary: PartSummary[] }> {
  const [{ partArea, partBBox, partCutLength, partMassG }, { frameOverviewSvg, partToDxf, partToSvg }] = await Promise.all([import('../../geometry/index.js'), import('../../export/index.js')]);
  const files: OutputFile[] = [];
  const summary: PartSummary[] = [];
  for (const part of frame.parts) {
    const dxfPath = join(outDir, `${part.name}.dxf`);
    const svgPath = join(outDir, `${part.name}.svg`);
    files.push({ path: dxfPath, data: partToDxf(part, { version: opts.r2000 ? 'R2000' : 'R12', contours: opts.entities ? 'entities' : 'polyline', ...(comment ? { comment } : {}) }) });
    files.push({ path: svgPath, data: partToSvg(part, comment ? { comment } : {}) });
    const b = partBBox(part);
    summary.push({
      name: part.name,
      role: part.role,
      quantity: part.quantity,
      thicknessMm: part.thicknessMm,
      sizeMm: [round(b[2] - b[0], 2), round(b[3] - b[1], 2)],
      areaMm2: round(partArea(part), 2),
      massG: round(partMassG(part), 2),
      cutLengthMm: round(partCutLength(part), 2),
      holes: part.features.filter((f) => f.kind === 'hole').length,
      files: [dxfPath, svgPath],
    });
  }
  files.push({ path: join(outDir, 'overview.svg'), data: frameOverviewSvg(frame) });
  return { files, summary };
}

const round = (x: number, d: number): number => Math.round(x * 10 ** d) / 10 ** d;

export function registerBuild(program: Command): void {
  program
    .command('build')
    .description('build every plate of a design and write DXF and SVG cut files, an overview SVG, side and front views, the hardware list and the assembly with mass and balance')
    .argument('<design>', 'design file (YAML or JSON); - reads it from standard input')
    .option('--out <dir>', 'output folder (default: out/<design name>)')
    .option('--json', 'print the summary as JSON')
    .option('--r2000', 'write DXF R2000 with LWPOLYLINE contours instead of R12')
    .option('--entities', 'write contours as loose LINE and ARC entities instead of closed polylines')
    .option('--force', 'write cut files even when the checks find errors (the files then say so)')
    .option('--watch', 'build again whenever the design file changes (Ctrl-C to stop)')
    .action(async (designPath: string, opts: BuildOptions & { watch?: boolean }) => {
      if (!opts.watch) {
        process.exitCode = await runBuild(designPath, opts);
        return;
      }
      await watchAndRun([designPath], () => runBuild(designPath, opts), !!opts.json);
    });
}

/**
 * Build a design (a file, or standard input for `-`): check it, write the cut files and print the
 * summary. Returns the exit code: 1 when the checks find errors (and, without --force, nothing is
 * written), else 0. Bad input throws DesignError or UsageError.
 */
export async function runBuild(designPath: string, opts: BuildOptions): Promise<number> {
  const design = await readDesign(designPath);
  const [{ buildFrame }, { buildGate, checkFrame, summaryLine }, { buildAssembly, massBalanceText }, { assemblyOutputs }] = await Promise.all([
    import('../../geometry/index.js'),
    import('../../checks/index.js'),
    import('../../assembly/index.js'),
    import('./assemblyFiles.js'),
  ]);
  const frame = buildFrame(design);
  const outDir = opts.out ?? join('out', slug(design.name));
  if (outDir.trim() === '') throw new UsageError('--out must name a folder');
  // Cut files only for a design that passes its checks, unless the designer insists.
  const assembly = buildAssembly(design, frame);
  const report = checkFrame(frame, {}, assembly);
  const { errors, warnings } = report.summary;
  const gate = buildGate(report, !!opts.force);
  if (gate.message) process.stderr.write(gate.message);
  if (gate.refuse) return 1;
  const comment = gate.comment;
  const { files, summary } = await buildOutputs(frame, outDir, opts, comment);
  const built = assemblyOutputs(frame, assembly, report, outDir);
  files.push(...built.files);
  writeAllAtomically(files, outDir);
  if (opts.json) {
    process.stdout.write(`${JSON.stringify({ units: 'mm', design: design.name, revision: design.revision, outDir, checks: report.summary, parts: summary, massBalance: built.massBalance }, null, 2)}\n`);
    return errors > 0 ? 1 : 0;
  }
  const rows = summary.map((s) => [
    s.name,
    String(s.quantity),
    s.thicknessMm.toFixed(1),
    `${s.sizeMm[0].toFixed(1)} x ${s.sizeMm[1].toFixed(1)}`,
    s.areaMm2.toFixed(0),
    s.massG.toFixed(1),
    s.cutLengthMm.toFixed(0),
  ]);
  const totalMass = summary.reduce((a, s) => a + s.massG * s.quantity, 0);
  process.stdout.write(`${design.name} rev ${design.revision}: ${summary.length} parts, plate mass ${totalMass.toFixed(1)} g per frame\n\n`);
  process.stdout.write(`${textTable(['part', 'qty', 'thick mm', 'size mm', 'area mm²', 'mass g', 'cut mm'], rows)}\n\n`);
  process.stdout.write(`${massBalanceText(built.balance)}\n\n`);
  process.stdout.write(`checks: ${summaryLine(report)}${warnings > 0 ? ' (framewright check for details)' : ''}\n`);
  process.stdout.write(`wrote ${files.length} files to ${outDir}/${comment ? ` — FORCED past ${errors} check errors; the files say so` : ''}\n`);
  return errors > 0 ? 1 : 0;
}
