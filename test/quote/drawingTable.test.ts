import * as DxfParserModule from 'dxf-parser';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { drawingFonts } from '../../src/cli/fonts.js';
import { DXF_LAYERS, partToDxf } from '../../src/export/index.js';
import { drawingToPdf } from '../../src/export/pdfDrawing.js';
import { CAP_HEIGHT_EM, drawingSet, layoutDrawing, MIN_TEXT_MM, quoteParts } from '../../src/quote/index.js';
import { DEMO_FILES, demoFrame } from '../helpers/demo.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';
import { exampleShop } from './fixtures.js';
import { buildAssembly, hardwareList } from '../../src/assembly/index.js';

// dxf-parser's default export under NodeNext (library-notes.md)
type Vertex = { x: number; y: number; bulge?: number };
type Entity = { type: string; layer: string; center?: { x: number; y: number }; radius?: number; vertices?: Vertex[] };
const DxfParser = ((DxfParserModule as any).default ?? DxfParserModule) as new () => { parseSync(s: string): { entities: Entity[] } };

/** Extent of a closed polyline with bulges: vertices plus the axis extremes each bulged arc passes. */
function polylineExtent(vs: readonly Vertex[]): [number, number, number, number] {
  let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity];
  const take = (x: number, y: number): void => {
    x0 = Math.min(x0, x);
    y0 = Math.min(y0, y);
    x1 = Math.max(x1, x);
    y1 = Math.max(y1, y);
  };
  vs.forEach((v, i) => {
    take(v.x, v.y);
    const b = v.bulge ?? 0;
    if (Math.abs(b) < 1e-12) return;
    // DXF reference: bulge = tan(sweep / 4); the arc runs from this vertex to the next.
    const w = vs[(i + 1) % vs.length];
    const sweep = 4 * Math.atan(b);
    const chord = Math.hypot(w.x - v.x, w.y - v.y);
    const r = chord / (2 * Math.sin(Math.abs(sweep) / 2));
    const mx = (v.x + w.x) / 2;
    const my = (v.y + w.y) / 2;
    const h = r * Math.cos(sweep / 2); // centre offset from the chord midpoint, to the left for a positive bulge
    const ux = (w.x - v.x) / chord;
    const uy = (w.y - v.y) / chord;
    const cx = mx - uy * h * Math.sign(b);
    const cy = my + ux * h * Math.sign(b);
    const a0 = Math.atan2(v.y - cy, v.x - cx);
    for (let k = -4; k <= 4; k++) {
      const a = (k * Math.PI) / 2;
      const t = sweep > 0 ? (a - a0 + 8 * Math.PI) % (2 * Math.PI) : (a0 - a + 8 * Math.PI) % (2 * Math.PI);
      if (t > 1e-12 && t < Math.abs(sweep)) take(cx + r * Math.cos(a), cy + r * Math.sin(a));
    }
  });
  return [x0, y0, x1, y1];
}

const dir = mkdtempSync(join(tmpdir(), 'fw-drawing-table-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('the drawing against the DXF (pdftotext and dxf-parser)', () => {
  for (const file of DEMO_FILES) {
    it(`${file}: every hole in the hole table at its DXF centre and size (0.01 mm), every slot and window sized`, async () => {
      if (!requireTool(commandAvailable('pdftotext'), 'poppler-utils (pdftotext)')) return;
      const frame = demoFrame(file);
      const quote = quoteParts(frame.parts, { quantity: 1, shop: exampleShop(), toolDiameterMm: 3.175 });
      const list = hardwareList(buildAssembly(frame.design, frame), frame.design);
      const hardware = list.items;
      const set = drawingSet(frame.parts, quote, { design: frame.name, revision: frame.revision, date: null, checks: null, hardware: list });
      const sheets = layoutDrawing(set);
      // Readable in print: no text below ISO 3098's smallest lettering height (1.8 mm capitals).
      for (const s of sheets) for (const it of s.items) if (it.kind === 'text') expect(it.sizeMm * CAP_HEIGHT_EM).toBeGreaterThanOrEqual(1.8 - 1e-9);
      expect(MIN_TEXT_MM * CAP_HEIGHT_EM).toBeGreaterThanOrEqual(1.8 - 1e-9);
      const pdfPath = join(dir, `${file}.pdf`);
      writeFileSync(pdfPath, await drawingToPdf(set, sheets, { fonts: drawingFonts() }));
      // The font is embedded (pdffonts: "emb yes").
      const fonts = spawnSync('pdffonts', [pdfPath], { encoding: 'utf8' }).stdout;
      expect(fonts).toMatch(/DejaVuSans\s.*\byes\s+yes\s+yes/);
      expect(fonts).not.toMatch(/\bno\s+no\s+(yes|no)\s+\d+/);
      const pages = spawnSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' }).stdout.split('\f');
      // The hardware list: every line of the assembly's list, with its count per frame.
      const summary = pages.filter((p) => /part: summary/.test(p)).join('\n');
      for (const h of hardware) {
        const size = h.lengthMm === null ? '-' : h.lengthMm.toFixed(1);
        expect(summary, `${h.item} ${h.size} ${h.use}`).toMatch(new RegExp(`${h.standard}\\s+${h.size}\\s+${size.replace('.', '\\.')}\\s+${h.count}\\s+${h.count}\\s+${h.use}`));
      }
      for (const part of frame.parts) {
        const text = pages.filter((p) => new RegExp(`part: ${part.name}( \\(continued\\))?\\s`).test(p)).join('\n');
        expect(text.length, part.name).toBeGreaterThan(0);
        const holeRows = [...text.matchAll(/\b([A-Z]{1,2}\d+)\s+(-?\d+\.\d\d)\s+(-?\d+\.\d\d)\s+Ø(\d+\.\d\d)/g)].map((m) => ({ tag: m[1], x: Number(m[2]), y: Number(m[3]), d: Number(m[4]) }));
        const cutRows = [...text.matchAll(/\b([SW]\d+)\s+(-?\d+\.\d\d)\s+(-?\d+\.\d\d)\s+(\d+\.\d\d) x (\d+\.\d\d)/g)].map((m) => ({ tag: m[1], x: Number(m[2]), y: Number(m[3]), w: Number(m[4]), h: Number(m[5]) }));
        const dxf = new DxfParser().parseSync(partToDxf(part));
        const circles = dxf.entities.filter((e) => e.type === 'CIRCLE');
        const inner = dxf.entities.filter((e) => e.layer === DXF_LAYERS.inside.name && e.vertices);
        // One row per hole and per cut-out, each tag once.
        expect(holeRows.length, `${part.name} hole rows`).toBe(circles.length);
        expect(new Set(holeRows.map((r) => r.tag)).size).toBe(holeRows.length);
        expect(cutRows.length, `${part.name} slot and window rows`).toBe(inner.length);
        const unused = new Set(holeRows);
        for (const c of circles) {
          const row = [...unused].find((r) => Math.abs(r.x - c.center!.x) <= 0.01 && Math.abs(r.y - c.center!.y) <= 0.01 && Math.abs(r.d - 2 * c.radius!) <= 0.01);
          expect(row, `${part.name}: hole at (${c.center!.x}, ${c.center!.y}) Ø${2 * c.radius!}`).toBeDefined();
          unused.delete(row!);
        }
        const free = new Set(cutRows);
        for (const e of inner) {
          const [x0, y0, x1, y1] = polylineExtent(e.vertices!);
          const row = [...free].find(
            (r) => Math.abs(r.x - (x0 + x1) / 2) <= 0.01 && Math.abs(r.y - (y0 + y1) / 2) <= 0.01 && Math.abs(r.w - (x1 - x0)) <= 0.01 && Math.abs(r.h - (y1 - y0)) <= 0.01,
          );
          expect(row, `${part.name}: cut-out with extent ${x0}..${x1} × ${y0}..${y1}`).toBeDefined();
          free.delete(row!);
        }
        // Straight slots: the width on their size line equals the narrower side of an axis-aligned slot's extent.
        for (const m of text.matchAll(/slot (\d+\.\d\d) x (\d+\.\d\d), axis (\d+\.\d)°/g)) {
          const [len, w, axis] = [Number(m[1]), Number(m[2]), Number(m[3])];
          if (axis % 90 !== 0) continue;
          expect(cutRows.some((r) => Math.abs(Math.min(r.w, r.h) - w) <= 0.01 && Math.abs(Math.max(r.w, r.h) - len) <= 0.01)).toBe(true);
        }
      }
    });
  }
});
