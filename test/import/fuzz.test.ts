import { rng } from '../helpers/random.js';
import { describe, expect, it } from 'vitest';
import { DxfReadError, importDxf } from '../../src/import/index.js';
import { FUZZ_SOURCES as SOURCES, mutateDxfLines as mutate } from './helpers.js';


describe('fuzz: random mutations of valid files give parts and findings or a DxfReadError, never a crash', () => {
  // FUZZ_CASES=5000 runs a longer campaign locally; the suite keeps it to a few seconds.
  const CASES = Number(process.env.FUZZ_CASES ?? 300);
  it(`${CASES} seeded cases`, () => {
    let errors = 0;
    let results = 0;
    for (let seed = 1; seed <= CASES; seed++) {
      const r = rng(seed);
      const src = SOURCES[seed % SOURCES.length].split('\n');
      const text = mutate(src, r).join('\n');
      try {
        const out = importDxf(text, { name: 'fuzz', thicknessMm: 2 });
        results++;
        for (const p of out.parts) {
          for (const s of [...p.outline, ...p.features.flatMap((f) => f.loop)]) {
            const nums = s.kind === 'line' ? [...s.start, ...s.end] : [...s.center, s.radius, s.startRad, s.sweepRad];
            if (!nums.every(Number.isFinite)) throw new Error(`seed ${seed}: non-finite geometry`);
          }
        }
        for (const f of out.findings) if (!f.rule.startsWith('dxf-') || !f.message) throw new Error(`seed ${seed}: malformed finding`);
      } catch (e) {
        if (!(e instanceof DxfReadError)) throw new Error(`seed ${seed}: ${(e as Error).stack}`);
        expect(e.message.length).toBeGreaterThan(10);
        errors++;
      }
    }
    // Both outcomes occur: the mutations reach past the reader's first checks.
    expect(errors).toBeGreaterThan(10);
    expect(results).toBeGreaterThan(10);
  });
});
