import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { motorSites } from '../../src/geometry/layout.js';
import { parseDesignText } from '../../src/params/design.js';
import { planVariant, minWheelbaseMm, tipGaps } from '../../src/variant/index.js';
import { adjacentGapFromRaw, demoText, propMmFromRaw, withSections } from './helpers.js';

// Layouts of every kind. A large tip gap (40 mm) makes the tip gap, not the body hardware, set the
// auto wheelbase, so the exact-gap property can be asserted.
const LAYOUTS: Record<string, unknown> = {
  'true X': { kind: 'x', wheelbaseMm: 224, armAngleDeg: 45 },
  'stretched X': { kind: 'x', wheelbaseMm: 240, armAngleDeg: 36 },
  'squashed X': { kind: 'x', wheelbaseMm: 240, armAngleDeg: 57 },
  H: { kind: 'h', wheelbaseMm: 250, armAngleDeg: 25, frontArmStartMm: [30, 12], rearArmStartMm: [-30, 12] },
  asymmetric: { kind: 'asymmetric', front: { reachMm: 105, angleDeg: 62 }, rear: { reachMm: 130, angleDeg: 38 } },
};

function designFor(layout: any, gapMm: number): string {
  const raw = YAML.parse(demoText('tessel-5'));
  return withSections(demoText('tessel-5'), { layout, props: { ...raw.props, minTipGapMm: gapMm } });
}

describe('auto wheelbase', () => {
  it('square X, 220 mm, 5in props: tip gap 28.6 mm', () => {
    // reference-values.md [CALC]: 220/√2 − 127 = 28.56 mm
    const d = parseDesignText(withSections(demoText('tessel-5'), { layout: { kind: 'x', wheelbaseMm: 220, armAngleDeg: 45 } }));
    const adj = tipGaps(motorSites(d), 127).filter((g) => g.adjacent);
    for (const g of adj) expect(g.gapMm).toBeCloseTo(220 / Math.SQRT2 - 127, 9);
    // and the inverse: (P + g)·√2 for a true X
    expect(minWheelbaseMm(d, 127, 220 / Math.SQRT2 - 127)).toBeCloseTo(220, 9);
  });

  for (const [name, layout] of Object.entries(LAYOUTS)) {
    for (const props of ['6in', '8in']) {
      it(`${name}, ${props}: exact with step 0, rounded up with step 1`, () => {
        const text = designFor(layout, 40);
        const exact = planVariant(text, { props, wheelbaseStepMm: 0 });
        expect(exact.wheelbase.bound).toBe('tip gap');
        const raw = YAML.parse(exact.text);
        const P = propMmFromRaw(raw.props.diameter);
        // computed independently from the written file: smallest adjacent gap equals the design's 40 mm
        // (asymmetric reaches are written to 0.001 mm, rounded up)
        const gap = adjacentGapFromRaw(raw.layout, P);
        expect(gap).toBeGreaterThanOrEqual(40 - 1e-9);
        expect(gap).toBeLessThan(40 + 0.003);
        // the shape is kept: angles untouched, reach ratio kept
        if (raw.layout.kind === 'asymmetric') {
          expect(raw.layout.front.angleDeg).toBe((layout as any).front.angleDeg);
          expect(raw.layout.front.reachMm / raw.layout.rear.reachMm).toBeCloseTo(105 / 130, 4);
        } else {
          expect(raw.layout.armAngleDeg).toBe((layout as any).armAngleDeg);
        }

        const stepped = planVariant(text, { props, wheelbaseStepMm: 1 });
        const w = stepped.wheelbase.chosenMm;
        expect(Number.isInteger(w)).toBe(true);
        expect(w).toBeGreaterThanOrEqual(exact.wheelbase.minimumMm);
        expect(w - exact.wheelbase.minimumMm).toBeLessThan(1);
        expect(adjacentGapFromRaw(YAML.parse(stepped.text).layout, P)).toBeGreaterThanOrEqual(40);
      });
    }
  }

  it('a wheelbase below the tip-gap minimum is refused, naming the minimum', () => {
    const text = designFor(LAYOUTS['true X'], 6);
    const min = (177.8 + 6) * Math.SQRT2; // true X: (P + g)·√2, 7in = 177.8 mm
    expect(() => planVariant(text, { props: '7in', wheelbase: 250 })).toThrow(new RegExp(`--wheelbase: 250 is below the clearance minimum ${min.toFixed(2)} mm`));
    expect(() => planVariant(text, { props: '7in', wheelbase: Math.ceil(min) })).not.toThrow();
  });
});
