import * as DxfParserModule from 'dxf-parser';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { checkOptions, checkParts } from '../../src/checks/index.js';
import { partToDxf } from '../../src/export/index.js';
import { buildFrame, partArea, relieveCorners, RELIEF_CLEARANCE_MM, type Arc } from '../../src/geometry/index.js';
import { circle } from '../../src/geometry/primitives.js';
import { flattenLoop } from '../../src/geometry/loop.js';
import { loopProblem } from '../../src/geometry/validate.js';
import { dist } from '../../src/geometry/vec.js';
import { validateDesign } from '../../src/params/index.js';
import { fine, rect, roundHole, testPart } from '../checks/parts.js';
import { designWith } from '../helpers/demo.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';

const DxfParser = ((DxfParserModule as any).default ?? DxfParserModule) as new () => { parseSync(s: string): { entities: Array<{ type: string; layer: string; shape?: boolean; vertices?: Array<{ x: number; y: number; bulge?: number }> }> } };
const TOOL = 3.175;
const R = TOOL / 2 + RELIEF_CLEARANCE_MM;
const o = checkOptions({ toolDiameterMm: TOOL });
const dir = mkdtempSync(join(tmpdir(), 'fw-relief-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const CORNERS = [[10, 10], [10, 16], [25, 10], [25, 16]] as const;
// A 15 × 6 slot with square corners: a tab 6 mm thick must seat in it.
const p = testPart(rect(0, 0, 40, 30), [{ shape: rect(10, 10, 25, 16), kind: 'slot' }]);

describe('corner reliefs (dogbone, T-bone)', () => {
  for (const style of ['dogbone', 'tbone'] as const) {
    it(`${style}: one relief per sharp corner, each disc through its corner, radius = tool radius + ${RELIEF_CLEARANCE_MM} mm; the re-check has no bit-reach findings`, () => {
      const r = relieveCorners(p, TOOL, style);
      expect(r.added).toBe(4);
      expect(r.skipped).toBe(0);
      const loop = r.part.features[0].loop;
      expect(loopProblem(loop)).toBeNull();
      const arcs = loop.filter((s): s is Arc => s.kind === 'arc');
      expect(arcs.length).toBe(4);
      for (const a of arcs) expect(a.radius).toBeCloseTo(R, 12);
      for (const c of CORNERS) expect(arcs.some((a) => Math.abs(dist(a.center, c) - a.radius) < 1e-9)).toBe(true);
      expect(checkParts([r.part], o).findings.filter((f) => f.rule === 'bit-reach')).toEqual([]);
    });
  }

  it('T-bone: on a slot wide enough for two, the reliefs sit on the short sides and run along the long ones, so the long walls stay straight', () => {
    // 15 × 8: each short side holds two reliefs of 2R = 3.375 mm.
    const wide = testPart(rect(0, 0, 40, 30), [{ shape: rect(10, 10, 25, 18), kind: 'slot' }]);
    const loop = relieveCorners(wide, TOOL, 'tbone').part.features[0].loop;
    const arcs = loop.filter((s): s is Arc => s.kind === 'arc');
    expect(arcs.length).toBe(4);
    for (const a of arcs) {
      // Centres on the short sides x = 10 and x = 25, one radius from the corner along them.
      expect(Math.min(Math.abs(a.center[0] - 10), Math.abs(a.center[0] - 25))).toBeLessThan(1e-9);
      expect(Math.min(Math.abs(a.center[1] - (10 + R)), Math.abs(a.center[1] - (18 - R)))).toBeLessThan(1e-9);
      expect(Math.abs(a.sweepRad)).toBeCloseTo(Math.PI, 12);
    }
    // The long walls y = 10 and y = 18 keep their full length between x = 10 and 25.
    const walls = loop.filter((s) => s.kind === 'line' && Math.abs(s.start[1] - s.end[1]) < 1e-12);
    expect(walls.map((w) => (w.kind === 'line' ? Math.abs(w.end[0] - w.start[0]) : 0))).toEqual([15, 15]);
  });

  it('T-bone: on a slot narrower than two reliefs (6 mm < 2 × 3.375 mm) they move to the long sides', () => {
    const arcs = relieveCorners(p, TOOL, 'tbone').part.features[0].loop.filter((s): s is Arc => s.kind === 'arc');
    expect(arcs.length).toBe(4);
    for (const a of arcs) expect(Math.min(Math.abs(a.center[1] - 10), Math.abs(a.center[1] - 16))).toBeLessThan(1e-9);
  });

  const hasShapely = requireTool(pythonModuleAvailable('shapely'), 'python3-shapely');
  it.runIf(hasShapely)('relieved area equals Shapely’s union of the slot and the relief discs (both styles)', () => {
    const s = R / Math.SQRT2;
    const centres = {
      dogbone: [[10 + s, 10 + s], [10 + s, 16 - s], [25 - s, 10 + s], [25 - s, 16 - s]],
      // On the long sides: the 6 mm short sides cannot hold two reliefs each.
      tbone: [[10 + R, 10], [10 + R, 16], [25 - R, 10], [25 - R, 16]],
    } as const;
    for (const style of ['dogbone', 'tbone'] as const) {
      const q = relieveCorners(p, TOOL, style).part;
      const voidArea = -(partArea(q) - partArea(testPart(rect(0, 0, 40, 30), [])));
      const ref = runPythonJson<{ unionArea: number }>(join(import.meta.dirname, '..', 'reference', 'shapely_polygons.py'), {
        polygons: [],
        union: [fine(rect(10, 10, 25, 16)), ...centres[style].map((c) => flattenLoop(circle(c, R), 1e-6))],
      });
      expect(Math.abs(voidArea - ref.unionArea), style).toBeLessThan(1e-3);
    }
  });

  it('leaves round holes and outlines alone; a bad tool is a RangeError', () => {
    const round = testPart(rect(0, 0, 40, 30), [roundHole([20, 15], 5)]);
    expect(relieveCorners(round, TOOL).part).toBe(round);
    expect(() => relieveCorners(round, 0)).toThrow(RangeError);
  });

  const hasEzdxf = requireTool(pythonModuleAvailable('ezdxf') && pythonModuleAvailable('shapely'), 'python3-ezdxf, python3-shapely');
  it.runIf(hasEzdxf)('the DXF with reliefs: ezdxf audit clean, dxf-parser reads closed contours, every corner in reach of the tool (and not without the reliefs)', () => {
    for (const style of ['none', 'dogbone', 'tbone'] as const) {
      for (const version of ['R12', 'R2000'] as const) {
        const part = style === 'none' ? p : relieveCorners(p, TOOL, style).part;
        const text = partToDxf(part, { version });
        const parsed = new DxfParser().parseSync(text);
        expect(parsed.entities.filter((e) => e.layer === 'CUT_INSIDE').every((e) => e.shape === true)).toBe(true);
        const path = join(dir, `${style}-${version}.dxf`);
        writeFileSync(path, text);
        const r = runPythonJson<{ errors: number; innerContours: number; minArcRadius: number | null; reached: boolean[]; gap: number[] }>(
          join(import.meta.dirname, '..', 'reference', 'ezdxf_relief.py'),
          { path, toolRadius: TOOL / 2, corners: CORNERS },
        );
        expect(r.errors).toBe(0);
        expect(r.innerContours).toBe(1);
        if (style === 'none') {
          // Square corners: a round tool leaves R(√2 − 1) ≈ 0.66 mm of material on each bisector.
          expect(r.reached).toEqual([false, false, false, false]);
          for (const g of r.gap) expect(g).toBeCloseTo((TOOL / 2) * (Math.SQRT2 - 1), 2);
        } else {
          expect(r.reached, style).toEqual([true, true, true, true]);
          expect(r.minArcRadius!).toBeGreaterThanOrEqual(TOOL / 2);
        }
      }
    }
  });

  it('a design asks for reliefs per part: a square lightening window in the top plate gets T-bones, the cut files carry them', () => {
    const win = { atMm: [0, 0], lengthMm: 16, widthMm: 8, cornerRadiusMm: 0 };
    const plain = buildFrame(validateDesign(designWith('tessel-5.yaml', { topPlate: { lightening: [win] } })));
    const relieved = buildFrame(validateDesign(designWith('tessel-5.yaml', { topPlate: { lightening: [win], cornerRelief: 'tbone' } })));
    const arcsOf = (f: typeof plain) => f.parts.find((x) => x.role === 'top')!.features.find((x) => x.purpose === 'lightening')!.loop.filter((s) => s.kind === 'arc').length;
    expect(arcsOf(plain)).toBe(0);
    expect(arcsOf(relieved)).toBe(4);
    // The other parts are untouched (the option is per part), and the global default relieves every part.
    expect(relieved.parts.find((x) => x.role === 'bottom')).toEqual(plain.parts.find((x) => x.role === 'bottom'));
    const all = buildFrame(validateDesign(designWith('tessel-5.yaml', { topPlate: { lightening: [win] }, cutting: { cornerRelief: 'dogbone' } })));
    expect(arcsOf(all)).toBe(4);
  });
});
