import { describe, expect, it } from 'vitest';
import { flattenLoop, loopLength, reverseLoop, signedArea } from '../../src/geometry/index.js';
import { offsetRight, partCutData } from '../../src/quote/index.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { cutout, demoFrame, plate, polygon, roundedRect, roundHole, slot } from './fixtures.js';

const TOOL = 3.175; // 1/8" end mill (reference-values.md: inside-corner radius ≥ 1.5875 mm)
const R = TOOL / 2;

describe('tool-centre path of simple parts, against hand-computed perimeters', () => {
  // Rounded rectangle 100 × 50 mm, corner radius 5, four Ø6 holes, one Ø2.4 (M2, ISO 273 medium) hole,
  // a 20 × 10 cut-out with 1 mm corners (tighter than the tool) and a 3 mm slot (narrower than the tool).
  const part = plate('hand', roundedRect([0, 0], 100, 50, 5), [
    roundHole([-40, -15], 6),
    roundHole([40, -15], 6),
    roundHole([40, 15], 6),
    roundHole([-40, 15], 6),
    roundHole([0, 15], 2.4, { screw: 'M2' }),
    cutout(roundedRect([0, 0], 20, 10, 1)),
    cutout(slot([-20, 5], [-20, -5], 3), 'slot'),
  ]);
  const cut = partCutData(part, TOOL);

  it('outline: straight sides 2(100 + 50) − 8·5 = 260, corners grow to radius 5 + r', () => {
    // hand: drawn 260 + 2π·5 = 291.4159; tool centre 260 + 2π·(5 + 1.5875) = 301.3905
    const o = cut.contours.find((c) => c.role === 'outline')!;
    expect(o.kind).toBe('profile');
    if (o.kind !== 'profile') return;
    expect(o.drawnMm).toBeCloseTo(260 + 2 * Math.PI * 5, 9);
    expect(o.toolPathMm).toBeCloseTo(260 + 2 * Math.PI * (5 + R), 9);
    expect(o.toolPathMm).toBeCloseTo(301.3905, 3);
    expect(o.method).toBe('exact');
  });

  it('round holes: the tool centre runs a circle of radius D/2 − r', () => {
    // hand: 2π·(3 − 1.5875) = 8.8750 mm each
    const holes = cut.contours.filter((c) => c.kind === 'profile' && c.role === 'inner' && Math.abs(c.drawnMm - 6 * Math.PI) < 1e-9);
    expect(holes).toHaveLength(4);
    for (const h of holes) if (h.kind === 'profile') expect(h.toolPathMm).toBeCloseTo(2 * Math.PI * (3 - R), 9);
  });

  it('a cut-out whose corners are tighter than the tool: the centre path is a sharp rectangle r inside', () => {
    // hand: (20 − 2r) × (10 − 2r) = 16.825 × 6.825, perimeter 47.3 mm, area 114.830625 mm²
    const c = cut.contours.find((x) => x.kind === 'profile' && x.role === 'inner' && Math.abs(x.drawnMm - (2 * (18 + 8) + 2 * Math.PI)) < 1e-9);
    expect(c?.kind).toBe('profile');
    if (c?.kind !== 'profile') return;
    expect(c.toolPathMm).toBeCloseTo(47.3, 9);
    expect(Math.abs(signedArea(c.path))).toBeCloseTo(114.830625, 9);
    expect(signedArea(c.path)).toBeLessThan(0); // still clockwise, like the hole it cuts
  });

  it('counts: 7 inner contours + outline; Ø2.4 < tool is drilled; the 3 mm slot cannot be cut', () => {
    expect(cut.profiled).toBe(6); // outline, 4 holes, the cut-out
    expect(cut.drilled).toBe(1);
    expect(cut.tooNarrow).toBe(1);
    expect(cut.pierces).toBe(7); // every profiled contour and drilled hole starts with a plunge
    const total = 260 + 2 * Math.PI * (5 + R) + 4 * 2 * Math.PI * (3 - R) + 47.3;
    expect(cut.toolPathMm).toBeCloseTo(total, 9);
    expect(cut.drawnLengthMm).toBeCloseTo(260 + 2 * Math.PI * 5 + 4 * 6 * Math.PI + 2.4 * Math.PI + (2 * 26 + 2 * Math.PI) + (2 * 10 + 3 * Math.PI), 9);
  });

  it('hole table: count × diameter, through', () => {
    expect(cut.holes).toEqual([
      { diameterMm: 2.4, count: 1, screw: 'M2', finish: 'through', countersinkHeadMm: null },
      { diameterMm: 6, count: 4, screw: null, finish: 'through', countersinkHeadMm: null },
    ]);
  });

  it('countersunk holes get their own row', () => {
    const p = plate('cs', roundedRect([0, 0], 40, 40, 3), [
      roundHole([-10, 0], 3.4, { screw: 'M3', countersink: { headDiameterMm: 6.72, face: 'bottom' } }),
      roundHole([10, 0], 3.4, { screw: 'M3' }),
    ]);
    expect(partCutData(p, TOOL).holes.map((h) => `${h.count}x${h.diameterMm} ${h.finish}`)).toEqual(['1x3.4 through', '1x3.4 countersunk']);
  });
});

describe('offset of a concave outline (L shape, sharp corners)', () => {
  // L: 60 × 20 foot and 20 × 50 column, perimeter 220. Offset by 2 outward: five convex corners add
  // arcs turning 5π/2 in all (length 2·5π/2 = 5π); the one concave corner trims 2 mm off each of its
  // two edges. Hand: 220 − 4 + 5π = 231.7080 mm.
  it('matches the hand result', () => {
    const L = polygon([[0, 0], [60, 0], [60, 20], [20, 20], [20, 50], [0, 50]]);
    const o = offsetRight(L, 2);
    expect(o.kind).toBe('exact');
    if (o.kind === 'collapsed') return;
    expect(loopLength(o.loop)).toBeCloseTo(216 + 5 * Math.PI, 9);
  });
});

describe('tool paths of the demo parts against Shapely buffers (GEOS)', () => {
  it.skipIf(!requireTool(pythonModuleAvailable('shapely'), 'python3-shapely'))('every contour of Tessel 5 and Mote 3 within 0.01 mm', () => {
    const cases: Array<{ points: number[][]; dist: number; inward: boolean }> = [];
    const ours: number[] = [];
    for (const name of ['tessel-5', 'mote-3']) {
      for (const p of demoFrame(name).parts) {
        const cut = partCutData(p, TOOL);
        const loops = [...p.features.map((f) => f.loop), p.outline];
        cut.contours.forEach((c, i) => {
          if (c.kind === 'drill') return;
          const loop = loops[i];
          const inward = i < p.features.length;
          const ccw = inward ? reverseLoop(loop) : loop;
          cases.push({ points: flattenLoop(ccw, 0.0005).map((q) => [q[0], q[1]]), dist: R, inward });
          ours.push(c.kind === 'profile' ? c.toolPathMm : 0);
        });
      }
    }
    const ref = runPythonJson<{ lengths: number[] }>('test/quote/shapely_offset.py', { cases });
    expect(ref.lengths).toHaveLength(ours.length);
    let worst = 0;
    ref.lengths.forEach((l, i) => { worst = Math.max(worst, Math.abs(l - ours[i])); });
    // Polygons within 0.0005 mm of the arcs, and GEOS buffers with 512 segments per quarter circle.
    console.log(`worst tool-path difference vs GEOS: ${worst.toExponential(2)} mm over ${ours.length} contours`);
    expect(worst).toBeLessThan(0.01);
    expect(ours.length).toBeGreaterThan(40);
  });
});
