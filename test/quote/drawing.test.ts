import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drawingToPdf } from '../../src/export/pdfDrawing.js';
import { drawingToSvgs } from '../../src/export/svgDrawing.js';
import { loopBBox } from '../../src/geometry/index.js';
import { chooseScale, cutoutEntries, drawingSet, holeEntries, layoutDrawing, quoteParts, spread, type DrawingSet } from '../../src/quote/index.js';
import { drawingFonts } from '../../src/cli/fonts.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';
import { cutout, demoFrame, exampleShop, plate, roundedRect, roundHole, slot } from './fixtures.js';

const frame = demoFrame('tessel-5');
const quote = quoteParts(frame.parts, { quantity: 2, shop: exampleShop(), toolDiameterMm: 3.175 });
const set: DrawingSet = drawingSet(frame.parts, quote, { design: frame.name, revision: frame.revision, date: '2026-11-30', checks: { errors: 0, warnings: 3 } });
let dir = '';
let pdf: Uint8Array;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'fw-drawing-'));
  pdf = await drawingToPdf(set, layoutDrawing(set), { fonts: drawingFonts() });
  writeFileSync(join(dir, 'drawing.pdf'), pdf);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('drawing data', () => {
  it('one sheet per part plus a summary sheet', () => {
    expect(set.sheets).toHaveLength(frame.parts.length + 1);
    expect(set.sheets[0].kind).toBe('summary');
  });

  it('scale: the largest ISO 5455 preferred scale that fits the 158 × 106 mm view', () => {
    expect(chooseScale(40, 25).label).toBe('2:1'); // 80 × 50 fits, 200 × 125 does not
    expect(chooseScale(124, 87).label).toBe('1:1');
    expect(chooseScale(160, 87).label).toBe('1:2');
    expect(chooseScale(10, 10).label).toBe('5:1');
  });

  it('hole tags, sizes and cut-out sizes, hand-checked', () => {
    // 100 × 50 plate: three Ø3.40 M3 holes and one Ø2.40; a 20 × 3.5 slot along x and a 16 × 10 window.
    const p = plate('tags', roundedRect([0, 0], 100, 50, 5), [
      roundHole([-40, -15], 3.4, { screw: 'M3' }), roundHole([0, 15], 3.4, { screw: 'M3' }), roundHole([40, 15], 3.4, { screw: 'M3' }), roundHole([20, -15], 2.4, { screw: 'M2' }),
      cutout(slot([-10, 0], [6.5, 0], 3.5), 'slot'), cutout(roundedRect([30, -2], 16, 10, 2)),
    ]);
    const h = holeEntries(p, 3.175);
    // Type letters by ascending diameter; numbers in reading order (top row first, left to right).
    expect(h.map((x) => `${x.tag} ${x.centerMm.join(',')} ${x.size} ${x.screw} ${x.typeCount}`)).toEqual([
      'A1 20,-15 Ø2.40 thru drill M2 1',
      'B1 0,15 Ø3.40 thru M3 3',
      'B2 40,15 Ø3.40 thru M3 3',
      'B3 -40,-15 Ø3.40 thru M3 3',
    ]);
    const c = cutoutEntries(p);
    // The slot: caps 16.5 mm apart + 3.5 mm = 20 mm overall; the window 16 × 10 with R2 corners.
    expect(c.map((x) => `${x.tag} ${x.centerMm.map((v) => v.toFixed(2)).join(',')} ${x.extentMm.map((v) => v.toFixed(2)).join('x')} ${x.size}`)).toEqual([
      'S1 -1.75,0.00 20.00x3.50 slot 20.00 x 3.50, axis 0.0°',
      'W1 30.00,-2.00 16.00x10.00 16.00 x 10.00, corners R2.00',
    ]);
  });

  it('ordinate values spread apart without changing their order', () => {
    const pos = spread([10, 10.5, 11, 30], 3);
    expect(pos[1] - pos[0]).toBeCloseTo(3, 9);
    expect(pos[2] - pos[1]).toBeCloseTo(3, 9);
    expect((pos[0] + pos[1] + pos[2]) / 3).toBeCloseTo(10.5, 9); // the cluster stays centred on its mean
    expect(pos[3]).toBe(30);
});
});

describe('drawing layout', () => {
  it('draws each part at its stated scale: paper size of the outline = part size × scale', () => {
    const sheets = layoutDrawing(set);
    set.sheets.forEach((sh, i) => {
      if (sh.kind !== 'part') return;
      const outline = sheets[i].items.find((it) => it.kind === 'loop' && it.stroke === 'outline');
      expect(outline?.kind).toBe('loop');
      if (outline?.kind !== 'loop') return;
      const b = loopBBox(outline.loop);
      const p = loopBBox(sh.part.outline);
      expect(b[2] - b[0]).toBeCloseTo((p[2] - p[0]) * sh.scale.factor, 9);
      expect(b[3] - b[1]).toBeCloseTo((p[3] - p[1]) * sh.scale.factor, 9);
      // Everything on the A4 sheet.
      for (const it of sheets[i].items) {
        if (it.kind !== 'loop') continue;
        const q = loopBBox(it.loop);
        expect(q[0]).toBeGreaterThanOrEqual(0);
        expect(q[1]).toBeGreaterThanOrEqual(0);
        expect(q[2]).toBeLessThanOrEqual(297);
        expect(q[3]).toBeLessThanOrEqual(210);
      }
    });
  });
});

describe('PDF drawing', () => {
  it('is deterministic: the same set gives the same bytes', async () => {
    const again = await drawingToPdf(set, layoutDrawing(set), { fonts: drawingFonts() });
    expect(Buffer.from(again).equals(Buffer.from(pdf))).toBe(true);
    expect(Buffer.from(pdf).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it.skipIf(!requireTool(commandAvailable('pdftotext'), 'poppler-utils (pdftotext)'))('pdftotext finds the hole table, the totals, the title block and the safety notes', () => {
    const r = spawnSync('pdftotext', ['-layout', join(dir, 'drawing.pdf'), '-'], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    const text = r.stdout;
    const pages = text.split('\f').filter((p) => p.trim().length > 0);
    expect(pages).toHaveLength(frame.parts.length + 1);
    // Hole table of the bottom plate: every type of the quote's own hole rows, with its count.
    const bottom = quote.parts.find((p) => p.cut.name === 'bottom-plate')!;
    const bottomPage = pages.find((p) => /part: bottom-plate/.test(p) && /Holes \(/.test(p))!;
    expect(bottomPage).toBeDefined();
    for (const h of bottom.cut.holes) expect(bottomPage).toMatch(new RegExp(`Ø${h.diameterMm.toFixed(2)} [^\\n]*\\s${h.count}\\s`));
    // Totals on the summary sheet.
    expect(pages[0]).toMatch(new RegExp(`total\\s+${quote.batchTime.totalMin.toFixed(1)}\\s+${quote.batchCost.total.toFixed(2)}`));
    expect(pages[0]).toMatch(new RegExp(`per frame\\s+${quote.perFrame.timeMin.toFixed(1)}\\s+${quote.perFrame.cost.toFixed(2)}`));
    expect(text).toMatch(/sheet 1 of 6/);
    expect(text).toMatch(/rev B/);
    expect(text).toMatch(/date: 2026-11-30/);
    expect(text).toMatch(/Design-rule checks: 0 errors, 3 warnings/);
    expect(text).toMatch(/respirator/);
    expect(text).toMatch(/props off/);
    expect(text).toMatch(/scale 1:1/);
  });

  it.skipIf(!requireTool(commandAvailable('pdftoppm'), 'poppler-utils (pdftoppm)'))('pdftoppm renders every page, none blank', () => {
    const r = spawnSync('pdftoppm', ['-r', '30', '-gray', join(dir, 'drawing.pdf'), join(dir, 'page')], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    for (let i = 1; i <= set.sheets.length; i++) {
      const pgm = readFileSync(join(dir, `page-${i}.pgm`));
      const { pixels } = parsePgm(pgm);
      const dark = pixels.filter((v) => v < 128).length;
      // A drawn sheet has its frame, text and geometry: well over 1 % dark pixels, far from all.
      expect(dark / pixels.length).toBeGreaterThan(0.01);
      expect(dark / pixels.length).toBeLessThan(0.5);
    }
  });
});

describe('SVG drawing', () => {
  const svgs = drawingToSvgs(layoutDrawing(set));
  it('one file per sheet, each renders with rsvg-convert', () => {
    expect(svgs).toHaveLength(set.sheets.length);
    expect(svgs[1]).toContain('Holes (');
    expect(svgs[0]).toContain(quote.batchCost.total.toFixed(2));
    if (!requireTool(commandAvailable('rsvg-convert'), 'librsvg2-bin (rsvg-convert)')) return;
    for (const [i, s] of svgs.entries()) {
      const f = join(dir, `s${i}.svg`);
      writeFileSync(f, s);
      const r = spawnSync('rsvg-convert', ['-w', '300', '-o', join(dir, `s${i}.png`), f]);
      expect(r.status).toBe(0);
    }
  });
});

/** Binary PGM (P5) reader: width, height and 8-bit pixels. */
function parsePgm(buf: Buffer): { width: number; height: number; pixels: Uint8Array } {
  let pos = 0;
  const tokens: string[] = [];
  while (tokens.length < 4) {
    while (/\s/.test(String.fromCharCode(buf[pos]))) pos++;
    if (buf[pos] === 0x23) { while (buf[pos] !== 0x0a) pos++; continue; }
    let t = '';
    while (!/\s/.test(String.fromCharCode(buf[pos]))) t += String.fromCharCode(buf[pos++]);
    tokens.push(t);
  }
  pos++;
  const width = Number(tokens[1]);
  const height = Number(tokens[2]);
  expect(tokens[0]).toBe('P5');
  return { width, height, pixels: buf.subarray(pos, pos + width * height) };
}
