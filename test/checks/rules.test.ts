import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { circle, polygon, roundedRect, slot } from '../../src/geometry/primitives.js';
import { loopProblem } from '../../src/geometry/validate.js';
import { flattenLoop } from '../../src/geometry/loop.js';
import { dist } from '../../src/geometry/vec.js';
import {
  bestWeave,
  buildGate,
  checkFrame,
  checkOptions,
  checkPart,
  checkParts,
  heywoodKtn,
} from '../../src/checks/index.js';
import { partArea } from '../../src/geometry/metrics.js';
import { DEMO_FILES, demoFrame } from '../helpers/demo.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { fine, rect, roundHole, testPart, WOVEN_70 } from './parts.js';

const o = checkOptions({ toolDiameterMm: 3.175 });
const of = (p: ReturnType<typeof testPart>, rule: string, opts = o) => checkPart(p, opts).findings.filter((f) => f.rule === rule);

describe('hole-edge-distance rule (planted parts)', () => {
  const plate = (e: number) => testPart(rect(0, 0, 40, 30), [{ ...roundHole([e, 15], 3.4), screw: 'M3' as const }]);
  it('e/D bands: error below 1.5, warning below 2.0 (reference-values.md suggested defaults)', () => {
    // e = 4.08 → e/D 1.2: error; e = 6.12 → 1.8: warning; e = 7.14 → 2.1: none.
    expect(of(plate(4.08), 'hole-edge-distance').map((f) => [f.severity, f.measured, f.limit])).toEqual([['error', 1.2, 1.5]]);
    expect(of(plate(6.12), 'hole-edge-distance').map((f) => [f.severity, f.measured, f.limit])).toEqual([['warning', 1.8, 2]]);
    expect(of(plate(7.14), 'hole-edge-distance')).toEqual([]);
    expect(checkPart(plate(4.08), o).metrics.metrics.minEdgeRatio).toBeCloseTo(1.2, 9);
  });
  it('a bolt slot: e from its centre line (the slot contour distance + D/2), D its width', () => {
    // Slot centre line y = 5 from x 10 to 20, width 3.4: e = 5 to the edge y = 0, e/D = 1.4706 → error.
    const p = testPart(rect(0, 0, 40, 30), [{ shape: slot([10, 5], [20, 5], 3.4), kind: 'slot', purpose: 'motor-bolt', screw: 'M3' as const }]);
    const f = of(p, 'hole-edge-distance');
    expect(f.map((x) => x.severity)).toEqual(['error']);
    expect(f[0].measured).toBeCloseTo(5 / 3.4, 4);
    expect(f[0].atMm![1]).toBeCloseTo(3.3, 9); // on the slot's side facing the edge
  });
  it('pitch/D below 3 between neighbouring bolt holes is a warning', () => {
    const p = testPart(rect(0, 0, 60, 30), [
      { ...roundHole([20, 15], 3.4), screw: 'M3' as const },
      { ...roundHole([28.5, 15], 3.4), screw: 'M3' as const }, // pitch 8.5 = 2.5 D
    ]);
    const f = of(p, 'hole-edge-distance');
    expect(f.map((x) => [x.severity, x.measured, x.unit])).toEqual([['warning', 2.5, 'pitch/D']]);
    expect(f[0].atMm).toEqual([24.25, 15]);
  });
});

describe('bit-reach rule (planted parts)', () => {
  it('sharp inside corners of a rectangular slot: four warnings, the cutter leaves the tool radius', () => {
    const p = testPart(rect(0, 0, 40, 30), [{ shape: rect(10, 10, 25, 16), kind: 'slot' }]);
    const f = of(p, 'bit-reach');
    expect(f.length).toBe(4);
    for (const x of f) {
      expect(x.severity).toBe('warning');
      expect(x.limit).toBeCloseTo(3.175 / 2, 4);
    }
    expect(f.map((x) => x.atMm).sort()).toEqual([[10, 10], [10, 16], [25, 10], [25, 16]].sort());
  });
  it('shallow corners leave less than 0.01 mm and are not reported (a finely divided curve is no corner)', () => {
    // Leftover on the bisector: R(1/cos(turn/2) − 1) with R = 1.5875: 20° → 0.0245 mm, 10° → 0.0061 mm.
    const notch = (turnDeg: number) => {
      const h = 10 * Math.tan((turnDeg * Math.PI) / 360); // a shallow V in the top edge, turning by turnDeg at its bottom
      return testPart(polygon([[0, 0], [40, 0], [40, 30], [30, 30], [20, 30 - h], [10, 30], [0, 30]]), []);
    };
    expect(of(notch(20), 'bit-reach').length).toBe(1);
    expect(of(notch(10), 'bit-reach')).toEqual([]);
    // Regression: a 4,000-vertex wavy outline once gave 1,329 "sharp corners".
    const pts = Array.from({ length: 4000 }, (_, i) => {
      const a = (2 * Math.PI * i) / 4000;
      const r = 100 + 5 * Math.sin(7 * a);
      return [r * Math.cos(a), r * Math.sin(a)] as const;
    });
    expect(of(testPart(polygon(pts), []), 'bit-reach')).toEqual([]);
  });
  it('an inside fillet smaller than the tool radius is reported with the radius the cutter leaves', () => {
    const p = testPart(rect(0, 0, 40, 30), [{ shape: roundedRect([20, 15], 16, 10, 1), kind: 'cutout' }]);
    const f = of(p, 'bit-reach');
    expect(f.length).toBe(4);
    expect(f[0].measured).toBe(1);
  });
  it('a channel narrower than the tool is an error; a round hole smaller than the tool must be drilled', () => {
    // Two 8 × 10 pockets joined by a 2.8 mm channel (y 13.6 to 16.4): the pockets can be cut, the channel not.
    const dumbbell = polygon([[10, 10], [18, 10], [18, 13.6], [26, 13.6], [26, 10], [34, 10], [34, 20], [26, 20], [26, 16.4], [18, 16.4], [18, 20], [10, 20]]);
    const p = testPart(rect(0, 0, 44, 30), [{ shape: dumbbell, kind: 'cutout' }, roundHole([22, 25], 2.4)]);
    const f = of(p, 'bit-reach');
    // The small hole is a note: drilling it is ordinary practice, and the quote prices the drilling.
    expect(f.map((x) => [x.severity, x.measured]).sort()).toEqual([['error', 2.8], ['info', 2.4]].sort());
    const at = f.find((x) => x.severity === 'error')!.atMm!;
    expect(at[1]).toBeCloseTo(15, 9); // on the channel's centre line, between its ends
    expect(at[0]).toBeGreaterThanOrEqual(18);
    expect(at[0]).toBeLessThanOrEqual(26);
    // A 2 mm bit reaches everything except the sharp corners, which it rounds to 1 mm.
    const two = of(p, 'bit-reach', checkOptions({ toolDiameterMm: 2 }));
    expect(two.every((x) => x.severity === 'warning' && x.message.includes('sharp inside corner'))).toBe(true);
  });
  it('a slot narrower than the tool all along cannot be entered at all', () => {
    const p = testPart(rect(0, 0, 40, 30), [{ shape: slot([10, 10], [30, 10], 2.8), kind: 'slot' }]);
    expect(of(p, 'bit-reach').map((x) => x.severity)).toEqual(['error']);
  });
  it('a cut-out the tool cannot enter at all (2.5 mm square, 3.175 mm tool) is an error', () => {
    const p = testPart(rect(0, 0, 40, 30), [{ shape: rect(10, 10, 12.5, 12.5), kind: 'cutout' }]);
    const f = of(p, 'bit-reach');
    expect(f.map((x) => x.severity)).toEqual(['error']);
    // The largest tool that enters a 2.5 mm square is 2.5 mm (erosion by half of it leaves a point).
    expect(f[0].message).toMatch(/the largest tool that enters it is 2\.(49|50) mm, below the 3\.175 mm tool; widen it to 3\.3 mm or use a 2 mm bit/);
    expect(f[0].measured).toBeGreaterThan(2.49);
    expect(f[0].measured).toBeLessThanOrEqual(2.5);
  });
  it('a gap in the outline (a notch) narrower than the tool is an error', () => {
    const notched = polygon([[0, 0], [40, 0], [40, 30], [21.5, 30], [21.5, 15], [18.5, 15], [18.5, 30], [0, 30]]);
    const f = of(testPart(notched, []), 'bit-reach').filter((x) => x.severity === 'error');
    expect(f.length).toBe(1);
    expect(f[0].measured).toBeCloseTo(3, 9);
  });
});

// Corner reliefs: test/geometry/relief.test.ts.

describe('weave-direction rule', () => {
  const strut = (angleDeg: number, weaveDeg = 0) => {
    const a = (angleDeg * Math.PI) / 180;
    return testPart(rect(-60, -60, 60, 60), [], {
      weaveRad: (weaveDeg * Math.PI) / 180,
      members: [{ name: 'strut', startMm: [0, 0], endMm: [50 * Math.cos(a), 50 * Math.sin(a)], widthMm: 8 }],
    });
  };
  it('a strut at 30° to the weave: Ex 21.8 GPa of 70 (reference-values.md [CALC]) → warning, and the best weave is 30°', () => {
    const f = of(strut(30), 'weave-direction');
    const w = f.find((x) => x.severity === 'warning')!;
    expect(w.measured).toBeCloseTo(21.8 / 70, 3);
    expect(w.message).toMatch(/30\.0° from the nearest fibre direction, Ex 21\.8 of 70\.0 GPa on axis/);
    // The fix names the weave angle that puts the strut on a fibre.
    expect(w.message).toMatch(/lay the weave at 30\.00°/);
    expect(bestWeave(WOVEN_70, strut(30).members).minExGpa).toBeCloseTo(70, 6);
  });
  it('a strut along the weave is information only', () => {
    expect(of(strut(90), 'weave-direction').map((x) => x.severity)).toEqual(['info']);
  });
  it('two struts 90° apart at 45°: the best weave keeps both on a fibre', () => {
    const p = testPart(rect(-60, -60, 60, 60), [], {
      members: [
        { name: 'a', startMm: [0, 0], endMm: [40, 40], widthMm: 8 },
        { name: 'b', startMm: [0, 0], endMm: [-40, 40], widthMm: 8 },
      ],
    });
    const b = bestWeave(WOVEN_70, p.members);
    expect(Math.abs(b.weaveDeg)).toBeCloseTo(45, 2);
    expect(b.minExGpa).toBeCloseTo(70, 6);
  });
  it('parts without members (imported) have nothing to check', () => {
    expect(of(testPart(rect(0, 0, 10, 10), []), 'weave-direction')).toEqual([]);
  });
});

describe('hole-stress rule', () => {
  it('a bolt hole in the middle of a 12 mm strut: Heywood with W = 12, Lekhnitskii at the strut angle', () => {
    const p = testPart(rect(0, -6, 80, 6), [{ ...roundHole([70, 0], 3.4, 'motor-bolt'), screw: 'M3' as const }], {
      members: [{ name: 'arm', startMm: [0, 0], endMm: [80, 0], widthMm: 12 }],
    });
    const f = of(p, 'hole-stress');
    expect(f.length).toBe(1);
    expect(f[0].severity).toBe('info');
    expect(f[0].measured).toBeCloseTo(heywoodKtn(3.4, 12), 4);
    // Along the weave, woven 70/70/5: Lekhnitskii 4.975 (reference-values.md [CALC]).
    expect(f[0].message).toMatch(/orthotropic Kt 4\.975/);
  });
  it('an off-centre hole: W = d + 2 × the smaller ligament, computed by hand', () => {
    // Strip y −6..6, Ø3.4 at y = 1: ligaments 6 − 1 − 1.7 = 3.3 and 1 + 6 − 1.7 = 5.3; W = 3.4 + 2 × 3.3 = 10;
    // Ktn = 2 + (1 − 0.34)³ = 2.287496.
    const p = testPart(rect(0, -6, 80, 6), [{ ...roundHole([40, 1], 3.4, 'arm-root-bolt'), screw: 'M3' as const }], {
      members: [{ name: 'arm', startMm: [0, 0], endMm: [80, 0], widthMm: 12 }],
    });
    const f = of(p, 'hole-stress');
    expect(f[0].measured).toBeCloseTo(2.2875, 4);
    expect(f[0].message).toMatch(/W 10\.00 mm/);
  });
});

describe('demo designs', () => {
  for (const file of DEMO_FILES) {
    it(`${file} passes with no errors`, () => {
      const r = checkFrame(demoFrame(file));
      expect(r.findings.filter((f) => f.severity === 'error')).toEqual([]);
      expect(r.summary.errors).toBe(0);
      expect(r.parts.length).toBe(demoFrame(file).parts.length);
    });
  }
  it('reports are deterministic', () => {
    expect(JSON.stringify(checkFrame(demoFrame('tessel-5.yaml')))).toBe(JSON.stringify(checkFrame(demoFrame('tessel-5.yaml'))));
  });
});

describe('buildGate (for build)', () => {
  it('refuses on errors unless forced, and then names the count for the files', () => {
    const bad = checkParts([testPart(rect(0, 0, 40, 30), [{ ...roundHole([4.5, 15], 3.4), screw: 'M3' as const }])], o);
    expect(bad.summary.errors).toBe(1);
    const refused = buildGate(bad, false);
    expect(refused.refuse).toBe(true);
    expect(refused.message).toMatch(/1 error, .*no cut files were written/);
    const forced = buildGate(bad, true);
    expect(forced.refuse).toBe(false);
    expect(forced.comment).toMatch(/--force although the design-rule checks found 1 error/);
    expect(buildGate(checkFrame(demoFrame('tessel-5.yaml')), false)).toEqual({ refuse: false, comment: undefined, message: '' });
  });
});
