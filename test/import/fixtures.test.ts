import { describe, expect, it } from 'vitest';
import { checkOptions, checkParts } from '../../src/checks/index.js';
import { partArea, partCutLength, signedArea } from '../../src/geometry/index.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { fixturePath, importFixture } from './helpers.js';
import { join } from 'node:path';

type Truth = {
  polygons: Array<{
    area: number;
    length: number;
    bounds: [number, number, number, number];
    interiors: number;
    minHoleEdgeWeb: number | null;
    minHoleHoleWeb: number | null;
    minEdgeRatio: number | null;
    holes: Array<[number, number, number]>;
  }>;
};

/** Order by position rounded to 1 µm, so that equal coordinates with rounding noise sort alike. */
const byPosition = (a: number[], b: number[]): number => Math.round(a[0] * 1000) - Math.round(b[0] * 1000) || Math.round(a[1] * 1000) - Math.round(b[1] * 1000);

const TRUTH_SCRIPT = join(import.meta.dirname, 'shapely_truth.py');
const haveTools = pythonModuleAvailable('ezdxf') && pythonModuleAvailable('shapely');

/**
 * Each fixture was written by python3-ezdxf (make_fixtures.py); the ground truth comes from ezdxf's
 * own reading and flattening plus Shapely's polygon measures (shapely_truth.py). Tolerances of the
 * issue: 0.01 mm on lengths and webs, 0.01 % on areas and cut lengths.
 */
const CASES: Array<{ file: string; mmPerUnit: number; parts: number; what: string }> = [
  { file: 'line-arc-plate.dxf', mmPerUnit: 1, parts: 1, what: 'LINE + ARC outline, circles, a loose-entity slot' },
  { file: 'bulge-arm.dxf', mmPerUnit: 1, parts: 1, what: 'LWPOLYLINE with positive and negative bulges, bulge circles' },
  { file: 'bulge-arm-r12.dxf', mmPerUnit: 1, parts: 1, what: 'R12 POLYLINE/VERTEX/SEQEND with bulges' },
  { file: 'inch-plate.dxf', mmPerUnit: 25.4, parts: 1, what: '$INSUNITS 1 (inch)' },
  { file: 'blocks.dxf', mmPerUnit: 1, parts: 1, what: 'nested, rotated, scaled, mirrored and non-uniformly scaled blocks' },
  { file: 'splines.dxf', mmPerUnit: 1, parts: 2, what: 'cubic and rational splines, ellipse and elliptical arc' },
];

describe('imported fixtures against ezdxf + Shapely ground truth', () => {
  for (const c of CASES) {
    it(`${c.file}: ${c.what}`, () => {
      if (!requireTool(haveTools, 'python3-ezdxf + python3-shapely')) return;
      const r = importFixture(c.file);
      const truth = runPythonJson<Truth>(TRUTH_SCRIPT, { file: fixturePath(c.file), mmPerUnit: c.mmPerUnit });
      expect(r.parts).toHaveLength(c.parts);
      expect(truth.polygons).toHaveLength(c.parts);
      const report = checkParts(r.parts, checkOptions({ toolDiameterMm: 1 }));
      r.parts.forEach((p, i) => {
        const t = truth.polygons[i];
        // Orientation convention (src/geometry/types.ts): outline counter-clockwise, features clockwise.
        expect(signedArea(p.outline)).toBeGreaterThan(0);
        for (const f of p.features) expect(signedArea(f.loop)).toBeLessThan(0);
        // Shapely area and ring lengths of the flattened drawing: 0.01 %
        expect(Math.abs(partArea(p) - t.area) / t.area).toBeLessThan(1e-4);
        expect(Math.abs(partCutLength(p) - t.length) / t.length).toBeLessThan(1e-4);
        expect(p.features).toHaveLength(t.interiors);
        // Shapely bounds: 0.01 mm
        const m = report.parts[i];
        m.bboxMm.forEach((v, k) => expect(Math.abs(v - t.bounds[k])).toBeLessThan(0.01));
        // Round holes: centre and diameter within 0.01 mm of Shapely's ring centroid and radius.
        const holes = p.features
          .filter((f) => f.kind === 'hole')
          .map((f) => [f.centerMm![0], f.centerMm![1], f.diameterMm!])
          .sort(byPosition);
        const truthHoles = [...t.holes].sort(byPosition);
        expect(holes.length).toBe(truthHoles.length);
        holes.forEach((h, k) => h.forEach((v, j) => expect(Math.abs(v - truthHoles[k][j])).toBeLessThan(0.01)));
        // Webs (Shapely ring-to-ring distances) and edge ratios (centre to free edge / D) as the checks measure them.
        const near = (a: number | null, b: number | null, tol: number) => {
          expect(a === null).toBe(b === null);
          if (a !== null && b !== null) expect(Math.abs(a - b)).toBeLessThan(tol);
        };
        near(m.metrics.minHoleEdgeWebMm, t.minHoleEdgeWeb, 0.01);
        near(m.metrics.minHoleHoleWebMm, t.minHoleHoleWeb, 0.01);
        near(m.metrics.minEdgeRatio, t.minEdgeRatio, 0.005);
      });
    });
  }
});

describe('fixture facts that need no reference tool', () => {
  it('inch-plate: 3 × 1.5 in read as 76.2 × 38.1 mm, holes 0.133 in = 3.378 mm (international inch, 25.4 mm exactly)', () => {
    const r = importFixture('inch-plate.dxf');
    expect(r.units).toEqual({ unit: 'in', from: 'header' });
    const p = r.parts[0];
    const area = partArea(p);
    // 3 × 1.5 in with 0.25 in corner radii, minus four 0.0665 in holes, in mm² (exact formula)
    const exact = (3 * 1.5 - (4 - Math.PI) * 0.25 ** 2 - 4 * Math.PI * 0.0665 ** 2) * 25.4 ** 2;
    expect(area).toBeCloseTo(exact, 6);
    expect(p.features.every((f) => Math.abs(f.diameterMm! - 0.133 * 25.4) < 1e-9)).toBe(true);
  });

  it('--units overrides $INSUNITS: the inch plate read as mm is 25.4 times smaller and doubted', () => {
    const r = importFixture('inch-plate.dxf', { units: 'mm' });
    expect(r.units).toEqual({ unit: 'mm', from: 'option' });
    const doubt = r.findings.find((f) => f.rule === 'dxf-unit-doubt');
    expect(doubt?.message).toContain('--units in');
  });

  it('blocks: 16 round holes with the diameters the block scales give (1.5, 1, 0.8)', () => {
    const r = importFixture('blocks.dxf');
    const ds = r.parts[0].features.filter((f) => f.kind === 'hole').map((f) => Number(f.diameterMm!.toFixed(6))).sort((a, b) => a - b);
    // MOTOR: 4 × Ø3 on a 16 mm circle + Ø7 bore; NESTED adds Ø1.6 at scale 1.5; MOTOR at 0.8.
    expect(ds).toEqual([2.4, 2.4, 2.4, 2.4, 2.4, 3, 3, 3, 3, 4.5, 4.5, 4.5, 4.5, 5.6, 7, 10.5]);
    // The mirrored MOTOR keeps its holes on a 16 mm bolt circle about (−15, 10).
    const mirrored = r.parts[0].features.filter((f) => f.diameterMm === 3);
    for (const f of mirrored) expect(Math.hypot(f.centerMm![0] + 15, f.centerMm![1] - 10)).toBeCloseTo(8, 9);
    // The OVAL circle scaled 2 × 1 is an ellipse: fitted by arcs and flagged.
    expect(r.findings.some((f) => f.rule === 'dxf-curve-approximated' && f.message.includes('CIRCLE'))).toBe(true);
  });
});
