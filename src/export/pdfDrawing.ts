import PDFDocument from 'pdfkit';
import type { Vec2 } from '../geometry/types.js';
import { assertNever } from '../geometry/types.js';
import { type DrawingSet, type PaperItem, type PaperSheet, type Stroke } from '../quote/index.js';
import { plainLine } from './format.js';
import { loopPathData } from './svgPath.js';

/** PDF points per millimetre (72 pt per inch, 25.4 mm per inch). */
const PT_PER_MM = 72 / 25.4;

const LINE_MM: Record<Stroke, number> = { outline: 0.35, thin: 0.18, frame: 0.5 };
const REGULAR = 'drawing-regular';
const BOLD = 'drawing-bold';

/** The drawing font's files (TrueType, OpenType or WOFF bytes), embedded as subsets in the PDF. */
export type DrawingFonts = Readonly<{ regular: Uint8Array; bold: Uint8Array }>;

export type PdfDrawingOptions = Readonly<{
  /** The font to embed (the CLI reads DejaVu Sans from its npm package: src/cli/fonts.ts). */
  fonts: DrawingFonts;
  /**
   * The document's creation date written into the PDF info (bytes stay the same for the same input):
   * the drawing's own date when it has one, else 2000-01-01. Never the clock.
   */
  creationDate?: Date;
}>;

/**
 * The drawing set as a multi-page PDF (A4 landscape) with the given font embedded (subset), so it
 * prints the same everywhere. The sheets are laid out by src/quote (layoutDrawing, measured with the
 * same font's widths) and passed in; this only serialises them. Deterministic: a fixed creation date
 * and no other varying metadata, so the same set gives the same bytes.
 */
export async function drawingToPdf(set: DrawingSet, sheets: readonly PaperSheet[], options: PdfDrawingOptions): Promise<Uint8Array> {
  const date = options.creationDate ?? dateOf(set.date);
  const doc = new PDFDocument({
    autoFirstPage: false,
    compress: true,
    info: { Title: plainLine(`${set.design} rev ${set.revision} - drawing and quote`), Creator: 'framewright', Producer: 'framewright', CreationDate: date, ModDate: date },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<void>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve());
    doc.on('error', reject);
  });
  doc.registerFont(REGULAR, Buffer.from(options.fonts.regular));
  doc.registerFont(BOLD, Buffer.from(options.fonts.bold));
  for (const sheet of sheets) page(doc, sheet);
  doc.end();
  await done;
  return new Uint8Array(Buffer.concat(chunks));
}

function dateOf(iso: string | null): Date {
  const m = iso ? /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso) : null;
  return m ? new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))) : new Date(Date.UTC(2000, 0, 1));
}

function page(doc: PDFKit.PDFDocument, sheet: PaperSheet): void {
  doc.addPage({ size: [sheet.widthMm * PT_PER_MM, sheet.heightMm * PT_PER_MM], margin: 0 });
  doc.save();
  doc.scale(PT_PER_MM);
  const flip = (p: Vec2): Vec2 => [p[0], sheet.heightMm - p[1]];
  doc.lineJoin('round').lineCap('round');
  for (const item of sheet.items) draw(doc, item, flip);
  doc.restore();
}

function draw(doc: PDFKit.PDFDocument, item: PaperItem, flip: (p: Vec2) => Vec2): void {
  switch (item.kind) {
    case 'loop':
      doc.path(loopPathData(item.loop, flip)).lineWidth(LINE_MM[item.stroke]).strokeColor('black').stroke();
      return;
    case 'line': {
      const a = flip(item.a);
      const b = flip(item.b);
      doc.moveTo(a[0], a[1]).lineTo(b[0], b[1]).lineWidth(LINE_MM[item.stroke]).strokeColor('black').stroke();
      return;
    }
    case 'triangle': {
      const [a, b, c] = item.points.map(flip);
      doc.polygon([a[0], a[1]], [b[0], b[1]], [c[0], c[1]]).fillColor('black').fill();
      return;
    }
    case 'text': {
      const at = flip(item.at);
      doc.font(item.bold ? BOLD : REGULAR).fontSize(item.sizeMm).fillColor('black');
      const text = plainLine(item.text);
      const w = doc.widthOfString(text);
      const dx = item.anchor === 'start' ? 0 : item.anchor === 'middle' ? -w / 2 : -w;
      doc.save();
      // pdfkit turns clockwise on the y-down page; the layout's angles are counter-clockwise.
      if (item.rotateDeg) doc.rotate(-item.rotateDeg, { origin: [at[0], at[1]] });
      doc.text(text, at[0] + dx, at[1], { lineBreak: false, baseline: 'alphabetic' });
      doc.restore();
      return;
    }
    default:
      assertNever(item);
  }
}
