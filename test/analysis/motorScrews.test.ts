import { describe, expect, it } from 'vitest';
import { armModes, frameModes } from '../../src/analysis/index.js';
import { ISO_4762_M3X8 } from '../helpers/screws.js';
import { demoFrame } from './helpers.js';

// One ISO 4762 M3 × 8 socket head cap screw of 7.9 g/cm³ steel, weighed by hand (test/helpers/screws.ts).
const M3X8_G = ISO_4762_M3X8.massG;

describe('an arm as built carries its motor and the screws that hold it', () => {
  const tessel = demoFrame('tessel-5.yaml');
  const r = frameModes(tessel, { modes: 1, assembled: false });
  const arm = r.arms[0].modal;

  it('Tessel 5: four M3 × 8 motor screws per arm (designs/tessel-5.yaml: boltCount 4, M3), 4 × 0.8542 g by hand, beside the 32 g motor', () => {
    expect(M3X8_G).toBeCloseTo(0.8542, 4);
    const added = Object.fromEntries(arm.addedMasses.map((m) => [m.what, m.massG]));
    expect(added['motor']).toBe(32);
    expect(added['motor screws']).toBeCloseTo(4 * M3X8_G, 3);
  });

  it('the screws ride in the motor’s rigid body: the same modes as a motor that weighs both', () => {
    const part = tessel.parts.find((p) => p.role === 'arm')!;
    const motor = { bellDiameterMm: 28, heightMm: 19 };
    const split = armModes(part, { modes: 2, motorMassG: 32, motorScrewsG: 4 * M3X8_G, motor });
    const whole = armModes(part, { modes: 2, motorMassG: 32 + 4 * M3X8_G, motor });
    expect(split.modes.map((m) => m.frequencyHz)).toEqual(whole.modes.map((m) => m.frequencyHz));
    expect(split.modes[0].frequencyHz).toBeCloseTo(arm.modes[0].frequencyHz, 6);
  });

  it('Mote 3 (one-piece): the plate carries each motor with its screws, and heavier motors lower the first mode', () => {
    const mote = frameModes(demoFrame('mote-3.yaml'), { modes: 1, assembled: false });
    const bare = frameModes(demoFrame('mote-3.yaml'), { modes: 1, assembled: false, motorScrewsG: 0 });
    const perMotor = mote.body!.modal.addedMasses.filter((m) => m.what.startsWith('motor')).map((m) => m.massG);
    expect(perMotor).toHaveLength(4);
    for (const g of perMotor) expect(g).toBeGreaterThan(mote.motorMassG);
    expect(mote.body!.modal.modes[0].frequencyHz).toBeLessThan(bare.body!.modal.modes[0].frequencyHz);
  });
});
