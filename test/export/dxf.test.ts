import * as DxfParserModule from 'dxf-parser';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { partToDxf, DXF_LAYERS } from '../../src/export/index.js';
import { asCircle } from '../../src/geometry/index.js';
import { DEMO_FILES, demoFrame } from '../helpers/demo.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';

// dxf-parser's default export under NodeNext (library-notes.md)
type ParsedDxf = { header: Record<string, unknown>; tables: { layer: { layers: Record<string, unknown> } }; entities: Array<Record<string, any>> };
const DxfParser = ((DxfParserModule as any).default ?? DxfParserModule) as new () => { parseSync(s: string): ParsedDxf };

const parts = DEMO_FILES.flatMap((f) => demoFrame(f).parts.map((p) => ({ file: f, part: p })));

describe('DXF read back by the independent npm dxf-parser', () => {
  for (const version of ['R12', 'R2000'] as const) {
    for (const { file, part } of parts) {
      it(`${version} ${file} ${part.name}: units, layers, closed contours, holes as designed`, () => {
        const parsed = new DxfParser().parseSync(partToDxf(part, { version }));
        // DXF reference: $INSUNITS 4 = millimetres
        expect(parsed.header.$INSUNITS).toBe(4);
        const layerNames = Object.keys(parsed.tables.layer.layers);
        for (const l of Object.values(DXF_LAYERS)) expect(layerNames).toContain(l.name);
        const cut = parsed.entities.filter((e) => e.layer !== DXF_LAYERS.label.name);
        const kinds = new Set(cut.map((e) => e.type));
        expect([...kinds].every((k) => ['CIRCLE', 'POLYLINE', 'LWPOLYLINE'].includes(k))).toBe(true);
        // one entity per contour; every polyline closed (flag bit 1 as read by the parser: `shape`)
        expect(cut).toHaveLength(1 + part.features.length);
        for (const e of cut.filter((x) => x.type !== 'CIRCLE')) expect(e.shape).toBe(true);
        const outside = cut.filter((e) => e.layer === DXF_LAYERS.outside.name);
        expect(outside).toHaveLength(1);
        const designed = part.features.filter((f) => asCircle(f.loop)).map((f) => 2 * asCircle(f.loop)!.radius).sort((a, b) => a - b);
        const read = cut.filter((e) => e.type === 'CIRCLE').map((e) => 2 * e.radius).sort((a: number, b: number) => a - b);
        expect(read).toHaveLength(designed.length);
        read.forEach((d: number, i: number) => expect(d).toBeCloseTo(designed[i], 6));
        expect(cut.filter((e) => e.type === 'CIRCLE').every((e) => e.layer === DXF_LAYERS.holes.name)).toBe(true);
        const labels = parsed.entities.filter((e) => e.layer === DXF_LAYERS.label.name);
        expect(labels.map((e) => e.text)).toEqual([part.name]);
      });
    }
  }

  it('bulges reproduce the arcs: a 90° corner arc has bulge tan(22.5°) = 0.414213562', () => {
    // DXF reference: bulge = tan(θ/4)
    const top = demoFrame('tessel-5.yaml').parts.find((p) => p.name === 'top-plate')!;
    const parsed = new DxfParser().parseSync(partToDxf(top));
    const outline = parsed.entities.find((e) => e.layer === DXF_LAYERS.outside.name)!;
    const bulges = outline.vertices.map((v: { bulge?: number }) => v.bulge ?? 0).filter((b: number) => b !== 0);
    expect(bulges).toHaveLength(4);
    for (const b of bulges) expect(b).toBeCloseTo(0.414213562, 8);
  });

  it('loose LINE/ARC entities are an option', () => {
    const arm = demoFrame('tessel-5.yaml').parts.find((p) => p.role === 'arm')!;
    const parsed = new DxfParser().parseSync(partToDxf(arm, { contours: 'entities' }));
    const kinds = new Set(parsed.entities.map((e) => e.type));
    expect(kinds.has('ARC')).toBe(true);
    expect(kinds.has('LINE')).toBe(true);
    expect(kinds.has('POLYLINE')).toBe(false);
  });
});

describe('DXF audited by Debian python3-ezdxf', () => {
  it('every demo part, R12 and R2000, loads with zero audit errors', () => {
    if (!requireTool(pythonModuleAvailable('ezdxf'), 'python3-ezdxf')) return;
    const dir = mkdtempSync(join(tmpdir(), 'fw-dxf-'));
    const files: string[] = [];
    for (const { file, part } of parts) {
      for (const version of ['R12', 'R2000'] as const) {
        const path = join(dir, `${file}-${part.name}-${version}.dxf`);
        writeFileSync(path, partToDxf(part, { version }));
        files.push(path);
      }
    }
    const res = runPythonJson<Array<{ path: string; version: string; insunits: number; errors: number; openPolylines: number; layers: string[] }>>(
      'test/reference/ezdxf_audit.py',
      null,
      files,
    );
    expect(res).toHaveLength(files.length);
    for (const r of res) {
      expect(r.errors, r.path).toBe(0);
      expect(r.insunits).toBe(4);
      expect(r.openPolylines).toBe(0);
      expect(['AC1009', 'AC1015']).toContain(r.version);
      expect(r.layers).toContain(DXF_LAYERS.outside.name);
    }
  });
});

describe('determinism regression: R2000 files written one after another in one process', () => {
  it('are byte-identical (the writer package numbers handles from one counter shared by every drawing; found by the design fuzz test)', () => {
    const part = demoFrame('tessel-5.yaml').parts[0];
    const first = partToDxf(part, { version: 'R2000' });
    partToDxf(demoFrame('mote-3.yaml').parts[0], { version: 'R2000' });
    expect(partToDxf(part, { version: 'R2000' })).toBe(first);
  });
});
