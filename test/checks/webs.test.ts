import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { filletedUnion } from '../../src/geometry/arm.js';
import { segmentDistance } from '../../src/geometry/distance.js';
import { arcSlot, circle, roundedRect, slot } from '../../src/geometry/primitives.js';
import { arc, line } from '../../src/geometry/segment.js';
import { checkOptions, checkPart, contourPairsWithin, edgeDistance, boltHoles } from '../../src/checks/index.js';
import { indexPart } from '../../src/checks/partIndex.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { DEMO_FILES, demoFrame, designWith } from '../helpers/demo.js';
import { buildFrame } from '../../src/geometry/index.js';
import { validateDesign } from '../../src/params/index.js';
import { fine, rect, roundHole, testPart } from './parts.js';

const SCRIPT = join(import.meta.dirname, 'shapely_webs.py');
const hasShapely = requireTool(pythonModuleAvailable('shapely'), 'python3-shapely');

type Ref = { pairs: number[]; points: number[]; necks: number[] };

/** A plate with round holes, a straight slot, an arc slot and a rounded cut-out: lines and arcs everywhere. */
const plate = testPart(roundedRect([0, 0], 80, 40, 6), [
  roundHole([-33, -14], 3.4),
  { shape: slot([-10, 14], [10, 14], 3.4), kind: 'slot' },
  { shape: roundedRect([15, -5], 14, 10, 3), kind: 'cutout' },
  roundHole([15, 6], 3.4),
  { shape: arcSlot([-20, 0], 8, -Math.PI / 3, (2 * Math.PI) / 3, 3), kind: 'slot' },
  roundHole([31, 13], 2.4),
]);

describe('exact segment distances (hand-computed cases)', () => {
  it('line–line, line–arc and arc–arc closed forms', () => {
    // Parallel lines 3 apart: 3.
    expect(segmentDistance(line([0, 0], [10, 0]), line([2, 3], [8, 3])).distance).toBeCloseTo(3, 12);
    // Line y = 0 to a full circle of radius 2 at (5, 5): 5 − 2 = 3.
    expect(segmentDistance(line([0, 0], [10, 0]), arc([5, 5], 2, 0, 2 * Math.PI)).distance).toBeCloseTo(3, 12);
    // Upper half circle at (5, 5) faces away from the line: its ends (3, 5) and (7, 5) are 5 away.
    expect(segmentDistance(line([0, 0], [10, 0]), arc([5, 5], 2, 0, Math.PI)).distance).toBeCloseTo(5, 12);
    // Circles r 1 and 2 with centres 10 apart: 10 − 3 = 7.
    expect(segmentDistance(arc([0, 0], 1, 0, 2 * Math.PI), arc([10, 0], 2, 0, 2 * Math.PI)).distance).toBeCloseTo(7, 12);
    // Crossing lines: 0.
    expect(segmentDistance(line([0, 0], [2, 2]), line([0, 2], [2, 0])).distance).toBe(0);
  });
});

describe('web widths and edge distances against Shapely (python3-shapely, to 0.01 mm)', () => {
  it.runIf(hasShapely)('every contour pair of a plate with arcs and slots', () => {
    const ix = indexPart(plate);
    const ours = contourPairsWithin(ix, 1000);
    const ref = runPythonJson<Ref>(SCRIPT, { rings: ix.contours.map((c) => fine(c.loop)), pairs: ours.map((p) => [p.a, p.b]) });
    expect(ours.length).toBe((7 * 6) / 2); // every pair of the 7 contours
    ours.forEach((p, k) => expect(Math.abs(p.distance - ref.pairs[k]), `pair ${p.a}-${p.b}`).toBeLessThan(0.01));
    const m = checkPart(plate, checkOptions()).metrics.metrics;
    const edge = ours.filter((p) => p.b === 0).map((p) => p.distance);
    expect(m.minHoleEdgeWebMm).toBeCloseTo(Math.min(...edge), 4);
  });

  it.runIf(hasShapely)('hole centre to the nearest free edge (outline and non-round contours)', () => {
    const ix = indexPart(plate);
    const holes = boltHoles(ix);
    expect(holes.length).toBe(3);
    const free = ix.contours.filter((c) => c.feature?.diameterMm === undefined).map((c) => c.index);
    const ref = runPythonJson<Ref>(SCRIPT, { rings: ix.contours.map((c) => fine(c.loop)), points: holes.map((h) => ({ p: h.center, rings: free })) });
    holes.forEach((h, k) => expect(Math.abs(edgeDistance(ix, h)!.eMm - ref.points[k])).toBeLessThan(0.01));
  });

  it.runIf(hasShapely)('the narrowest neck: a thin strut and an arc-filleted waist', () => {
    // Two discs joined by a 2.5 mm strut, fillets 1.5 mm.
    const strut = filletedUnion([circle([-14, 0], 8), circle([14, 0], 8), slot([-14, 0], [14, 0], 2.5)], 1.5).outline;
    // Two overlapping discs r 10, centres 19 apart, waist filleted with r 3. By hand: fillet centre at
    // (0, y) with distance r + 3 = 13 to each disc centre, y = √(13² − 9.5²) = 8.8741; neck = 2(y − 3).
    const waist = filletedUnion([circle([-9.5, 0], 10), circle([9.5, 0], 10)], 3).outline;
    const byHand = 2 * (Math.sqrt(13 ** 2 - 9.5 ** 2) - 3);
    const ref = runPythonJson<Ref>(SCRIPT, { rings: [fine(strut), fine(waist)], necks: [{ ring: 0, hi: 16 }, { ring: 1, hi: 20 }] });
    // Necks are searched up to 3 × max(web warning level, tool): a 4 mm minimum web (warning at 5)
    // reaches the 11.7 mm waist.
    const o = checkOptions({ limits: { 'web-width': { minMm: 4 } } });
    const strutNeck = checkPart(testPart(strut, []), o).metrics.metrics.minWebMm!;
    const waistNeck = checkPart(testPart(waist, []), o).metrics.metrics.minWebMm!;
    expect(Math.abs(strutNeck - ref.necks[0])).toBeLessThan(0.01);
    expect(Math.abs(waistNeck - ref.necks[1])).toBeLessThan(0.01);
    expect(strutNeck).toBeCloseTo(2.5, 4); // metrics are rounded to 4 decimals
    expect(waistNeck).toBeCloseTo(byHand, 4);
  });
});

describe('demo parts against Shapely (python3-shapely, to 0.01 mm)', () => {
  for (const file of DEMO_FILES) {
    it.runIf(hasShapely)(`${file}: smallest hole-to-outline and hole-to-hole webs of every part`, () => {
      const o = checkOptions();
      for (const part of demoFrame(file).parts) {
        const rings = [part.outline, ...part.features.map((f) => f.loop)].map(fine);
        const pairs: number[][] = [];
        for (let i = 1; i < rings.length; i++) for (let j = 0; j < i; j++) pairs.push([i, j]);
        const ref = runPythonJson<Ref>(SCRIPT, { rings, pairs });
        const edge = Math.min(...pairs.map((p, k) => (p[1] === 0 ? ref.pairs[k] : Infinity)));
        const holeHole = Math.min(...pairs.map((p, k) => (p[1] !== 0 ? ref.pairs[k] : Infinity)));
        const m = checkPart(part, o).metrics.metrics;
        expect(Math.abs(m.minHoleEdgeWebMm! - edge), `${part.name} hole to outline`).toBeLessThan(0.01);
        if (Number.isFinite(holeHole)) expect(Math.abs(m.minHoleHoleWebMm! - holeHole), `${part.name} hole to hole`).toBeLessThan(0.01);
      }
    });
  }
});

describe('necks of real demo outlines against Shapely erosion (to 0.01 mm)', () => {
  it.runIf(hasShapely)('tapered arms with fillets into the pads; a camera plate with no neck', () => {
    const cases = [
      { file: 'mote-3.yaml', part: 'bottom-plate' }, // unibody: tapered arms, filleted into body and pads
      { file: 'farline-7.yaml', part: 'arm' }, // tapered arm with a tip guard
      { file: 'tessel-5.yaml', part: 'camera-side' }, // a plate and a disc: erosion removes it whole
    ];
    // The Tessel camera plate with its pivot 8 mm ahead of the mount holes (the demo's is 16 mm
    // ahead since the camera must clear the camera spacers through its tilt range; that plate has a neck).
    const frameOf = (file: string) => (file === 'tessel-5.yaml' ? buildFrame(validateDesign(designWith(file, { camera: { forwardOffsetMm: 8 } }))) : demoFrame(file));
    const outlines = cases.map((c) => frameOf(c.file).parts.find((p) => p.name === c.part)!.outline);
    const ref = runPythonJson<{ necks: Array<number | null> }>(SCRIPT, { rings: outlines.map(fine), necks: outlines.map((_, ring) => ({ ring, hi: 40, step: 0.5 })) });
    // A 12 mm minimum web (warning at 15) makes the neck search reach 45 mm.
    const o = checkOptions({ limits: { 'web-width': { minMm: 12 } } });
    outlines.forEach((outline, k) => {
      const ours = checkPart(testPart(outline, []), o).metrics.metrics.minWebMm;
      if (ref.necks[k] === null) expect(ours, cases[k].part).toBeNull();
      else expect(Math.abs(ours! - ref.necks[k]!), cases[k].part).toBeLessThan(0.01);
    });
    expect(ref.necks.filter((x) => x !== null).length).toBe(2);
  });
});

describe('necks worked by hand', () => {
  const o = checkOptions({ limits: { 'web-width': { minMm: 10 } } }); // search necks up to 3 × 12.5 mm
  it('a curved strut (concentric arcs, radius 20, 3 mm wide): 3 mm', () => {
    const strut = arcSlot([0, 0], 20, 0, Math.PI / 2, 3);
    expect(checkPart(testPart(strut, []), o).metrics.metrics.minWebMm).toBeCloseTo(3, 9);
  });
  it('a 12 × 30 mm sharp-cornered bar: 12 mm between its long sides', () => {
    expect(checkPart(testPart(rect(0, 0, 30, 12), []), o).metrics.metrics.minWebMm).toBeCloseTo(12, 9);
  });
  it('a round disc has no neck', () => {
    expect(checkPart(testPart(circle([0, 0], 5), []), o).metrics.metrics.minWebMm).toBeNull();
  });
});

describe('web-width rule', () => {
  it('flags the thin strut as an error at its middle, with the limit from thickness', () => {
    const strut = filletedUnion([circle([-14, 0], 8), circle([14, 0], 8), slot([-14, 0], [14, 0], 1.2)], 1).outline;
    // 2 mm plate: limit max(1.5, 0.4 × 2) = 1.5 mm (defaults).
    const r = checkPart(testPart(strut, []), checkOptions());
    const f = r.findings.filter((x) => x.rule === 'web-width');
    expect(f.length).toBeGreaterThan(0);
    expect(f[0].severity).toBe('error');
    expect(f[0].measured).toBeCloseTo(1.2, 6);
    expect(f[0].limit).toBe(1.5);
    expect(Math.abs(f[0].atMm![1])).toBeLessThan(1e-6);
  });

  it('two holes 1 mm apart: error; 1.7 mm apart: warning (below 1.5 × 1.25)', () => {
    const two = (gap: number) => testPart(roundedRect([0, 0], 40, 30, 3), [roundHole([-1.7 - gap / 2, 0], 3.4), roundHole([1.7 + gap / 2, 0], 3.4)]);
    const o = checkOptions();
    const e = checkPart(two(1), o).findings.filter((x) => x.rule === 'web-width');
    expect(e.map((x) => [x.severity, x.measured])).toEqual([['error', 1]]);
    const w = checkPart(two(1.7), o).findings.filter((x) => x.rule === 'web-width');
    expect(w.map((x) => [x.severity, x.measured])).toEqual([['warning', 1.7]]);
    expect(checkPart(two(2), o).findings.filter((x) => x.rule === 'web-width')).toEqual([]);
  });
});
