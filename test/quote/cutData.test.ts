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

describe('an inlet narrower than the tool', () => {
  // A 60 × 40 plate with a 2 mm wide, 20 mm deep inlet in the middle of its top edge; tool r = 1.5875.
  // The tool cannot enter: its centre bridges the mouth on two arcs about the mouth corners (29, 40)
  // and (31, 40) that meet above x = 30, each turning π/2 − acos(1/r).
  // Hand: 2(60 + 40) + 2πr (outer corners) − 2 (the mouth) + 2r(π/2 − acos(1/r)) = 210.1382 mm.
  it('bridges the mouth (polygon offset, flagged) with the hand-computed length', () => {
    const U = polygon([[0, 0], [60, 0], [60, 40], [31, 40], [31, 20], [29, 20], [29, 40], [0, 40]]);
    const o = offsetRight(U, R);
    expect(o.kind).toBe('polygon');
    if (o.kind === 'collapsed') return;
    const hand = 200 + 2 * Math.PI * R - 2 + 2 * R * (Math.PI / 2 - Math.acos(1 / R));
    expect(hand).toBeCloseTo(210.1382, 3);
    expect(loopLength(o.loop)).toBeCloseTo(hand, 2);
  });
});

describe('tool paths of the demo parts against Shapely buffers (GEOS)', () => {
  it.skipIf(!requireTool(pythonModuleAvailable('shapely'), 'python3-shapely'))('every contour of the three demo designs within 0.01 mm', () => {
    const cases: Array<{ points: number[][]; dist: number; inward: boolean }> = [];
    const ours: number[] = [];
    for (const name of ['tessel-5', 'mote-3', 'farline-7']) {
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

describe('offsets of seeded random shapes against Shapely buffers (GEOS)', () => {
  it.skipIf(!requireTool(pythonModuleAvailable('shapely'), 'python3-shapely'))('40 star polygons with rounded and sharp corners, outward and inward', () => {
    // Deterministic pseudo-random stars (LCG), some corners filleted by arcs: concave and convex
    // corners, short edges, arcs tighter than the tool.
    let seed = 12345;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const cases: Array<{ points: number[][]; dist: number; inward: boolean }> = [];
    const ours: number[] = [];
    const kinds: string[] = [];
    for (let k = 0; k < 40; k++) {
      const n = 5 + Math.floor(rnd() * 8);
      const pts: Array<[number, number]> = [];
      for (let i = 0; i < n; i++) {
        const a = (2 * Math.PI * (i + 0.3 * rnd())) / n;
        const rr = 10 + 25 * rnd();
        pts.push([rr * Math.cos(a), rr * Math.sin(a)]);
      }
      const loop = k % 2 === 0 ? polygon(pts) : roundedStar(pts, 0.5 + 3 * rnd());
      for (const inward of [false, true]) {
        const d = 0.5 + 2.5 * rnd();
        const o = offsetRight(inward ? reverseLoop(loop) : loop, d);
        kinds.push(o.kind);
        ours.push(o.kind === 'collapsed' ? 0 : loopLength(o.loop));
        cases.push({ points: flattenLoop(loop, 0.0005).map((q) => [q[0], q[1]]), dist: d, inward });
      }
    }
    const ref = runPythonJson<{ lengths: number[] }>('test/quote/shapely_offset.py', { cases });
    let worst = 0;
    ref.lengths.forEach((l, i) => { worst = Math.max(worst, Math.abs(l - ours[i]) / Math.max(1, l)); });
    console.log(`random shapes: worst relative difference ${worst.toExponential(2)}; ${kinds.filter((x) => x === "exact").length} exact, ${kinds.filter((x) => x === "polygon").length} polygon, ${kinds.filter((x) => x === "collapsed").length} collapsed`);
    expect(worst).toBeLessThan(2e-4);
    // Most offsets stay exact; the rest fall back to the guarded polygon offset.
    expect(kinds.filter((x) => x === 'exact').length).toBeGreaterThan(kinds.length / 2);
  });
});

/** Star polygon with every corner rounded by a tangent arc of radius r where it fits (else sharp). */
function roundedStar(pts: ReadonlyArray<readonly [number, number]>, r: number) {
  const n = pts.length;
  const segs: Array<ReturnType<typeof polygon>[number]> = [];
  const corner: Array<{ a: [number, number]; b: [number, number]; arc: ReturnType<typeof polygon>[number] | null }> = [];
  for (let i = 0; i < n; i++) {
    const p = pts[i];
    const prev = pts[(i - 1 + n) % n];
    const next = pts[(i + 1) % n];
    const u = unit2([prev[0] - p[0], prev[1] - p[1]]);
    const v = unit2([next[0] - p[0], next[1] - p[1]]);
    const cosT = u[0] * v[0] + u[1] * v[1];
    const theta = Math.acos(Math.max(-1, Math.min(1, cosT)));
    const t = r / Math.tan(theta / 2);
    const lp = Math.hypot(prev[0] - p[0], prev[1] - p[1]);
    const ln = Math.hypot(next[0] - p[0], next[1] - p[1]);
    if (!(t < 0.4 * Math.min(lp, ln)) || theta < 0.05) {
      corner.push({ a: [p[0], p[1]], b: [p[0], p[1]], arc: null });
      continue;
    }
    const a: [number, number] = [p[0] + u[0] * t, p[1] + u[1] * t];
    const b: [number, number] = [p[0] + v[0] * t, p[1] + v[1] * t];
    const bis = unit2([u[0] + v[0], u[1] + v[1]]);
    const h = r / Math.sin(theta / 2);
    const c: [number, number] = [p[0] + bis[0] * h, p[1] + bis[1] * h];
    const a0 = Math.atan2(a[1] - c[1], a[0] - c[0]);
    const a1 = Math.atan2(b[1] - c[1], b[0] - c[0]);
    let sweep = a1 - a0;
    const turnLeft = (p[0] - prev[0]) * (next[1] - p[1]) - (p[1] - prev[1]) * (next[0] - p[0]) > 0;
    while (turnLeft && sweep <= 0) sweep += 2 * Math.PI;
    while (!turnLeft && sweep >= 0) sweep -= 2 * Math.PI;
    corner.push({ a, b, arc: { kind: 'arc', center: c, radius: r, startRad: a0, sweepRad: sweep } });
  }
  for (let i = 0; i < n; i++) {
    const c = corner[i];
    if (c.arc) segs.push(c.arc);
    const nx = corner[(i + 1) % n];
    segs.push({ kind: 'line', start: c.b, end: nx.a });
  }
  return segs;
}

function unit2(v: [number, number]): [number, number] {
  const l = Math.hypot(v[0], v[1]);
  return [v[0] / l, v[1] / l];
}
