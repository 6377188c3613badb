import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cantileverFrequencyHz, type CantileverBeam } from '../../src/analysis/beam.js';
import { makeVariant } from '../../src/variant/index.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';
import { demoText } from './helpers.js';

/**
 * First natural frequency of a clamped beam with a tip mass from CalculiX (an independent finite
 * element program): 20 quadratic beam elements (B32, expanded by ccx to 20-node bricks), a MASS
 * element at the tip, units mm / N / tonne. Lowest mode = bending through the thickness (width > t).
 */
function ccxFirstFrequencyHz(b: CantileverBeam): number {
  const dir = mkdtempSync(join(tmpdir(), 'fw-ccx-'));
  const n = 20;
  const lines = ['*NODE'];
  for (let i = 0; i <= 2 * n; i++) lines.push(`${i + 1}, ${((b.lengthMm * i) / (2 * n)).toFixed(6)}, 0, 0`);
  lines.push('*ELEMENT, TYPE=B32, ELSET=BEAM');
  for (let e = 0; e < n; e++) lines.push(`${e + 1}, ${2 * e + 1}, ${2 * e + 2}, ${2 * e + 3}`);
  lines.push('*ELEMENT, TYPE=MASS, ELSET=TIP', `${n + 1}, ${2 * n + 1}`, '*MASS, ELSET=TIP', (b.tipMassG * 1e-6).toExponential(9));
  lines.push('*MATERIAL, NAME=CF', '*ELASTIC', `${(b.modulusGpa * 1000).toFixed(6)}, 0.07`, '*DENSITY', (b.densityGPerCm3 * 1e-9).toExponential(9));
  // RECT: first dimension along local axis 1, given as the global z direction: the plate thickness.
  lines.push('*BEAM SECTION, ELSET=BEAM, MATERIAL=CF, SECTION=RECT', `${b.thicknessMm.toFixed(6)}, ${b.widthMm.toFixed(6)}`, '0, 0, 1');
  lines.push('*BOUNDARY', '1, 1, 6', '*STEP', '*FREQUENCY', '2', '*END STEP');
  writeFileSync(join(dir, 'arm.inp'), `${lines.join('\n')}\n`);
  const r = spawnSync('ccx', ['arm'], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
  if (r.status !== 0) throw new Error(`ccx failed in ${dir} (${r.status} ${r.signal} ${r.error}): ${r.stderr || r.stdout}`);
  const dat = readFileSync(join(dir, 'arm.dat'), 'utf8');
  const m = /^\s+1\s+\S+\s+\S+\s+(\S+)/m.exec(dat.slice(dat.indexOf('E I G E N V A L U E   O U T P U T')));
  return Number(m![1]);
}

describe('cantilever with tip mass against CalculiX', () => {
  it('worked arm (reference-values.md: 128.72 Hz) within 1 %', () => {
    if (!requireTool(commandAvailable('ccx'), 'ccx (calculix-ccx)')) return;
    const arm = { lengthMm: 100, widthMm: 12, thicknessMm: 5, modulusGpa: 65, densityGPerCm3: 1.6, tipMassG: 35 };
    const fe = ccxFirstFrequencyHz(arm);
    expect(Math.abs(fe / cantileverFrequencyHz(arm) - 1)).toBeLessThan(0.01);
  });

  it('a variant arm: the frequency the rule prints matches CalculiX within 1 %', () => {
    if (!requireTool(commandAvailable('ccx'), 'ccx (calculix-ccx)')) return;
    const v = makeVariant(demoText('farline-7'), { props: '6in' });
    const beam = v.arms.measure.beam;
    expect(beam.widthMm).toBeGreaterThan(beam.thicknessMm);
    const fe = ccxFirstFrequencyHz(beam);
    expect(Math.abs(fe / v.arms.measure.frequencyHz - 1)).toBeLessThan(0.01);
  });
});
