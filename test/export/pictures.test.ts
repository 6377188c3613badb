import { describe, expect, it } from 'vitest';
import { checkFrame, frameAnnotation, partMarkers } from '../../src/checks/index.js';
import { frameOverviewSvg, partToSvg } from '../../src/export/index.js';
import { frameFindingsAnnotation, markersAnnotation } from '../../src/export/svgFindings.js';
import { modeShapeSvg } from '../../src/export/svgModes.js';
import { partModes } from '../../src/analysis/index.js';
import { DEMO_FILES, demoFrame } from '../helpers/demo.js';
import { drawingSet, layoutDrawing, quoteParts } from '../../src/quote/index.js';
import { drawingToSvgs } from '../../src/export/svgDrawing.js';
import { exampleShop } from '../quote/fixtures.js';
import { assemblyView, buildAssembly } from '../../src/assembly/index.js';
import { assemblyViewSvg } from '../../src/export/svgAssemblyView.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';
import { chromiumTextBoxes, drawnExtent, ONE_PIXEL_MM, overlappingTexts } from '../helpers/render.js';
import { textWidthMm } from '../../src/params/textWidth.js';
import { rangeSheetSvg } from '../../src/export/svgRangeSheet.js';
import { rangeChartSvg } from '../../src/export/svgRangeChart.js';
import { armSizeText, bandSamples, rangeRow } from '../../src/variant/index.js';

/** The font the PDF embeds and the width table measures; wider than most sans-serif faces. */
const DRAWING_FONT = 'DejaVu Sans';

/** Every picture framewright draws for the demo designs, with a name for messages. */
function pictures(): Array<{ name: string; svg: string }> {
  const out: Array<{ name: string; svg: string }> = [];
  for (const file of DEMO_FILES) {
    const frame = demoFrame(file);
    const report = checkFrame(frame);
    out.push({ name: `${file} overview`, svg: frameOverviewSvg(frame) });
    out.push({ name: `${file} overview.check`, svg: frameOverviewSvg(frame, { annotation: frameFindingsAnnotation(frameAnnotation(frame, report)) }) });
    for (const p of frame.parts) {
      out.push({ name: `${file} ${p.name}`, svg: partToSvg(p) });
      out.push({ name: `${file} ${p.name}.check`, svg: partToSvg(p, { annotation: markersAnnotation(partMarkers(report, p.name)) }) });
    }
  }
  // One real mode shape (the smallest demo's top plate, coarse mesh: the picture is what is tested).
  const top = demoFrame('mote-3.yaml').parts.find((p) => p.role === 'top')!;
  const m = partModes(top, { modes: 1, meshSizeMm: 4 });
  const mode = m.modes[0];
  const n = m.mesh.xy.length / 2;
  out.push({
    name: 'mote-3 top-plate mode 1',
    svg: modeShapeSvg({ title: 'Mote 3 · top-plate · mode 1', frequencyHz: mode.frequencyHz, description: mode.description, xy: m.mesh.xy, triangles: m.mesh.triangles, w: Float64Array.from({ length: n }, (_, i) => mode.shape[6 * i + 2]), loops: [top.outline, ...top.features.map((f) => f.loop)] }),
  });
  // The assembly's side, front and plan views with the fit findings marked.
  for (const file of DEMO_FILES) {
    const frame = demoFrame(file);
    const a = buildAssembly(frame.design, frame);
    for (const v of ['side', 'front', 'plan'] as const) {
      out.push({ name: `${file} ${v} view`, svg: assemblyViewSvg(assemblyView(a, v), { title: `${frame.name}: ${v} view`, markers: [{ atMm: [0, 5], label: '1', title: 'a marker' }], notes: ['a note'] }) });
    }
  }
  // The quote drawing's sheets (A4, the same layout as the PDF).
  for (const file of DEMO_FILES) {
    const frame = demoFrame(file);
    const quote = quoteParts(frame.parts, { quantity: 1, shop: exampleShop(), toolDiameterMm: frame.design.cutting.toolDiameterMm });
    const set = drawingSet(frame.parts, quote, { design: frame.name, revision: frame.revision, date: '2026-12-01', checks: { errors: 0, warnings: 1 } });
    drawingToSvgs(layoutDrawing(set)).forEach((svg, i) => out.push({ name: `${file} drawing sheet ${i + 1}`, svg }));
  }
  // The size-range sheet and chart, with the demo designs standing in for the sizes of one range
  // (the CLI's own range output is rendered in test/variant/cli.test.ts).
  const rows = DEMO_FILES.map((file) => {
    const frame = demoFrame(file);
    return { frame, row: rangeRow(frame.name, frame.design, frame, checkFrame(frame), 300) };
  });
  const notes = (r: (typeof rows)[number]['row']) => [`props ${r.propsIn} in, wheelbase ${r.wheelbaseMm} mm`, `arms ${armSizeText(r)} mm, f1 ${r.armFrequencyHz} Hz`, `${r.massG} g, checks: ${r.status}`];
  out.push({ name: 'range sheet', svg: rangeSheetSvg(rows.map(({ frame, row }) => ({ label: row.label, notes: notes(row), frame })), { title: 'Demo frames: size range', footer: ['Caution: estimates, not a certification; test a new frame with props off first.'] }) });
  const inches = rows.map((r) => r.row.propsIn);
  out.push({
    name: 'range chart',
    svg: rangeChartSvg(rows.map(({ row }, i) => ({ label: row.label, propsIn: row.propsIn, wheelbaseMm: row.wheelbaseMm, massG: row.massG, armFrequencyHz: row.armFrequencyHz, requiredHz: row.requiredHz, source: i === 0 })), bandSamples(Math.min(...inches), Math.max(...inches)), { title: 'Demo frames: wheelbase, mass, arm f1 and the motors\u2019 rotation band', footer: ['Caution: estimates, not a certification; test a new frame with props off first.'] }),
  });
  return out;
}

const all = pictures();

describe('the render checks themselves', () => {
  it('see a stroke that leaves the viewBox, and two texts on top of each other', () => {
    const clipped = '<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="20mm" viewBox="0 0 20 20"><circle cx="10" cy="10" r="10" fill="none" stroke="#000" stroke-width="1"/></svg>';
    if (requireTool(commandAvailable('rsvg-convert'), 'rsvg-convert')) {
      const { drawn } = drawnExtent(clipped);
      expect(drawn!.x).toBeLessThan(-0.4);
      expect(drawn!.x + drawn!.w).toBeGreaterThan(20.4);
    }
    if (requireTool(commandAvailable('chromium'), 'chromium')) {
      const two = '<svg xmlns="http://www.w3.org/2000/svg" width="40mm" height="20mm" viewBox="0 0 40 20" font-family="sans-serif"><text x="2" y="10" font-size="4">one</text><text x="6" y="11" font-size="4">two</text><text x="2" y="18" font-size="4">three</text></svg>';
      const [b] = chromiumTextBoxes([two], { family: DRAWING_FONT });
      expect(overlappingTexts(b.texts).map(([x, y]) => `${x.text}/${y.text}`)).toEqual(['one/two']);
      // Our own width table (from the font file) agrees with chromium's layout of the same font.
      const three = b.texts.find((t) => t.text === 'three')!;
      // Within 3 %: chromium applies the font's kerning, the table holds advances only.
      expect(Math.abs(three.x1 - three.x0 - textWidthMm('three', 4)) / textWidthMm('three', 4)).toBeLessThan(0.03);
    }
  });
});

describe('pictures in real renderers', () => {
  it('rsvg-convert: everything drawn lies inside the viewBox (no clipped stroke or text)', () => {
    if (!requireTool(commandAvailable('rsvg-convert'), 'rsvg-convert')) return;
    for (const p of all) {
      const { drawn, viewBox } = drawnExtent(p.svg);
      expect(drawn, p.name).not.toBeNull();
      // One pixel of anti-aliasing.
      const px = ONE_PIXEL_MM;
      expect(drawn!.x, p.name).toBeGreaterThanOrEqual(viewBox.x - px);
      expect(drawn!.y, p.name).toBeGreaterThanOrEqual(viewBox.y - px);
      expect(drawn!.x + drawn!.w, p.name).toBeLessThanOrEqual(viewBox.x + viewBox.w + px);
      expect(drawn!.y + drawn!.h, p.name).toBeLessThanOrEqual(viewBox.y + viewBox.h + px);
      // The viewBox comes from the drawn extent: pictures in the shared frame keep only their 4 mm
      // margin round what is drawn (plus 1 mm for text the width table measures a little wider).
      if (!p.svg.includes('class="background"')) continue;
      const slack = [drawn!.x - viewBox.x, drawn!.y - viewBox.y, viewBox.x + viewBox.w - drawn!.x - drawn!.w, viewBox.y + viewBox.h - drawn!.y - drawn!.h];
      for (const s of slack) expect(s, `${p.name}: margin ${slack.map((v) => v.toFixed(2)).join(' ')}`).toBeLessThanOrEqual(5);
    }
  }, 240_000); // every picture of every demo design rendered: a minute on a loaded 2-core machine

  it('chromium: no two text boxes overlap, and every text lies inside its picture (default sans-serif and the wide drawing font)', () => {
    if (!requireTool(commandAvailable('chromium'), 'chromium')) return;
    const boxes = [...chromiumTextBoxes(all.map((p) => p.svg)), ...chromiumTextBoxes(all.map((p) => p.svg), { family: DRAWING_FONT })];
    boxes.forEach((b, k) => {
      const i = k % all.length;
      expect(b.texts.length, all[i].name).toBeGreaterThan(2);
      const clash = overlappingTexts(b.texts).map(([x, y]) => `"${x.text}" / "${y.text}"`);
      expect(clash, all[i].name).toEqual([]);
      for (const t of b.texts) {
        expect(t.x0, `${all[i].name}: ${t.text}`).toBeGreaterThanOrEqual(b.svg.x0 - 0.01);
        expect(t.x1, `${all[i].name}: ${t.text}`).toBeLessThanOrEqual(b.svg.x1 + 0.01);
        expect(t.y0, `${all[i].name}: ${t.text}`).toBeGreaterThanOrEqual(b.svg.y0 - 0.01);
        expect(t.y1, `${all[i].name}: ${t.text}`).toBeLessThanOrEqual(b.svg.y1 + 0.01);
      }
    });
  });

  it('the convention: generic font family only, a front arrow and a scale bar in every plan picture', () => {
    for (const p of all) {
      expect(p.svg, p.name).not.toMatch(/Helvetica|Arial|Verdana|Segoe/);
      expect(p.svg, p.name).toMatch(/font-family="sans-serif"/);
      if (/drawing sheet/.test(p.name)) continue; // drawing sheets carry a stated scale, a weave and a front arrow
      if (p.name === 'range chart') {
        // A chart of numbers against prop size: no front and no length scale, but a legend in every panel.
        expect(p.svg.match(/class="legend"/g)?.length, p.name).toBe(3);
        continue;
      }
      if (/front view/.test(p.name)) {
        // Looking at the front: no arrow, a note says so.
        expect(p.svg).toContain('the frame&apos;s front faces you'.replace('&apos;', "'"));
        expect(p.svg, p.name).toContain('class="scale-bar"');
        continue;
      }
      expect(p.svg, p.name).toContain('class="front-arrow"');
      expect(p.svg, p.name).toContain('class="scale-bar"');
      expect(p.svg, p.name).toContain('class="legend"');
    }
  });
});
