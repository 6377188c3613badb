import { existsSync, readFileSync, statSync } from 'node:fs';
import { basename, join } from 'node:path';
import { checkOptions, checkParts, formatCheckReport, makeReport, partMarkers, type CheckReport } from '../../checks/index.js';
import { markersAnnotation } from '../../export/svgFindings.js';
import { partToSvg } from '../../export/svgPart.js';
import { relieveCorners, type Part } from '../../geometry/index.js';
import { DxfReadError, importDxf, parseSidecarText, resolveImportSettings, type ImportResult } from '../../import/index.js';
import { plural } from '../../params/words.js';
import { UsageError, writeAllAtomically } from '../io.js';

/** Flags of `check` that apply to a DXF file. */
export type DxfCheckFlags = Readonly<{
  json?: boolean;
  annotate?: string;
  relieveCorners?: boolean | string;
  tool?: string;
  limit?: string[];
  thickness?: string;
  material?: string;
  units?: string;
  layers?: string;
}>;

/** Larger files are refused before reading: a plate drawing is kilobytes, a full sheet a few megabytes. */
const MAX_DXF_BYTES = 256 * 1024 * 1024;

/** DXF text: UTF-8 (R2007 and later) or, when that fails, the single-byte code page older files use. */
function readDxfText(path: string): string {
  let size: number;
  try {
    size = statSync(path).size;
  } catch (e) {
    throw new UsageError(`cannot read ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  if (size > MAX_DXF_BYTES) throw new UsageError(`${path} is ${(size / 1048576).toFixed(0)} MB, beyond the ${MAX_DXF_BYTES / 1048576} MB a DXF may have here`);
  const bytes = readFileSync(path);
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return bytes.toString('latin1');
  }
}

/** The sidecar beside a DXF: `arm.dxf` → `arm.dxf.yaml`, if present. */
export const sidecarPath = (dxfPath: string): string => `${dxfPath}.yaml`;

/** The relief style of `--relieve-corners [style]`; bad input is a UsageError (exit 2). */
export function reliefStyle(flag: boolean | string): 'dogbone' | 'tbone' {
  if (flag === true || flag === 'dogbone') return 'dogbone';
  if (flag === 'tbone') return 'tbone';
  throw new UsageError(`--relieve-corners: ${JSON.stringify(flag)} must be dogbone or tbone`);
}

/** The line printed above a report of relieved parts. */
export function reliefLine(style: 'dogbone' | 'tbone', added: number, skipped: number): string {
  const word = style === 'dogbone' ? 'dogbone' : 'T-bone';
  return `Corner relief: ${plural(added, word)} added${skipped ? `, ${plural(skipped, 'corner')} too tight to relieve` : ''}; the report below is for the relieved parts.\n`;
}

/**
 * `framewright check part.dxf`: import the drawing (flags over sidecar), run the part rules on
 * every part and print one report with the file findings beside the design findings.
 * Bad input (not DXF, truncated, bad flags or sidecar) → UsageError, exit 2.
 */
export function runDxfCheck(path: string, flags: DxfCheckFlags, limitFlags: Record<string, Record<string, unknown>>): void {
  const text = readDxfText(path);
  const side = sidecarPath(path);
  let imported: ImportResult;
  let toolDiameterMm: number | undefined;
  try {
    const sidecar = existsSync(side) ? parseSidecarText(readFileSync(side, 'utf8'), side) : {};
    const settings = resolveImportSettings(flags, sidecar);
    toolDiameterMm = settings.toolDiameterMm;
    imported = importDxf(text, { name: basename(path).replace(/\.dxf$/i, ''), ...settings });
  } catch (e) {
    if (e instanceof DxfReadError) throw new UsageError(`${path}: ${e.message}`);
    throw e;
  }
  const o = checkOptions({ ...(toolDiameterMm !== undefined ? { toolDiameterMm } : {}), limits: limitFlags });
  let parts: Part[] = imported.parts;
  let reliefNote = '';
  if (flags.relieveCorners) {
    const style = reliefStyle(flags.relieveCorners);
    let added = 0;
    let skipped = 0;
    parts = parts.map((p) => {
      const r = relieveCorners(p, o.toolDiameterMm, style);
      added += r.added;
      skipped += r.skipped;
      return r.part;
    });
    reliefNote = reliefLine(style, added, skipped);
  }
  const design = checkParts(parts, o);
  const report: CheckReport = makeReport(design.parts, [...imported.findings, ...design.findings]);
  if (flags.annotate) {
    const dir = flags.annotate;
    writeAllAtomically(parts.map((p) => ({ path: join(dir, `${p.name}.check.svg`), data: partToSvg(p, { annotation: markersAnnotation(partMarkers(report, p.name)) }) })));
  }
  if (flags.json) process.stdout.write(`${JSON.stringify(report, null, 2)}\n`);
  else {
    const u = imported.units;
    const unitNote = u.from === 'header' ? `${u.unit} from $INSUNITS` : u.from === 'option' ? `${u.unit} as given` : `${u.unit} assumed`;
    const heading = `framewright check: ${basename(path)} (DXF, ${unitNote}; cut layers ${imported.cutLayers.join(', ') || 'none'}; router bit ${o.toolDiameterMm.toFixed(3)} mm)`;
    process.stdout.write(`${reliefNote}${formatCheckReport(report, heading)}`);
  }
  process.exitCode = report.summary.errors > 0 ? 1 : 0;
}
