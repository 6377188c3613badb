import { describe, expect, it } from 'vitest';
import YAML, { isPair, isScalar, parseDocument, visit } from 'yaml';
import { editDesignText, makeVariant } from '../../src/variant/index.js';
import { demoText } from './helpers.js';
import { propBodyClearanceMm } from '../../src/variant/body.js';
import { parseDesignText } from '../../src/params/index.js';
import { yamlComments as comments } from '../helpers/yaml.js';


/** Key paths in document order. */
function keyOrder(text: string): string[] {
  const out: string[] = [];
  visit(parseDocument(text), {
    Pair: (_k, pair, path) => {
      if (isPair(pair) && isScalar(pair.key)) {
        const keys = path.filter(isPair).map((p) => String((p.key as { value: unknown }).value));
        out.push([...keys, String(pair.key.value)].join('.'));
      }
    },
  });
  return out;
}

const COMMENTED = `# Test frame — header comment survives
name: Test X # the name
layout:
  kind: x
  # wheelbase is the diagonal
  wheelbaseMm: 224 # set by the tip gap
  armAngleDeg: 45
`;

/** Length of the longest common subsequence of two line lists (dynamic programming). */
function commonLines(a: readonly string[], b: readonly string[]): number {
  let prev = new Array<number>(b.length + 1).fill(0);
  for (const x of a) {
    const row = [0];
    for (let j = 0; j < b.length; j++) row.push(x === b[j] ? prev[j] + 1 : Math.max(prev[j + 1], row[j]));
    prev = row;
  }
  return prev[b.length];
}

describe('design file edits keep comments and key order', () => {
  it('a value changes in place; its trailing comment and every other byte stay', () => {
    const out = editDesignText(COMMENTED, [{ path: ['layout', 'wheelbaseMm'], old: 224, new: 261.5, why: '' }]);
    expect(out).toBe(COMMENTED.replace('wheelbaseMm: 224 #', 'wheelbaseMm: 261.5 #'));
  });

  it('a missing key is a new line after the last entry of its map, at its indentation; every other byte stays', () => {
    const out = editDesignText(COMMENTED, [{ path: ['layout', 'weaveDeg'], old: undefined, new: 45, why: '' }]);
    expect(YAML.parse(out).layout.weaveDeg).toBe(45);
    expect(out.replace(/\n {2}weaveDeg: 45/, '')).toBe(COMMENTED);
  });

  it('a missing key is appended to its map; comments survive', () => {
    const out = editDesignText(COMMENTED, [{ path: ['layout', 'extraMm'], old: undefined, new: [16, 19], why: '' }]);
    expect(YAML.parse(out).layout.extraMm).toEqual([16, 19]);
    expect(comments(out)).toEqual(comments(COMMENTED));
  });

  for (const demo of ['tessel-5', 'mote-3', 'farline-7']) {
    it(`${demo}: every comment and the key order survive a variant (yaml's own parser)`, () => {
      const src = demoText(demo);
      const v = makeVariant(src, { props: '6in', motor: 'auto' });
      expect(comments(v.text)).toEqual(comments(src));
      // order of the source's keys is unchanged (new keys may only follow)
      const before = keyOrder(src);
      const after = keyOrder(v.text);
      expect(after.filter((k) => before.includes(k))).toEqual(before);
      // lines not touched by a change are byte-identical: at most one source line per change is
      // missing from the longest common subsequence of lines (added keys only insert lines)
      const changed = v.changes.length;
      const diff = src.split('\n').length - commonLines(src.split('\n'), v.text.split('\n'));
      expect(diff).toBeLessThanOrEqual(changed);
    });
  }

  it('a JSON design stays JSON-readable after an edit', () => {
    const json = JSON.stringify(YAML.parse(demoText('tessel-5')), null, 2);
    const v = makeVariant(json, { props: '6in' });
    const parsed = JSON.parse(v.text);
    expect(parsed.props.diameter).toBe('6in');
    expect(parsed.layout.wheelbaseMm).toBe(v.wheelbase.chosenMm);
  });
});

describe('stability', () => {
  it('a variant of a variant at the same size changes nothing (byte-identical)', () => {
    for (const [demo, props] of [['tessel-5', '7in'], ['farline-7', '5in'], ['mote-3', '4in']]) {
      const v1 = makeVariant(demoText(demo), { props });
      const v2 = makeVariant(v1.text, { props });
      expect(v2.changes).toEqual([]);
      expect(v2.text).toBe(v1.text);
    }
  });

  it('there and back: 5.1in → 7in → 5.1in comes back to the same-size variant\'s rule and section', () => {
    // The 7-inch arm meets its rule with some to spare (widths rounded up, roots moved out for room),
    // so the return trip asks at least what the direct same-size variant asks; the layout shape, body
    // and hardware come back exactly.
    const src = demoText('tessel-5');
    const a = YAML.parse(src);
    const direct = makeVariant(src, { props: '5.1in' });
    const trip = makeVariant(makeVariant(src, { props: '7in' }).text, { props: '5.1in' });
    const back = YAML.parse(trip.text);
    // the return trip asks the 7-inch arm's f1 scaled back by the band's 1/D (7 / 5.1), at least what the direct variant asks
    const seven = makeVariant(src, { props: '7in' });
    expect(trip.arms.rule.requiredHz).toBeCloseTo((seven.arms.measure.frequencyHz * 177.8) / (5.1 * 25.4), 9);
    expect(trip.arms.rule.requiredHz / direct.arms.rule.requiredHz).toBeGreaterThanOrEqual(1 - 1e-12);
    expect(trip.arms.measure.frequencyHz).toBeGreaterThanOrEqual(trip.arms.rule.requiredHz);
    expect(back.layout.armAngleDeg).toBe(a.layout.armAngleDeg);
    expect(back.layout.wheelbaseMm).toBeGreaterThanOrEqual(YAML.parse(direct.text).layout.wheelbaseMm);
    // The 7-inch variant is widened until the checks' prop-clearance rule passes (camera side
    // plates), so its props clear the standoffs by more than the source's; the way back keeps that
    // clearance up to the tip gap. The motor moves Δwb/2 along its diagonal, which opens the gap to
    // hardware near the centre by at least half that: Δwb ≤ 2 × (tip gap − source clearance) + one step.
    const sourceClearance = propBodyClearanceMm(parseDesignText(src), parseDesignText(src).props.diameterMm).clearanceMm;
    expect(back.layout.wheelbaseMm - a.layout.wheelbaseMm).toBeLessThanOrEqual(Math.max(0, 2 * (a.props.minTipGapMm - sourceClearance)) + 1);
    expect(back.body).toEqual(a.body);
    // the same motor (class, pattern, mass); its bore follows the arm plate chosen (web rule)
    const { boreMm: _tripBore, ...tripMotor } = trip.design.motor;
    const { boreMm: _directBore, ...directMotor } = direct.design.motor;
    expect(tripMotor).toEqual(directMotor);
  });

  it('same input, same bytes', () => {
    const src = demoText('farline-7');
    expect(makeVariant(src, { props: '6in' }).text).toBe(makeVariant(src, { props: '6in' }).text);
  });
});

describe('block-style lists (regression: a replaced block list swallowed the next key)', () => {
  it('a block list replaced by a flow list keeps the file valid and the next key in place', () => {
    const text = ['motor:', '  boltCircleMm:', '    - 12', '  boltSize: M2 # keep', 'name: x', ''].join('\n');
    const out = editDesignText(text, [{ path: ['motor', 'boltCircleMm'], old: [12], new: [16], why: 't' }]);
    const parsed = YAML.parse(out);
    expect(parsed.motor).toEqual({ boltCircleMm: [16], boltSize: 'M2' });
    expect(out).toContain('boltSize: M2 # keep');
  });
  it('a variant of a design written with block lists reads back', () => {
    const src = demoText('mote-3').replace('boltCircleMm: [12]', 'boltCircleMm:\n    - 12');
    expect(src).toContain('    - 12');
    const v = makeVariant(src, { props: '6in', motor: 'auto' });
    expect(YAML.parse(v.text).motor.boltSize).toBe('M3');
  });
});
