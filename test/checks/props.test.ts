import { describe, expect, it } from 'vitest';
import { buildFrame } from '../../src/geometry/index.js';
import { validateDesign } from '../../src/params/index.js';
import { checkFrame, propDiscs, tipGaps, type PropDisc } from '../../src/checks/index.js';
import { designWith } from '../helpers/demo.js';

const frameWith = (patch: Record<string, unknown>) => buildFrame(validateDesign(designWith('tessel-5.yaml', patch)));
const gapOf = (discs: PropDisc[], a: string, b: string): number => tipGaps(discs).find((g) => (g.a === a && g.b === b) || (g.a === b && g.b === a))!.gapMm;
const rad = (d: number): number => (d * Math.PI) / 180;

describe('adjacent prop tip gaps', () => {
  it('square X, wheelbase 220 mm, 5" props → 28.6 mm (reference-values.md [CALC])', () => {
    const discs = propDiscs(frameWith({ layout: { kind: 'x', wheelbaseMm: 220, armAngleDeg: 45 }, props: { diameter: '5in' } }));
    // 220/√2 − 127 = 28.5635 mm.
    expect(gapOf(discs, 'front-left', 'front-right')).toBeCloseTo(220 / Math.SQRT2 - 127, 9);
    expect(gapOf(discs, 'front-left', 'rear-left')).toBeCloseTo(28.5635, 4);
    // The diagonal pair is the widest: 220 − 127.
    expect(tipGaps(discs).at(-1)!.gapMm).toBeCloseTo(93, 9);
  });

  it('squashed X (arms at 55° from forward), 4" props, computed by hand', () => {
    const discs = propDiscs(frameWith({ layout: { kind: 'x', wheelbaseMm: 220, armAngleDeg: 55 }, props: { diameter: '4in' } }));
    // Motors at (±110 cos 55°, ±110 sin 55°) = (±63.0934, ±90.1067); props 101.6 mm.
    // Front to rear on one side: 2 × 63.0934 − 101.6 = 24.5868; left to right: 2 × 90.1067 − 101.6 = 78.6134.
    expect(gapOf(discs, 'front-left', 'rear-left')).toBeCloseTo(2 * 110 * Math.cos(rad(55)) - 101.6, 9);
    expect(gapOf(discs, 'front-left', 'rear-left')).toBeCloseTo(24.5868, 4);
    expect(gapOf(discs, 'front-left', 'front-right')).toBeCloseTo(78.6134, 4);
  });

  it('asymmetric layout (front 105 mm at 55°, rear 120 mm at 40°), 5" props, computed by hand', () => {
    const discs = propDiscs(frameWith({ layout: { kind: 'asymmetric', wheelbaseMm: undefined, armAngleDeg: undefined, front: { reachMm: 105, angleDeg: 55 }, rear: { reachMm: 120, angleDeg: 40 } }, props: { diameter: '5in' } }));
    // Front-left (60.2255, 86.0110), rear-left (−91.9253, 77.1345): Δ = (152.1508, 8.8765),
    // |Δ| = √(23149.87 + 78.79) = 152.4095; gap = 152.4095 − 127 = 25.4095.
    const fl = [105 * Math.cos(rad(55)), 105 * Math.sin(rad(55))];
    const rl = [-120 * Math.cos(rad(40)), 120 * Math.sin(rad(40))];
    expect(gapOf(discs, 'front-left', 'rear-left')).toBeCloseTo(Math.hypot(fl[0] - rl[0], fl[1] - rl[1]) - 127, 9);
    expect(gapOf(discs, 'front-left', 'rear-left')).toBeCloseTo(25.4095, 3);
    // Across the front: 2 × 86.0110 − 127 = 45.0220; across the rear: 2 × 77.1345 − 127 = 27.2690.
    expect(gapOf(discs, 'front-left', 'front-right')).toBeCloseTo(45.022, 3);
    expect(gapOf(discs, 'rear-left', 'rear-right')).toBeCloseTo(27.269, 3);
  });
});

describe('prop-clearance rule (planted designs)', () => {
  it('camera side plates pushed far forward into the front prop discs are an error', () => {
    // A 30 mm camera: the right plate spans y −17 to −15 and, pushed 60 mm ahead, x 43 to 120; the
    // front-right motor sits at (118 cos 45°, −118 sin 45°) = (83.4386, −83.4386), so the plate's
    // nearest point is (83.4386, −17): 66.4386 mm − 64.77 mm prop radius = 1.6686 mm (by hand).
    const r = checkFrame(frameWith({ camera: { forwardOffsetMm: 60, widthMm: 30 } }));
    const f = r.findings.filter((x) => x.rule === 'prop-clearance' && x.parts?.[1]?.startsWith('camera-side'));
    expect(f.length).toBe(2);
    const byHand = 118 * Math.sin(Math.PI / 4) - 17 - 129.54 / 2;
    for (const x of f) {
      expect(x.severity).toBe('error');
      expect(x.measured).toBeCloseTo(byHand, 3);
    }
  });

  it('tip gap below props.minTipGapMm is an error between the two props', () => {
    // Wheelbase 190, 5.1" (129.54 mm): 190/√2 − 129.54 = 4.81 mm < 6 mm.
    const r = checkFrame(frameWith({ layout: { kind: 'x', wheelbaseMm: 190, armAngleDeg: 45 } }));
    const f = r.findings.filter((x) => x.rule === 'prop-clearance' && x.message.includes('prop tips'));
    expect(f.length).toBe(4);
    for (const x of f) {
      expect(x.severity).toBe('error');
      expect(x.measured).toBeCloseTo(190 / Math.SQRT2 - 129.54, 4);
      expect(x.limit).toBe(6);
    }
  });

  it('a standoff reaching the prop plane within 3 mm of a disc is an error', () => {
    // Round standoffs 5 mm across at (±52, ±21): motor (83.4386, 83.4386) to (52, 21) is
    // 69.9080 mm; minus 2.5 and the 64.77 mm prop radius leaves 2.6380 mm (by hand).
    const r = checkFrame(frameWith({ body: { standoffs: { shape: 'round', positionsMm: [[52, 21], [52, -21], [-52, 21], [-52, -21]] } } }));
    const f = r.findings.filter((x) => x.rule === 'prop-clearance' && x.parts?.[1]?.startsWith('standoff'));
    expect(f.length).toBe(4);
    const byHand = Math.hypot(118 * Math.cos(Math.PI / 4) - 52, 118 * Math.sin(Math.PI / 4) - 21) - 2.5 - 129.54 / 2;
    for (const x of f) {
      expect(x.severity).toBe('error');
      expect(x.measured).toBeCloseTo(byHand, 4);
      // The marker is the disc edge point nearest the standoff: on the line from the motor to the
      // standoff centre, so its distance to the standoff edge is the clearance itself (by hand).
      const [px, py] = x.atMm!;
      const s = [52 * Math.sign(px), 21 * Math.sign(py)];
      expect(Math.hypot(px - s[0], py - s[1]) - 2.5).toBeCloseTo(byHand, 3); // atMm is rounded to 4 decimals
      expect(Math.hypot(Math.abs(px) - 118 * Math.cos(Math.PI / 4), Math.abs(py) - 118 * Math.sin(Math.PI / 4))).toBeCloseTo(129.54 / 2, 3);
    }
  });
});
