import { describe, expect, it } from 'vitest';
import { armModes } from '../../src/analysis/index.js';
import { demoFrame } from './helpers.js';

describe('mode words', () => {
  it('an arm held at its root with its motor: out-of-plane bending first, then sideways bending and twist', () => {
    // Ordering cross-checked with the CalculiX frequencies of the same arm (ccx.test.ts): 207 / 597 / 707 Hz.
    const frame = demoFrame('tessel-5.yaml');
    const arm = frame.parts.find((p) => p.role === 'arm')!;
    const r = armModes(arm, { modes: 3, motorMassG: frame.design.motorMassG });
    expect(r.modes.map((m) => m.description)).toEqual(['arm bending out of plane, 1st', 'arm bending in plane (sideways), 1st', 'arm twist, 1st']);
    expect(r.modes.map((m) => m.plane)).toEqual(['out-of-plane', 'in-plane', 'out-of-plane']);
  });

});
