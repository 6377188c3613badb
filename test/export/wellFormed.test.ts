import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as DxfParserModule from 'dxf-parser';
import { describe, expect, it } from 'vitest';
import { checkFrame, frameAnnotation, optionsForDesign, partMarkers } from '../../src/checks/index.js';
import { frameOverviewSvg, partToDxf, partToSvg, placedPartsToDxf, plainLine, printable, xmlEscape } from '../../src/export/index.js';
import { drawingToPdf } from '../../src/export/pdfDrawing.js';
import { drawingFonts } from '../../src/cli/fonts.js';
import { drawingToSvgs, sheetLayoutToSvg } from '../../src/export/svgDrawing.js';
import { rangeSheetSvg } from '../../src/export/svgRangeSheet.js';
import { rangeChartSvg } from '../../src/export/svgRangeChart.js';
import { frameFindingsAnnotation, markersAnnotation } from '../../src/export/svgFindings.js';
import { modeShapeSvg } from '../../src/export/svgModes.js';
import type { Frame } from '../../src/geometry/index.js';
import { drawingSet, layoutDrawing, quoteParts } from '../../src/quote/index.js';
import { demoFrame } from '../helpers/demo.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';
import { xmlProblem } from '../helpers/xml.js';
import { exampleShop } from '../quote/fixtures.js';

// dxf-parser's default export under NodeNext (library-notes.md)
const DxfParser = ((DxfParserModule as unknown as { default?: unknown }).default ?? DxfParserModule) as new () => { parseSync(s: string): unknown };

/**
 * Text no file may carry as it is: NUL, ESC (a terminal colour sequence), BEL, a lone surrogate,
 * U+FFFE, a C1 control, "--" and "-->" (not allowed inside an XML comment), markup characters,
 * a line break and a character outside the Basic Multilingual Plane.
 */
const HOSTILE = 'A\u0000B\u001b[31mC\u0007 -- D <&> "E" \'F\' \ud800 G\u0085\ufffe --> H\r\nI 🛩';
/** Characters that must not survive into a DXF line or PDF text: C0 but tab, DEL, C1. */
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;

/** Tessel 5 with the hostile text in its name, revision and every part name. */
function hostileFrame(): Frame {
  const f = demoFrame('tessel-5.yaml');
  return { ...f, name: HOSTILE, revision: HOSTILE, parts: f.parts.map((p) => ({ ...p, name: `${p.name} ${HOSTILE}` })) };
}

describe('every writer keeps its output well-formed whatever text reaches it (XML by saxes, DXF by dxf-parser)', () => {
  const frame = hostileFrame();

  it('the text helpers drop what XML 1.0 does not allow and keep the rest', () => {
    expect(printable(HOSTILE)).toBe('AB[31mC -- D <&> "E" \'F\'  G --> H\r\nI 🛩');
    expect(plainLine(HOSTILE)).toBe('AB[31mC -- D <&> "E" \'F\'  G --> H I 🛩');
    expect(xmlProblem(`<a>${xmlEscape(HOSTILE)}</a>`)).toBeNull();
    expect(xmlProblem(`<a b="${xmlEscape(HOSTILE)}"/>`)).toBeNull();
    // The checker itself rejects what the helpers prevent.
    expect(xmlProblem(`<a><!-- -- --></a>`)).not.toBeNull();
    expect(xmlProblem(`<a>\u001b</a>`)).not.toBeNull();
  });

  it('part SVGs (with a forced-build note and finding markers) and the overview', () => {
    const report = checkFrame(frame);
    for (const p of frame.parts) {
      const svg = partToSvg(p, { comment: `written with --force -- ${HOSTILE}`, annotation: markersAnnotation(partMarkers(report, p.name)) });
      expect(xmlProblem(svg), p.name).toBeNull();
      expect(svg).toContain('written with --force');
    }
    const a = frameAnnotation(frame, report, optionsForDesign(frame.design));
    expect(xmlProblem(frameOverviewSvg(frame))).toBeNull();
    expect(xmlProblem(frameOverviewSvg(frame, { annotation: frameFindingsAnnotation(a) }))).toBeNull();
  });

  it('DXF R12 and R2000: comments and labels are single printable lines that an independent reader takes', () => {
    const parser = new DxfParser();
    for (const version of ['R12', 'R2000'] as const) {
      const files = [
        ...frame.parts.map((p) => partToDxf(p, { version, comment: `${HOSTILE} ${'long '.repeat(80)}` })),
        placedPartsToDxf(frame.parts.map((p, i) => ({ part: p, transform: { rotateRad: 0, translate: [200 * i, 0] as const }, label: p.name })), { version, comment: HOSTILE }),
      ];
      for (const dxf of files) {
        const lines = dxf.split('\n');
        expect(lines.find((l) => CONTROL.test(l.replace(/\r$/, ''))), version).toBeUndefined();
        expect(Math.max(...lines.map((l) => l.length)), version).toBeLessThanOrEqual(255);
        expect(() => parser.parseSync(dxf), version).not.toThrow();
      }
    }
  });

  it('the quote drawing (SVG pages, nested sheets), the range sheet and the range chart', () => {
    const quote = quoteParts(frame.parts, { quantity: 2, shop: exampleShop(), toolDiameterMm: 3.175 });
    const set = drawingSet(frame.parts, quote, { design: HOSTILE, revision: HOSTILE, date: null, checks: { errors: 0, warnings: 0 }, generalTolerance: HOSTILE });
    for (const svg of drawingToSvgs(layoutDrawing(set))) expect(xmlProblem(svg)).toBeNull();
    for (const s of quote.nesting.sheets) expect(xmlProblem(sheetLayoutToSvg(s, frame.parts, { title: HOSTILE, note: HOSTILE, marginMm: 10 }))).toBeNull();
    expect(xmlProblem(rangeSheetSvg([{ label: HOSTILE, notes: [HOSTILE], frame }], { title: HOSTILE, footer: [HOSTILE] }))).toBeNull();
    const point = { label: HOSTILE, propsIn: 5, wheelbaseMm: 220, massG: 110, armFrequencyHz: 250, requiredHz: 240, source: true };
    expect(xmlProblem(rangeChartSvg([point, { ...point, propsIn: 7, source: false }], [{ propsIn: 5, lowHz: 180, highHz: 600 }, { propsIn: 7, lowHz: 130, highHz: 430 }], { title: HOSTILE, footer: [HOSTILE] }))).toBeNull();
  });

  it('a mode-shape plot', () => {
    const svg = modeShapeSvg({
      title: HOSTILE,
      subtitle: HOSTILE,
      description: HOSTILE,
      frequencyHz: 123.4,
      xy: Float64Array.from([0, 0, 10, 0, 0, 10]),
      triangles: Uint32Array.from([0, 1, 2]),
      w: Float64Array.from([0, 0.5, 1]),
      loops: [],
    });
    expect(xmlProblem(svg)).toBeNull();
  });

  it.runIf(requireTool(commandAvailable('pdftotext'), 'pdftotext'))('the PDF drawing: pdftotext (poppler) reads it and finds no control character', async () => {
    const quote = quoteParts(frame.parts, { quantity: 1, shop: exampleShop(), toolDiameterMm: 3.175 });
    const set = drawingSet(frame.parts, quote, { design: HOSTILE, revision: HOSTILE, date: null, checks: { errors: 0, warnings: 0 }, generalTolerance: HOSTILE });
    const dir = mkdtempSync(join(tmpdir(), 'fw-xml-'));
    writeFileSync(join(dir, 'd.pdf'), await drawingToPdf(set, layoutDrawing(set), { fonts: drawingFonts() }));
    const r = spawnSync('pdftotext', [join(dir, 'd.pdf'), '-'], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('--> H I');
    expect(CONTROL.test(r.stdout.replace(/\f/g, ''))).toBe(false);
  });
});
