import { basename, join } from 'node:path';
import { checkOptions, checkParts, formatCheckReport, makeReport, partMarkers, type CheckReport } from '../../checks/index.js';
import { markersAnnotation } from '../../export/svgFindings.js';
import { partToSvg } from '../../export/svgPart.js';
import { relieveCorners, type Part } from '../../geometry/index.js';
import { importDxfFile } from '../dxfInput.js';
import { writeAllAtomically } from '../io.js';
import { reliefLine, reliefStyle } from '../reliefFlag.js';

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

/** A finished check of one input: the report, what `--json` prints for it (the report and any extra figures), and the text printed without --json. */
export type CheckRun = Readonly<{ report: CheckReport; json: unknown; text: string }>;

/**
 * `framewright check part.dxf` (loaded by `check` only for a DXF): import the drawing (flags over
 * sidecar), run the part rules on every part and make one report with the file findings beside the
 * design findings; write the annotated drawings when asked.
 * Bad input (not DXF, truncated, bad flags or sidecar) → UsageError, exit 2.
 */
export function runDxfCheck(path: string, text: string, flags: DxfCheckFlags, limitFlags: Record<string, Record<string, unknown>>): CheckRun {
  const { imported, settings } = importDxfFile(path, text, flags);
  const toolDiameterMm = settings.toolDiameterMm;
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
    writeAllAtomically(parts.map((p) => ({ path: join(dir, `${p.name}.check.svg`), data: partToSvg(p, { annotation: markersAnnotation(partMarkers(report, p.name)) }) })), dir);
  }
  const u = imported.units;
  const unitNote = u.from === 'header' ? `${u.unit} from $INSUNITS` : u.from === 'option' ? `${u.unit} as given` : `${u.unit} assumed`;
  const heading = `framewright check: ${basename(path)} (DXF, ${unitNote}; cut layers ${imported.cutLayers.join(', ') || 'none'}; router bit ${o.toolDiameterMm.toFixed(3)} mm)`;
  return { report, json: report, text: `${reliefNote}${formatCheckReport(report, heading)}` };
}
