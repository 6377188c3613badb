import { join } from 'node:path';
import { assemblyReport, assemblyView, hardwareList, hardwareReport, massBalance, massBalanceSummary, projectPoint, type Assembly, type MassBalance, type ViewName } from '../../assembly/index.js';
import { CHECK_CAUTIONS, type CheckReport } from '../../checks/index.js';
import { assemblyViewSvg, hardwareCsv } from '../../export/index.js';
import type { Frame } from '../../geometry/index.js';
import type { OutputFile } from '../io.js';

/**
 * The assembly's output files of `build`: hardware.csv, hardware.json, assembly.json, side.svg and
 * front.svg (fit findings marked on the views), plus the mass-and-balance figures for the summary.
 */
export function assemblyOutputs(frame: Frame, a: Assembly, report: CheckReport, outDir: string): { files: OutputFile[]; balance: MassBalance; massBalance: unknown } {
  const d = frame.design;
  const balance = massBalance(a);
  const list = hardwareList(a, d);
  const full = assemblyReport(a, balance);
  const files: OutputFile[] = [
    { path: join(outDir, 'hardware.csv'), data: hardwareCsv(list) },
    { path: join(outDir, 'hardware.json'), data: `${JSON.stringify(hardwareReport(list), null, 2)}\n` },
    { path: join(outDir, 'assembly.json'), data: `${JSON.stringify(full, null, 2)}\n` },
  ];
  const fit = report.findings.filter((f) => f.where && f.parts);
  for (const view of ['side', 'front'] as ViewName[]) {
    const markers = fit.map((f, i) => ({ atMm: projectPoint(view, f.where!), label: String(i + 1), title: `${f.rule}: ${f.message}` }));
    const title = `${frame.name} rev ${frame.revision}: ${view} view`;
    files.push({ path: join(outDir, `${view}.svg`), data: assemblyViewSvg(assemblyView(a, view), { title, markers, notes: CHECK_CAUTIONS }) });
  }
  return { files, balance, massBalance: massBalanceSummary(a, balance) };
}
