import { rng } from '../helpers/random.js';
import { describe, expect, it } from 'vitest';
import { DxfReadError, importDxf } from '../../src/import/index.js';
import { fixtureText } from './helpers.js';


const SOURCES = ['line-arc-plate.dxf', 'bulge-arm-r12.dxf', 'blocks.dxf', 'splines.dxf', 'duplicate.dxf', 'annotation.dxf'].map(fixtureText);
const NASTY = ['', '-1', '0', '1e308', '-1e308', 'NaN', '1e-320', '999999999', 'SECTION', 'ENDSEC', 'EOF', 'INSERT', 'POLYLINE', 'VERTEX', 'SEQEND', 'BLOCK', 'ENDBLK', '\u0000', 'é', '3.5', '100000'];

/** One random mutation of the lines of a valid file. */
function mutate(lines: string[], r: () => number): string[] {
  const out = [...lines];
  const pick = () => Math.floor(r() * out.length);
  const kind = Math.floor(r() * 7);
  const times = 1 + Math.floor(r() * 4);
  for (let k = 0; k < times; k++) {
    const i = pick();
    switch (kind) {
      case 0:
        out.splice(i, 1 + Math.floor(r() * 3));
        break;
      case 1:
        out.splice(i, 0, ...out.slice(pick(), pick() + 1 + Math.floor(r() * 12)));
        break;
      case 2:
        out[i] = NASTY[Math.floor(r() * NASTY.length)];
        break;
      case 3:
        out[i] = String((r() - 0.5) * 10 ** Math.floor(r() * 12));
        break;
      case 4:
        out.length = i;
        break;
      case 5: {
        const j = pick();
        [out[i], out[j]] = [out[j], out[i]];
        break;
      }
      default:
        out[i] = String(Math.floor(r() * 1100));
        break;
    }
  }
  return out;
}

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
