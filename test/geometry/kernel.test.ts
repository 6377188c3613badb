import { describe, expect, it } from 'vitest';
import {
  arcSlot,
  BooleanGuardError,
  guardAgainstPolygonUnion,
  circle,
  endOf,
  filletInsideCorners,
  hullOfCircles,
  insideCornerIndices,
  loopProblem,
  polygon,
  roundedRect,
  signedArea,
  slot,
  startOf,
  tangentAt,
  unionLoops,
  windingNumber,
  loopLength,
  type Loop,
} from '../../src/geometry/index.js';

const closeTo = (a: number, b: number, tol: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(tol);

/** Every joint of a filleted loop is continuous and tangent. */
function expectSmoothClosed(loop: Loop) {
  expect(loopProblem(loop)).toBeNull();
  for (let i = 0; i < loop.length; i++) {
    const a = loop[i];
    const b = loop[(i + 1) % loop.length];
    const e = endOf(a);
    const s = startOf(b);
    expect(Math.hypot(e[0] - s[0], e[1] - s[1])).toBeLessThan(1e-6);
  }
}

describe('exact areas (Green theorem on lines and arcs) against closed-form areas', () => {
  it('circle: πr²', () => {
    // Euclid XII.2 / any calculus text: area of a disc
    closeTo(signedArea(circle([3, -2], 7.5)), Math.PI * 7.5 ** 2, 1e-9);
    closeTo(signedArea(circle([3, -2], 7.5, false)), -Math.PI * 7.5 ** 2, 1e-9);
  });
  it('rounded rectangle: wh − (4 − π) r²', () => {
    // elementary geometry: four square corners replaced by quarter discs
    const l = roundedRect([10, 5], 124, 48, 6, 0.3);
    closeTo(signedArea(l), 124 * 48 - (4 - Math.PI) * 36, 1e-9);
    closeTo(loopLength(l), 2 * (124 + 48) - 8 * 6 + 2 * Math.PI * 6, 1e-9);
  });
  it('stadium slot: πr² + 2rL, and an arc slot: annular sector plus two discs', () => {
    closeTo(signedArea(slot([0, 0], [30, 40], 8)), Math.PI * 16 + 8 * 50, 1e-9);
    const r = 7;
    const w = 2.4;
    const sweep = (50 * Math.PI) / 180;
    // annulus sector ((R² − r²) θ / 2) plus the two half-disc end caps (one full disc)
    const expected = (((r + w / 2) ** 2 - (r - w / 2) ** 2) * sweep) / 2 + Math.PI * (w / 2) ** 2;
    closeTo(signedArea(arcSlot([1, 2], r, -Math.PI / 2, sweep, w)), expected, 1e-9);
  });
  it('hull of circles: a stadium for two centres', () => {
    closeTo(signedArea(hullOfCircles([[0, 0], [20, 0]], 5)), Math.PI * 25 + 10 * 20, 1e-9);
  });
});

describe('winding number on arcs', () => {
  it('counts points inside and outside a slot and a circle exactly, including rays through arc ends', () => {
    const s = slot([0, 0], [20, 0], 10);
    expect(windingNumber(s, [10, 0])).toBe(1);
    expect(windingNumber(s, [-4.9, 0])).toBe(1);
    expect(windingNumber(s, [-5.1, 0])).toBe(0);
    expect(windingNumber(s, [10, 5.01])).toBe(0);
    const c = circle([0, 0], 3);
    // the ray to +x passes exactly through the circle's start/end point
    expect(windingNumber(c, [0, 0])).toBe(1);
    expect(windingNumber(c, [0, -1e-16])).toBe(1);
    expect(windingNumber(circle([0, 0], 3, false), [1, 0])).toBe(-1);
    // regression (reported by the DXF import work): a point exactly on an arc's chord, here a hole
    // centre on the line between the ends of a half-round arm end
    const arm = slot([0, 0], [100, 0], 12);
    expect(windingNumber(arm, [100, -1.6])).toBe(1);
    expect(windingNumber(arm, [100, 1.6])).toBe(1);
    expect(windingNumber(arm, [0, 0])).toBe(1);
    expect(windingNumber(arm, [106.01, 0])).toBe(0);
  });
});

describe('union of line/arc loops', () => {
  it('two overlapping discs: area by the circular-lens formula', () => {
    // lens area of two circles radius r at distance d: 2r² acos(d/2r) − (d/2)√(4r² − d²)
    const r = 10;
    const d = 12;
    const lens = 2 * r * r * Math.acos(d / (2 * r)) - (d / 2) * Math.sqrt(4 * r * r - d * d);
    const u = unionLoops([circle([0, 0], r), circle([d, 0], r)]);
    expect(u).toHaveLength(1);
    closeTo(signedArea(u[0]), 2 * Math.PI * r * r - lens, 1e-6);
    expectSmoothClosed(u[0].map((x) => x));
  });

  it('regression (library-notes): rounded rectangle 53.5 × 52.5 r 7.5 with a slot to (−10.5, 60) keeps both operands', () => {
    // The construction that made another library drop the rectangle silently. Same shapes,
    // rectangle spanning [0, 53.5] × [0, 52.5], slot of radius 3.5 from the origin.
    const rect = roundedRect([53.5 / 2, 52.5 / 2], 53.5, 52.5, 7.5);
    const s = slot([0, 0], [-10.5, 60], 7);
    const u = unionLoops([rect, s]);
    const area = u.reduce((a, l) => a + signedArea(l), 0);
    expect(area).toBeGreaterThan(signedArea(rect));
    expect(area).toBeGreaterThan(signedArea(s));
    expect(area).toBeLessThan(signedArea(rect) + signedArea(s));
  });

  it('the guard refuses a union result that lost an operand or came apart', () => {
    // The independent clipper2 polygon union is the referee: a result missing the rectangle
    // (the silent failure seen in another library) must throw, not pass.
    const rect = roundedRect([53.5 / 2, 52.5 / 2], 53.5, 52.5, 7.5);
    const s = slot([0, 0], [-10.5, 60], 7);
    expect(() => guardAgainstPolygonUnion([rect, s], [s], 1e-3)).toThrow(BooleanGuardError);
    expect(() => unionLoops([circle([0, 0], 5), circle([20, 0], 5)])).toThrow(/separate outlines/);
  });

  it('the guard catches a union that is off by a little more than its 0.1 % margin, and passes the true union', () => {
    // The true union of a plate and a slot, and the union with the slot 0.8 mm short of its end:
    // 7 mm × 0.8 mm = 5.6 mm², 0.17 % of the ~3,300 mm² (hand calculation: end cap moved, width 7).
    const rect = roundedRect([53.5 / 2, 52.5 / 2], 53.5, 52.5, 7.5);
    const long = slot([0, 0], [-10.5, 60], 7);
    const short = slot([0, 0], [-10.5 * (1 - 0.8 / Math.hypot(10.5, 60)), 60 * (1 - 0.8 / Math.hypot(10.5, 60))], 7);
    const truth = unionLoops([rect, long]);
    const off = unionLoops([rect, short]);
    const lost = truth.reduce((a, l) => a + signedArea(l), 0) - off.reduce((a, l) => a + signedArea(l), 0);
    closeTo(lost, 7 * 0.8, 1e-6);
    expect(lost / truth.reduce((a, l) => a + signedArea(l), 0)).toBeGreaterThan(1e-3);
    expect(() => guardAgainstPolygonUnion([rect, long], off, 1e-3)).toThrow(BooleanGuardError);
    expect(() => guardAgainstPolygonUnion([rect, long], truth, 1e-3)).not.toThrow();
    // The guard compares polygons with vertices on one angular grid per arc: so tight that a
    // hundredth of its margin still passes the true union.
    expect(() => guardAgainstPolygonUnion([rect, long], truth, 1e-5)).not.toThrow();
  });

  it('an enclosed window comes back as a clockwise loop', () => {
    // a square ring made of four bars
    const bars = [
      polygon([[0, 0], [40, 0], [40, 6], [0, 6]]),
      polygon([[34, -1], [41, -1], [41, 40], [34, 40]]),
      polygon([[0, 34], [40, 34], [40, 41], [0, 41]]),
      polygon([[-1, -1], [6, -1], [6, 40], [-1, 40]]),
    ];
    const u = unionLoops(bars);
    expect(u).toHaveLength(2);
    const areas = u.map(signedArea).sort((a, b) => a - b);
    // hole 28 × 28; outer 42 × 42 (x −1..41, y −1..41) less the three notches the bars leave:
    // 1 × 1 at two top corners and 28 × 1 under the bottom bar
    closeTo(areas[0], -28 * 28, 1e-9);
    closeTo(areas[1], 42 * 42 - 1 - 1 - 28, 1e-9);
  });
});

describe('fillets', () => {
  it('an inside right-angle corner gains r²(1 − π/4) of material and stays tangent', () => {
    // L-shape: 30 × 30 square minus the 15 × 15 top-right quarter
    const L = polygon([[0, 0], [30, 0], [30, 15], [15, 15], [15, 30], [0, 30]]);
    expect(insideCornerIndices(L)).toEqual([2]);
    const r = 4;
    const f = filletInsideCorners(L, r);
    closeTo(signedArea(f) - signedArea(L), r * r * (1 - Math.PI / 4), 1e-9);
    expectSmoothClosed(f);
    for (let i = 0; i < f.length; i++) {
      const t1 = tangentAt(f[i], 1);
      const t2 = tangentAt(f[(i + 1) % f.length], 0);
      if (f[i].kind === 'arc' || f[(i + 1) % f.length].kind === 'arc') expect(Math.abs(t1[0] * t2[1] - t1[1] * t2[0])).toBeLessThan(1e-9);
    }
  });
  it('a line meeting a circle gets a fillet tangent to both', () => {
    const u = unionLoops([roundedRect([20, 0], 40, 8, 0), circle([40, 0], 10)]);
    const f = filletInsideCorners(u[0], 3);
    expectSmoothClosed(f);
    const arcs = f.filter((s) => s.kind === 'arc' && s.radius === 3);
    expect(arcs).toHaveLength(2);
    for (const a of arcs) {
      if (a.kind !== 'arc') continue;
      // tangent to the circle from outside: centre distance = R + r
      closeTo(Math.hypot(a.center[0] - 40, a.center[1]), 13, 1e-9);
      // tangent to the bar edge |y| = 4 from outside: |cy| = 4 + r
      closeTo(Math.abs(a.center[1]), 7, 1e-9);
    }
  });
});
