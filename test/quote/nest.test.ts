import { describe, expect, it } from 'vitest';
import { areaPaths, FillRule, Minkowski, union, xor, type Path64 } from 'clipper2-ts';
import { convexHull, flattenLoop, partArea, transformLoop, transformPoint, type Loop, type Part } from '../../src/geometry/index.js';
import { DesignError } from '../../src/params/errors.js';
import { allowedRotations, nestParts, type NestResult } from '../../src/quote/index.js';
import { convexPieces, convolution, dilatedShape, dropCollinear, ringArea2, noFitPolygon, occupiedAreaMm2, quarterTurn } from '../../src/quote/nestShapes.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { demoFrame, plate, polygon, roundedRect, roundHole, cutout } from './fixtures.js';

const SPACING = 3.175 + 2; // tool diameter + 2 mm (domain.md: spacing ≥ tool diameter + 1–3 mm, common practice)
const MARGIN = 10;
const SHEET = { widthMm: 400, heightMm: 300 };

type Check = { minGap: number | null; overlaps: number; outside: number; minEdge: number | null; parts: number; inWindows: number };

/** Hand the placed parts to Shapely (GEOS), an independent polygon library: outlines, and holes where windows matter. */
function shapelyCheck(items: readonly Part[], r: NestResult, spacing = SPACING, withHoles = false): Check {
  const poly = (l: Loop, t: Parameters<typeof transformPoint>[1]) => flattenLoop(transformLoop(l, t), 0.002);
  const sheets = r.sheets.map((sh) => ({
    width: sh.widthMm,
    height: sh.heightMm,
    parts: sh.placements.map((pl) => {
      const p = items[pl.item];
      return withHoles ? { shell: poly(p.outline, pl.transform), holes: p.features.map((f) => poly(f.loop, pl.transform)) } : poly(p.outline, pl.transform);
    }),
  }));
  return runPythonJson<Check>('test/quote/shapely_nest.py', { spacing, margin: MARGIN, sheets });
}

/** The independent checks every layout must pass: all parts placed, no overlap, spacing and margins kept. */
function expectValid(c: Check, parts: number, spacing = SPACING): void {
  expect(c.parts).toBe(parts);
  expect(c.overlaps).toBe(0);
  expect(c.outside).toBe(0);
  expect(c.minGap!).toBeGreaterThanOrEqual(spacing - 1e-6);
  expect(c.minEdge!).toBeGreaterThanOrEqual(MARGIN - 1e-6);
}

const expectWeaveAligned = (parts: readonly Part[], r: NestResult) => {
  for (const sh of r.sheets) {
    for (const pl of sh.placements) {
      const k = (parts[pl.item].weaveRad + pl.transform.rotateRad) / (Math.PI / 2);
      expect(Math.abs(k - Math.round(k))).toBeLessThan(1e-9);
      expect(pl.transform.mirrorY ?? false).toBe(false);
      expect(parts[pl.item].thicknessMm).toBe(sh.thicknessMm);
    }
  }
};

const haveShapely = requireTool(pythonModuleAvailable('shapely'), 'python3-shapely');
const haveNest2d = requireTool(pythonModuleAvailable('pynest2d'), 'python3-pynest2d');

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
    for (const sh of result.sheets) for (const pl of sh.placements) placed[pl.item]++;
    expect(placed).toEqual(counts);
    expect(new Set(result.sheets.map((s) => s.thicknessMm))).toEqual(new Set([2, 4]));
  });

  it('turns parts only so their weave stays on the sheet axes (multiples of 90° from the weave)', () => {
    expectWeaveAligned(items, result);
    expect(allowedRotations(L).map((r) => Math.round(((r * 180) / Math.PI) * 1e6) / 1e6)).toEqual([-30, 60, 150, 240]);
    expect(allowedRotations(L, [0, 180]).map((r) => Math.round(((r * 180) / Math.PI) * 1e6) / 1e6)).toEqual([-30, 150]);
  });

  it.skipIf(!haveShapely)('no overlap, no two parts closer than the spacing, all inside the margins (Shapely)', () => {
    expectValid(shapelyCheck(items, result), 28);
  });

  it.skipIf(!haveShapely)('spacing is kept exactly, not padded: the closest parts are the spacing apart to within 0.03 mm', () => {
    // The grown shapes stand for arcs within 0.01 mm each and add 0.001 mm for integer rounding
    // (nestShapes.ts), so two touching parts are at most 2 × 0.011 mm further apart than asked.
    const c = shapelyCheck(items, result);
    expect(c.minGap!).toBeLessThan(SPACING + 0.03);
    for (const g of result.groups) {
      expect(g.minGapMm!).toBeGreaterThanOrEqual(SPACING);
      expect(g.minGapMm!).toBeLessThan(SPACING + 0.03);
    }
  });

  it('packs to the exact spacing: 7 columns of 35.7 mm plates with 5 mm gaps use 279.9 of the 280 mm inside the margins', () => {
    // Worked by hand: usable 300 − 2 × 10 = 280 mm wide, 200 − 2 × 10 = 180 mm high.
    // 7 × 35.7 + 6 × 5 = 279.9 ≤ 280 (0.1 mm to spare); 5 × 31.9 + 4 × 5 = 179.5 ≤ 180: 35 plates.
    // No layout holds more: each plate grown by 2.5 mm covers 40.7 × 36.9 = 1501.8 mm² of the 285 × 185
    // = 52725 mm² usable area grown by 2.5 mm, 35.1 plates. Padding each gap by 0.225 mm (the old raster)
    // would already lose the seventh column (7 × 35.7 + 6 × 5.45 = 282.6 > 280).
    const sq = plate('block', polygon([[0, 0], [35.7, 0], [35.7, 31.9], [0, 31.9]]), [], 2);
    const r = nestParts([{ part: sq, count: 40 }], { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: 5, marginMm: MARGIN });
    expect(r.sheets[0].placements.length).toBe(35);
    expect(r.sheets.length).toBe(2);
    expect(r.groups[0].minGapMm!).toBeGreaterThanOrEqual(5);
    expect(r.groups[0].minGapMm!).toBeLessThan(5.003);
  });

  it.skipIf(!haveShapely)('small parts go into the windows of a large one (Shapely: inside the window, the spacing from its edge)', () => {
    // A 180 × 180 frame with a 130 × 130 window on a 220 × 220 sheet (usable 200 × 200): nothing fits
    // beside the frame (200 − 180 = 20 mm < 5.175 mm spacing + 20 mm tab), so every 20 × 20 tab must go in
    // the window: 130 − 2 × 5.175 = 119.65 mm inside it, floor((119.65 + 5.175) / 25.175) = 4 across,
    // 16 tabs. Without windows the 16 tabs would need a second sheet.
    const frame = plate('frame', roundedRect([0, 0], 180, 180, 6), [cutout(roundedRect([0, 0], 130, 130, 4))], 2);
    const tab = plate('tab', roundedRect([0, 0], 20, 20, 2), [], 2);
    const r = nestParts([{ part: frame, count: 1 }, { part: tab, count: 16 }], { sheet: { widthMm: 220, heightMm: 220 }, spacingMm: SPACING, marginMm: MARGIN });
    expect(r.sheets.length).toBe(1);
    const c = shapelyCheck([frame, tab], r, SPACING, true);
    expectValid(c, 17);
    expect(c.inWindows).toBe(16);
  });

  it.skipIf(!haveShapely)('three Tessel 5 frames on 400 × 300 sheets pass the same independent checks', () => {
    const parts = demoFrame('tessel-5').parts;
    const r = nestParts(parts.map((part) => ({ part, count: part.quantity * 3 })), { sheet: SHEET, spacingMm: SPACING, marginMm: MARGIN });
    expectValid(shapelyCheck(parts, r), parts.reduce((a, p) => a + p.quantity * 3, 0));
    expectWeaveAligned(parts, r);
    for (const g of r.groups) {
      expect(g.sheets).toBeGreaterThanOrEqual(g.lowerBoundSheets);
      expect(g.utilisation).toBeCloseTo(g.partAreaMm2 / (g.sheets * 400 * 300), 12);
    }
    const area = parts.reduce((a, p) => a + partArea(p) * p.quantity * 3, 0);
    expect(r.sheets.reduce((a, s) => a + s.partAreaMm2, 0)).toBeCloseTo(area, 6);
  });

  it.skipIf(!haveShapely)('true shape: thin L plates nest into each other, more than their bounding boxes allow', () => {
    // L of 100 × 100 mm with 15 mm legs. Were each copy to take its bounding box grown by the spacing,
    // a 250 × 250 sheet (usable area grown by half the spacing: 235.175 mm square) could hold at most
    // 235.175² / 105.175² = 5.0 copies.
    const ell = plate('ell', polygon([[0, 0], [100, 0], [100, 15], [15, 15], [15, 100], [0, 100]]), [], 2);
    const r = nestParts([{ part: ell, count: 12 }], { sheet: { widthMm: 250, heightMm: 250 }, spacingMm: SPACING, marginMm: MARGIN });
    const boxBound = (250 - 2 * MARGIN + SPACING) ** 2 / (100 + SPACING) ** 2;
    expect(boxBound).toBeCloseTo(5.0, 1);
    expect(r.sheets[0].placements.length).toBeGreaterThan(boxBound);
    expectValid(shapelyCheck([ell], r), 12);
  });

  it.skipIf(!haveShapely)('80 Farline 7 arms (6 mm) fit 4 sheets of 400 × 300 and pass the same checks', () => {
    const arm = demoFrame('farline-7').parts.find((p) => p.name === 'arm')!;
    expect(arm.thicknessMm).toBe(6);
    const r = nestParts([{ part: arm, count: 80 }], { sheet: SHEET, spacingMm: SPACING, marginMm: MARGIN });
    expect(r.sheets.length).toBeLessThanOrEqual(4);
    expect(r.sheets.length).toBeGreaterThanOrEqual(r.groups[0].lowerBoundSheets);
    expectValid(shapelyCheck([arm], r), 80);
    expectWeaveAligned([arm], r);
  });

  it.skipIf(!haveShapely)('half-turned triangles pair up into rows: 40 on a 300 × 200 sheet, as worked by hand (Shapely)', () => {
    // Worked by hand: triangle (0,0) (40,0) (20,40), spacing 5. Its twin turned 180° stands apex down
    // beside it with their slanted edges parallel; edge normal (2, −1)/√5, so the twin's offset d along
    // x keeps them (d − 20)·2/√5 = 5 apart at d = 20 + 2.5√5 = 25.590 mm: one up and one down every
    // 2d = 51.180 mm. Usable 280 × 180 mm: ups at 51.18k + 40 ≤ 280 → 5, downs at 25.59 + 51.18k + 40 ≤ 280
    // → 5, 10 a row; rows of 40 mm at 45 mm → 4 rows: 40. (Boxes alone give 6 × 4 = 24; the area bound,
    // each grown triangle 800 + 129.44 × 2.5 + π 2.5² = 1143.2 mm² of 285 × 185 mm², 46.1.)
    // This layout broke clipper2's rectClip (pieces lost at a tile corner) before the nesting stopped using it.
    const tri = plate('tri', polygon([[0, 0], [40, 0], [20, 40]]), [], 2);
    const r = nestParts([{ part: tri, count: 50 }], { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: 5, marginMm: MARGIN });
    expect(r.sheets[0].placements.length).toBeGreaterThanOrEqual(40);
    expect(r.sheets[0].placements.length).toBeLessThanOrEqual(46);
    expect(r.groups[0].rule).toMatch(/^lattice of tri/);
    expectValid(shapelyCheck([tri], r, 5), 50, 5);
    // The lattice search is deterministic too.
    const again = nestParts([{ part: tri, count: 50 }], { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: 5, marginMm: MARGIN });
    expect(JSON.stringify(again)).toBe(JSON.stringify(r));
  });

  it.skipIf(!haveShapely)('lattices of Tessel 5 arms (pairs turned 180°) and bottom plates: every pair and margin through Shapely', () => {
    const parts = demoFrame('tessel-5').parts;
    for (const [name, count] of [['arm', 30], ['bottom-plate', 12]] as const) {
      const part = parts.find((p) => p.name === name)!;
      const r = nestParts([{ part, count }], { sheet: SHEET, spacingMm: SPACING, marginMm: MARGIN });
      // The lattice rule wins these sheets: the check below is of its layout.
      expect(r.groups[0].rule).toMatch(new RegExp(`^lattice of ${name}`));
      expect(r.sheets.length).toBeGreaterThanOrEqual(r.groups[0].lowerBoundSheets);
      expectValid(shapelyCheck([part], r, SPACING, true), count);
      expectWeaveAligned([part], r);
    }
  });

  it('a part larger than the sheet is a clear input error naming the sheet', () => {
    const big = plate('big', roundedRect([0, 0], 390, 100, 4), [], 2);
    const run = () => nestParts([{ part: big, count: 1 }], { sheet: SHEET, spacingMm: SPACING, marginMm: MARGIN });
    expect(run).toThrow(DesignError);
    try {
      run();
    } catch (e) {
      expect((e as DesignError).issues[0].path).toBe('sheet');
      expect((e as DesignError).message).toMatch(/too small for part big/);
    }
  });

  it('an unbalanced weave is only turned by half turns; the turns the shop allows are kept', () => {
    // E1 ≠ E2: a quarter turn would put the soft direction along the part (domain.md, the weave).
    const uni = { ...plate('uni', roundedRect([0, 0], 60, 20, 3), [], 2), material: { name: 'uni-cf', e1Gpa: 120, e2Gpa: 9, g12Gpa: 5, nu12: 0.3, densityGPerCm3: 1.55 } };
    expect(allowedRotations(uni).map((r) => Math.round((r * 180) / Math.PI))).toEqual([0, 180]);
    const r = nestParts([{ part: uni, count: 30 }], { sheet: { widthMm: 200, heightMm: 150 }, spacingMm: SPACING, marginMm: MARGIN });
    for (const sh of r.sheets) for (const pl of sh.placements) expect([0, 180]).toContain(Math.round(pl.rotationDeg));
    const tab = plate('tab', roundedRect([0, 0], 60, 20, 3), [], 2);
    const only = nestParts([{ part: tab, count: 30 }], { sheet: { widthMm: 200, heightMm: 150 }, spacingMm: SPACING, marginMm: MARGIN, turnsDeg: [90] });
    for (const sh of only.sheets) for (const pl of sh.placements) expect(Math.round(pl.rotationDeg)).toBe(90);
    expect(() => nestParts([{ part: uni, count: 1 }], { sheet: SHEET, spacingMm: SPACING, marginMm: MARGIN, turnsDeg: [90, 270] })).toThrow(/unbalanced weave of uni/);
    expect(() => nestParts([{ part: tab, count: 1 }], { sheet: SHEET, spacingMm: SPACING, marginMm: MARGIN, turnsDeg: [45] })).toThrow(DesignError);
  });

  it.skipIf(!haveShapely)('seeded random star plates, random weave angles, two thicknesses: the same independent checks', () => {
    let seed = 4242;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
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
    const n = parts.map(() => 2 + Math.floor(rnd() * 5));
    const r = nestParts(parts.map((part, i) => ({ part, count: n[i] })), { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: SPACING, marginMm: MARGIN });
    expectValid(shapelyCheck(parts, r), n.reduce((a, b) => a + b, 0));
    expectWeaveAligned(parts, r);
  });

  it('is deterministic', () => {
    const again = nestParts(items.map((part, i) => ({ part, count: counts[i] })), { sheet: { widthMm: 300, heightMm: 200 }, spacingMm: SPACING, marginMm: MARGIN });
    expect(JSON.stringify(again)).toBe(JSON.stringify(result));
  });

  it('a time limit stops the search but still places every part; progress rises to the total', () => {
    let clock = 0;
    const seen: number[] = [];
    const r = nestParts(items.map((part, i) => ({ part, count: counts[i] })), {
      sheet: { widthMm: 300, heightMm: 200 },
      spacingMm: SPACING,
      marginMm: MARGIN,
      timeLimitMs: 10,
      now: () => (clock += 100),
      onProgress: (done, total) => {
        expect(total).toBe(28);
        seen.push(done);
      },
    });
    expect(r.timedOut).toBe(true);
    expect(r.sheets.reduce((a, s) => a + s.placements.length, 0)).toBe(28);
    expect(seen[seen.length - 1]).toBe(28);
    expect(seen.every((x, i) => i === 0 || x >= seen[i - 1])).toBe(true);
    expect(result.timedOut).toBe(false);
  });
});

describe('the lower bound and the shapes behind the nesting', () => {
  it('occupied area of a plate: the grown outline (Steiner: A + P·r + πr²) minus what is left of a hole shrunk by r', () => {
    // 60 × 40 rectangle, r = 2.5: 2400 + 200 × 2.5 + π 2.5² = 2919.635; a Ø20 hole shrunk by 2.5 is a
    // Ø15 disc (176.715) and a Ø4 hole closes up: 2742.920 mm².
    const p = plate('r', polygon([[0, 0], [60, 0], [60, 40], [0, 40]]), [roundHole([20, 20], 20), roundHole([50, 30], 4)], 2);
    expect(occupiedAreaMm2(p, 2.5)).toBeCloseTo(2400 + 200 * 2.5 + Math.PI * 2.5 ** 2 - Math.PI * 7.5 ** 2, 6);
  });

  it('a window too small to hold any part of the group keeps its area with its part (hand count)', () => {
    // 60 × 40 plate, Ø20 hole, spacing 5 (r = 2.5): the hole shrunk by r is a Ø15 disc, 176.715 mm².
    // A guest needs its filled outline grown by r inside that disc: a 10 × 10 square needs
    // 100 + 40·2.5 + π·2.5² = 219.635 mm² (too big: the window is wasted), a 5 × 5 square
    // 25 + 20·2.5 + π·2.5² = 94.635 mm² (it may sit there: the window is free area).
    const host = plate('host', polygon([[0, 0], [60, 0], [60, 40], [0, 40]]), [roundHole([20, 20], 20)], 2);
    const square = (name: string, a: number) => plate(name, polygon([[0, 0], [a, 0], [a, a], [0, a]]), [], 2);
    const grown = (area: number, perimeter: number) => area + perimeter * 2.5 + Math.PI * 6.25;
    const usable = 385 * 285;
    const bound = (guest: ReturnType<typeof square>) => nestParts([{ part: host, count: 1 }, { part: guest, count: 1 }], { sheet: SHEET, spacingMm: 5, marginMm: 10 }).groups[0].boundSheets;
    expect(bound(square('big', 10)) * usable).toBeCloseTo(grown(2400, 200) + grown(100, 40), 6);
    expect(bound(square('small', 5)) * usable).toBeCloseTo(grown(2400, 200) - Math.PI * 7.5 ** 2 + grown(25, 20), 6);
  });

  it('the bound never exceeds the sheets used, and equals the hand count for identical rectangles', () => {
    // 100 plates 40 × 30, spacing 5, margin 10, sheet 400 × 300: each occupies (40·30 + 140·2.5 + π 2.5²)
    // = 1569.635 mm² of the (385 × 285) mm grown usable area: 100 × 1569.635 / 109725 = 1.43 → 2 sheets.
    const p = plate('r', polygon([[0, 0], [40, 0], [40, 30], [0, 30]]), [], 2);
    const r = nestParts([{ part: p, count: 100 }], { sheet: SHEET, spacingMm: 5, marginMm: 10 });
    expect(r.groups[0].boundSheets).toBeCloseTo((100 * (1200 + 140 * 2.5 + Math.PI * 6.25)) / (385 * 285), 9);
    expect(r.groups[0].lowerBoundSheets).toBe(2);
    expect(r.groups[0].sheets).toBe(2);
  });

  it('grown shapes: their convex pieces tile them exactly, and they exceed the exact grown outline by at most the arc allowance', () => {
    const arm = demoFrame('tessel-5').parts.find((p) => p.name === 'arm')!;
    const s = dilatedShape(arm, 2.5, 0);
    // The convex pieces tile the shape exactly (integer areas add up).
    const twice = (p: Path64) => p.reduce((a, v, i) => a + (p[(i + 1) % p.length].x - v.x) * (p[(i + 1) % p.length].y + v.y), 0);
    expect(s.pieces.reduce((a, p) => a - twice(p), 0)).toBe(-twice(s.rings[0]));
    // The polygon's area exceeds the exact grown area by at most its 0.011 mm allowance × perimeter.
    const exact = occupiedAreaMm2({ ...arm, features: [] }, 2.5 + 0.001);
    const poly = areaPaths([s.rings[0]]) / 1e8;
    expect(poly).toBeGreaterThanOrEqual(exact - 1e-6);
    expect(poly - exact).toBeLessThan(0.011 * 400);
  });

  it("no-fit polygons agree with clipper2's own Minkowski sum (edge by edge) on the demo parts, every pair and two turns", () => {
    // Every third vertex of each grown outline: still the demo parts' concave notches and round ends,
    // and a size clipper2's edge-by-edge sum (a union of n × m quadrilaterals) handles in seconds.
    const parts = demoFrame('tessel-5').parts;
    const coarse = (p: Part, k: number) => {
      const ring = quarterTurn(dilatedShape(p, 2.5875, 0), k).rings[0].filter((_, i) => i % 3 === 0);
      return { rings: [ring], box: [0, 0, 0, 0] as const, pieces: convexPieces([ring]) };
    };
    for (const a of parts) {
      for (const b of parts.filter((p) => p.thicknessMm === a.thicknessMm)) {
        const A = coarse(a, 0);
        expect(A.pieces.length).toBeGreaterThan(0);
        for (const k of [0, 1]) {
          const B = coarse(b, k);
          const ours = noFitPolygon(A, B);
          const nb = B.rings[0].map((v) => ({ x: -v.x, y: -v.y }));
          const ref = union([...Minkowski.sum(nb, A.rings[0], true), A.rings[0].map((v) => ({ x: v.x + nb[0].x, y: v.y + nb[0].y })), nb.map((v) => ({ x: v.x + A.rings[0][0].x, y: v.y + A.rings[0][0].y }))], FillRule.NonZero);
          // Integer rounding of crossing points only (units of 0.1 µm).
          expect(areaPaths(xor(ours, ref, FillRule.NonZero))).toBeLessThan(1e-6 * areaPaths(ref));
        }
      }
    }
  });

  it('the convolution of a convex and a simple polygon fills the Minkowski sum (seeded rectilinear shapes, clipper2 reference)', () => {
    let seed = 11;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    let checked = 0;
    for (let t = 0; t < 200; t++) {
      const w = 10 + Math.floor(rnd() * 20);
      const h = 10 + Math.floor(rnd() * 20);
      const c = 1 + Math.floor(rnd() * (Math.min(w, h) / 2 - 1));
      const P = [[c, 0], [w - c, 0], [w, c], [w, h - c], [w - c, h], [c, h], [0, h - c], [0, c]].map(([x, y]) => ({ x: x * 1000, y: y * 1000 }));
      const rects = Array.from({ length: 4 }, () => {
        const x = Math.floor(rnd() * 60) * 1000;
        const y = Math.floor(rnd() * 60) * 1000;
        const a = (10 + Math.floor(rnd() * 40)) * 1000;
        const b = (10 + Math.floor(rnd() * 40)) * 1000;
        return [{ x, y }, { x: x + a, y }, { x: x + a, y: y + b }, { x, y: y + b }];
      });
      const U = union(rects, FillRule.NonZero);
      if (U.length !== 1) continue;
      const Q = cleanRing(U[0]);
      const mine = union([convolution(P, Q)], FillRule.Positive);
      const ref = union([...Minkowski.sum(P, Q, true), Q.map((v) => ({ x: v.x + P[0].x, y: v.y + P[0].y })), P.map((v) => ({ x: v.x + Q[0].x, y: v.y + Q[0].y }))], FillRule.NonZero);
      expect(areaPaths(xor(mine, ref, FillRule.NonZero))).toBeLessThan(1e-6 * areaPaths(ref));
      checked++;
    }
    expect(checked).toBeGreaterThan(50);
  });
});

/** A ring without collinear or repeated vertices, counter-clockwise. */
function cleanRing(p: Path64): Path64 {
  const cur = dropCollinear(p.map((v) => ({ x: v.x, y: v.y })));
  return ringArea2(cur) > 0 ? cur : cur.reverse();
}

describe.skipIf(!haveNest2d)('against an independent nesting library (libnest2d, Debian python3-pynest2d)', () => {
  for (const design of ['tessel-5', 'farline-7']) {
    it(`20 frames of ${design}: no more sheets than libnest2d on convex hulls, per thickness`, () => {
      const parts = demoFrame(design).parts;
      const ours = nestParts(parts.map((part) => ({ part, count: part.quantity * 20 })), { sheet: SHEET, spacingMm: SPACING, marginMm: MARGIN });
      const thicknesses = [...new Set(parts.map((p) => p.thicknessMm))].sort((a, b) => a - b);
      const ref = runPythonJson<{ groups: Array<{ name: string; sheets: number }> }>('test/quote/pynest2d_sheets.py', {
        ...SHEET,
        marginMm: MARGIN,
        spacingMm: SPACING,
        groups: thicknesses.map((t) => ({ name: String(t), items: parts.filter((p) => p.thicknessMm === t).map((p) => ({ hull: convexHull(flattenLoop(p.outline, 0.01)), count: p.quantity * 20 })) })),
      });
      thicknesses.forEach((t, i) => {
        const g = ours.groups.find((x) => x.thicknessMm === t)!;
        expect(g.sheets).toBeLessThanOrEqual(ref.groups[i].sheets);
        expect(g.sheets).toBeGreaterThanOrEqual(g.lowerBoundSheets);
      });
    }, 120_000);
  }
});

