import type { HardwareList } from '../assembly/types.js';
import type { Part } from '../geometry/part.js';
import { drawingSet, layoutDrawing, quoteReport, type Quote } from '../quote/index.js';
import { placedPartsToDxf } from './dxf.js';
import type { DrawingFonts } from './pdfDrawing.js';
import { drawingToSvgs, sheetLayoutToSvg } from './svgDrawing.js';

/** One file of a quote package: a path relative to the package folder, and its bytes. */
export type PackageFile = Readonly<{ name: string; data: string | Uint8Array }>;

export type QuotePackageMeta = Readonly<{
  design: string;
  revision: string;
  /** Title-block date as given (YYYY-MM-DD); never the clock. */
  date: string | null;
  /** Design-rule summary printed on the drawing, or null when the checks were not run. */
  checks: Readonly<{ errors: number; warnings: number }> | null;
  /** General tolerance note; default `ISO 2768-m unless stated`. */
  generalTolerance?: string;
  /** Sheet DXFs as R2000 (LWPOLYLINE) instead of R12. */
  r2000?: boolean;
  /** The frame's hardware, listed on the summary sheet when given. */
  hardware?: HardwareList;
  /** The font embedded in the PDF (read by the caller: src/cli/fonts.ts). */
  fonts: DrawingFonts;
}>;

export const DEFAULT_GENERAL_TOLERANCE = 'ISO 2768-m unless stated';

const pad = (n: number): string => String(n).padStart(2, '0');

/**
 * Every file a shop needs to quote and cut a batch, as bytes, from a quote computed by `quoteParts`
 * over the same parts: `quote.json` (the report), `drawing.pdf` and `drawing-NN.svg` (summary sheet,
 * then one sheet per part) and `sheets/sheet-NN-<t>mm.dxf|svg` (each nested sheet). Pure and
 * deterministic: the same parts, quote and meta give the same bytes.
 * @example const files = await quotePackage(frame.parts, quoteParts(frame.parts, { quantity: 20, shop }), { design: 'Tessel 5', revision: 'B', date: null, checks: null, fonts });
 */
export async function quotePackage(parts: readonly Part[], quote: Quote, meta: QuotePackageMeta): Promise<{ report: ReturnType<typeof quoteReport>; files: PackageFile[] }> {
  const head = { design: meta.design, revision: meta.revision, date: meta.date, checks: meta.checks };
  const set = drawingSet(parts, quote, { ...head, generalTolerance: meta.generalTolerance ?? DEFAULT_GENERAL_TOLERANCE, ...(meta.hardware ? { hardware: meta.hardware } : {}) });
  const report = quoteReport(quote, head);
  const files: PackageFile[] = [{ name: 'quote.json', data: `${JSON.stringify(report, null, 2)}\n` }];
  const sheets = layoutDrawing(set);
  // The PDF writer (and its font machinery) loads only here, where a PDF is made.
  const { drawingToPdf } = await import('./pdfDrawing.js');
  files.push({ name: 'drawing.pdf', data: await drawingToPdf(set, sheets, { fonts: meta.fonts }) });
  drawingToSvgs(sheets).forEach((svg, i) => files.push({ name: `drawing-${pad(i + 1)}.svg`, data: svg }));
  quote.nesting.sheets.forEach((s, i) => {
    const name = `sheet-${pad(i + 1)}-${s.thicknessMm}mm`;
    const note = `${meta.design} rev ${meta.revision}: sheet ${i + 1} of ${quote.nesting.sheets.length}, ${s.thicknessMm} mm ${s.material}, ${s.placements.length} parts, utilisation ${(s.utilisation * 100).toFixed(1)} %`;
    files.push({
      name: `sheets/${name}.dxf`,
      data: placedPartsToDxf(
        s.placements.map((p) => ({ part: parts[p.item], transform: p.transform, label: `${p.partName} ${p.copy + 1}` })),
        { version: meta.r2000 ? 'R2000' : 'R12', comment: note },
      ),
    });
    files.push({ name: `sheets/${name}.svg`, data: sheetLayoutToSvg(s, parts, { title: name, marginMm: quote.nesting.marginMm, note }) });
  });
  return { report, files };
}
