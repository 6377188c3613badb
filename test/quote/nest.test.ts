import { describe, expect, it } from 'vitest';
import { flattenLoop, partArea, transformPoint, type Part } from '../../src/geometry/index.js';
import { DesignError } from '../../src/params/errors.js';
import { allowedRotations, nestParts, type NestResult } from '../../src/quote/index.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { demoFrame, plate, polygon, roundedRect, roundHole } from './fixtures.js';
import { buildFrame } from '../../src/geometry/index.js';
import { validateDesign } from '../../src/params/index.js';
import { designWith } from '../helpers/demo.js';

const SPACING = 3.175 + 2; // tool diameter + 2 mm (domain.md: spacing ≥ tool diameter + 1–3 mm, common practice)
const MARGIN = 10;

type Check = { minGap: number | null; overlaps: number; outside: number; minEdge: number | null; parts: number };

/** Hand the placed outlines to Shapely (GEOS), an independent polygon library. */
function shapelyCheck(items: readonly Part[], r: NestResult): Check {
  const sheets = r.sheets.map((sh) => ({
    width: sh.widthMm,
    height: sh.heightMm,
    parts: sh.placements.map((pl) => flattenLoop(items[pl.item].outline, 0.002).map((p) => transformPoint(p, pl.transform))),
  }));
  return runPythonJson<Check>('test/quote/shapely_nest.py', { spacing: SPACING, margin: MARGIN, sheets });
}

const haveShapely = requireTool(pythonModuleAvailable('shapely'), 'python3-shapely');

describe('nesting', () => {
  // An L-shaped plate whose weave runs at 30° in part coordinates, and a plain rounded plate.
  const L = plate('ell', polygon([[0, 0], [80, 0], [80, 20], [20, 20], [20, 60], [0, 60]]), [roundHole([10, 10], 3.4)], 2, Math.PI / 6);
  const R = plate('tab', roundedRect([0, 0], 50, 30, 4), [roundHole([0, 0], 6)], 2);
  const T = plate('thick', roundedRect([0, 0], 70, 20, 4), [], 4);
  const items = [L, R, T];
  const counts = [9, 14, 5];
  const result = nestParts(items.map((part, i) => ({ part, count: counts[i] })), { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: SPACING, marginMm: MARGIN });

  it('places every part, and keeps thicknesses on separate sheets', () => {
    const placed = [0, 0, 0];
    for (const sh of result.sheets) {
      for (const pl of sh.placements) {
        placed[pl.item]++;
        expect(items[pl.item].thicknessMm).toBe(sh.thicknessMm);
      }
    }
    expect(placed).toEqual(counts);
    expect(new Set(result.sheets.map((s) => s.thicknessMm))).toEqual(new Set([2, 4]));
  });

  it('turns parts only so their weave stays on the sheet axes (multiples of 90° from the weave)', () => {
    for (const sh of result.sheets) {
      for (const pl of sh.placements) {
        const sheetWeave = items[pl.item].weaveRad + pl.transform.rotateRad;
        const k = sheetWeave / (Math.PI / 2);
        expect(Math.abs(k - Math.round(k))).toBeLessThan(1e-9);
        expect(pl.transform.mirrorY ?? false).toBe(false);
      }
    }
    expect(allowedRotations(L).map((r) => Math.round(((r * 180) / Math.PI) * 1e6) / 1e6)).toEqual([-30, 60, 150, 240]);
  });

  it.skipIf(!haveShapely)('no overlap, no two parts closer than the spacing, all inside the margins (Shapely)', () => {
    const c = shapelyCheck(items, result);
    expect(c.parts).toBe(28);
    expect(c.overlaps).toBe(0);
    expect(c.outside).toBe(0);
    expect(c.minGap).not.toBeNull();
    expect(c.minGap!).toBeGreaterThanOrEqual(SPACING - 1e-6);
    // The raster is conservative by at most a cell diagonal plus chord tolerances: parts do get close.
    expect(c.minGap!).toBeLessThan(SPACING + 2);
    expect(c.minEdge!).toBeGreaterThanOrEqual(MARGIN - 1e-6);
  });

  it.skipIf(!haveShapely)('three Tessel 5 frames on 400 × 300 sheets pass the same independent checks', () => {
    const parts = demoFrame('tessel-5').parts;
    const r = nestParts(parts.map((part) => ({ part, count: part.quantity * 3 })), { sheet: { widthMm: 400, heightMm: 300 }, spacingMm: SPACING, marginMm: MARGIN });
    const c = shapelyCheck(parts, r);
    expect(c.parts).toBe(parts.reduce((a, p) => a + p.quantity * 3, 0));
    expect(c.overlaps).toBe(0);
    expect(c.outside).toBe(0);
    expect(c.minGap!).toBeGreaterThanOrEqual(SPACING - 1e-6);
    expect(c.minEdge!).toBeGreaterThanOrEqual(MARGIN - 1e-6);
    // Utilisation is part area over sheet area, and never beats the area bound.
    for (const g of r.groups) {
      expect(g.sheets).toBeGreaterThanOrEqual(Math.ceil(g.areaBoundSheets - 1e-9));
      expect(g.utilisation).toBeCloseTo(g.partAreaMm2 / (g.sheets * 400 * 300), 12);
    }
    const area = parts.reduce((a, p) => a + partArea(p) * p.quantity * 3, 0);
    expect(r.sheets.reduce((a, s) => a + s.partAreaMm2, 0)).toBeCloseTo(area, 6);
  });

  it.skipIf(!haveShapely)('true shape: thin L plates nest into each other, more than their bounding boxes allow', () => {
    // L of 100 × 100 mm with 15 mm legs. Were each copy to take its bounding box grown by the spacing,
    // a 250 × 250 sheet (usable grid 235.2 × 235.2 mm) could hold at most 235.2² / 105.2² = 5.0 copies.
    const ell = plate('ell', polygon([[0, 0], [100, 0], [100, 15], [15, 15], [15, 100], [0, 100]]), [], 2);
    const r = nestParts([{ part: ell, count: 12 }], { sheet: { widthMm: 250, heightMm: 250 }, spacingMm: SPACING, marginMm: MARGIN });
    const boxBound = (250 - 2 * MARGIN + SPACING) ** 2 / (100 + SPACING) ** 2;
    expect(boxBound).toBeCloseTo(4.998, 2);
    expect(r.sheets[0].placements.length).toBeGreaterThan(boxBound);
    const c = shapelyCheck([ell], r);
    expect(c.overlaps).toBe(0);
    expect(c.minGap!).toBeGreaterThanOrEqual(SPACING - 1e-6);
    expect(c.outside).toBe(0);
  });

  it.skipIf(!haveShapely)('the finer raster pass keeps a layout only when it saves a sheet, and it passes the same checks', () => {
    // 54 Tessel 5 arms as first drawn (224 mm wheelbase, root edge margin 5.5 mm, tip pad margin
    // 3.5 mm): on the 0.5 mm raster 26 fit a 400 × 300 sheet (3 sheets), on the 0.25 mm one 27 (2 sheets).
    const arm = buildFrame(validateDesign(designWith('tessel-5.yaml', { layout: { kind: 'x', wheelbaseMm: 224, armAngleDeg: 45 }, arms: { root: { edgeMarginMm: 5.5 }, tipPadMarginMm: 3.5 } }))).parts.find((p) => p.name === 'arm')!;
    const coarse = nestParts([{ part: arm, count: 54 }], { sheet: { widthMm: 400, heightMm: 300 }, spacingMm: SPACING, marginMm: MARGIN, refine: false });
    const r = nestParts([{ part: arm, count: 54 }], { sheet: { widthMm: 400, heightMm: 300 }, spacingMm: SPACING, marginMm: MARGIN });
    expect(r.sheets.length).toBeLessThanOrEqual(coarse.sheets.length);
    if (r.sheets.length < coarse.sheets.length) expect(r.groups[0].cellMm).toBe(0.25);
    // Pins the current arm outline (1892 mm²; 54 copies are 0.85 sheet by area): update if the arm changes.
    expect(r.sheets.length).toBe(2);
    const c = shapelyCheck([arm], r);
    expect(c.parts).toBe(54);
    expect(c.overlaps).toBe(0);
    expect(c.outside).toBe(0);
    expect(c.minGap!).toBeGreaterThanOrEqual(SPACING - 1e-6);
  });

  it.skipIf(!haveShapely)('80 Farline 7 arms (6 mm) fit 4 sheets of 400 × 300, one fewer than before the upright-first rule, and pass the same checks', () => {
    // 20 frames × 4 arms. Before: 19 a sheet at best (5 sheets). A band of arms across the sheet and
    // the strip above it filled the other way (on the 0.25 mm raster) holds 20 (4 sheets).
    const arm = demoFrame('farline-7').parts.find((p) => p.name === 'arm')!;
    expect(arm.thicknessMm).toBe(6);
    const r = nestParts([{ part: arm, count: 80 }], { sheet: { widthMm: 400, heightMm: 300 }, spacingMm: SPACING, marginMm: MARGIN });
    expect(r.sheets.length).toBeLessThanOrEqual(4);
    expect(r.sheets.length).toBeGreaterThanOrEqual(Math.ceil(r.groups[0].areaBoundSheets - 1e-9));
    const c = shapelyCheck([arm], r);
    expect(c.parts).toBe(80);
    expect(c.overlaps).toBe(0);
    expect(c.outside).toBe(0);
    expect(c.minGap!).toBeGreaterThanOrEqual(SPACING - 1e-6);
    expect(c.minEdge!).toBeGreaterThanOrEqual(MARGIN - 1e-6);
    for (const sh of r.sheets) {
      for (const pl of sh.placements) {
        const k = (arm.weaveRad + pl.transform.rotateRad) / (Math.PI / 2);
        expect(Math.abs(k - Math.round(k))).toBeLessThan(1e-9);
        expect(pl.transform.mirrorY ?? false).toBe(false);
      }
    }
  });

  it('a part larger than the sheet is a clear input error naming the sheet', () => {
    const big = plate('big', roundedRect([0, 0], 390, 100, 4), [], 2);
    expect(() => nestParts([{ part: big, count: 1 }], { sheet: { widthMm: 400, heightMm: 300 }, spacingMm: SPACING, marginMm: MARGIN })).toThrow(DesignError);
    try {
      nestParts([{ part: big, count: 1 }], { sheet: { widthMm: 400, heightMm: 300 }, spacingMm: SPACING, marginMm: MARGIN });
    } catch (e) {
      expect((e as DesignError).issues[0].path).toBe('sheet');
      expect((e as DesignError).message).toMatch(/too small for part big/);
    }
  });

  it.skipIf(!haveShapely)('seeded random star plates, random weave angles, two thicknesses: the same independent checks', () => {
    let seed = 4242;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const parts: Part[] = [];
    for (let k = 0; k < 7; k++) {
      const n = 5 + Math.floor(rnd() * 6);
      const pts: Array<[number, number]> = [];
      for (let i = 0; i < n; i++) {
        const a = (2 * Math.PI * (i + 0.3 * rnd())) / n;
        const rr = 12 + 30 * rnd();
        pts.push([rr * Math.cos(a), rr * Math.sin(a)]);
      }
      parts.push(plate(`star${k}`, polygon(pts), [], k % 2 ? 2 : 3, (rnd() - 0.5) * Math.PI));
    }
    const counts = parts.map(() => 2 + Math.floor(rnd() * 5));
    const r = nestParts(parts.map((part, i) => ({ part, count: counts[i] })), { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: SPACING, marginMm: MARGIN });
    const c = shapelyCheck(parts, r);
    expect(c.parts).toBe(counts.reduce((a, b) => a + b, 0));
    expect(c.overlaps).toBe(0);
    expect(c.outside).toBe(0);
    expect(c.minGap!).toBeGreaterThanOrEqual(SPACING - 1e-6);
    for (const sh of r.sheets) {
      for (const pl of sh.placements) {
        const k = (parts[pl.item].weaveRad + pl.transform.rotateRad) / (Math.PI / 2);
        expect(Math.abs(k - Math.round(k))).toBeLessThan(1e-9);
        expect(parts[pl.item].thicknessMm).toBe(sh.thicknessMm);
      }
    }
  });

  it('is deterministic', () => {
    const again = nestParts(items.map((part, i) => ({ part, count: counts[i] })), { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: SPACING, marginMm: MARGIN });
    expect(JSON.stringify(again)).toBe(JSON.stringify(result));
  });
});
