import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { importDxf, type ImportOptions, type ImportResult } from '../../src/import/index.js';
import { REPO } from '../helpers/demo.js';

export const FIXTURES = join(REPO, 'test', 'fixtures', 'dxf');
export const fixturePath = (name: string): string => join(FIXTURES, name);
export const fixtureText = (name: string): string => readFileSync(fixturePath(name), 'latin1');

/** Import a committed fixture (written by python3-ezdxf, see make_fixtures.py). */
export function importFixture(name: string, options: Partial<ImportOptions> = {}): ImportResult {
  return importDxf(fixtureText(name), { name: name.replace(/\.dxf$/, ''), thicknessMm: 2, ...options });
}

export const rules = (r: ImportResult): string[] => r.findings.map((f) => f.rule);

/** Fixtures the fuzz tests mutate (test/import/fuzz.test.ts, test/fuzz/dxf.test.ts). */
export const FUZZ_SOURCES = ['line-arc-plate.dxf', 'bulge-arm-r12.dxf', 'blocks.dxf', 'splines.dxf', 'duplicate.dxf', 'annotation.dxf'].map(fixtureText);
const NASTY = ['', '-1', '0', '1e308', '-1e308', 'NaN', '1e-320', '999999999', 'SECTION', 'ENDSEC', 'EOF', 'INSERT', 'POLYLINE', 'VERTEX', 'SEQEND', 'BLOCK', 'ENDBLK', '\u0000', 'é', '3.5', '100000'];

/** One random mutation of the lines of a valid file. */
export function mutateDxfLines(lines: string[], r: () => number): string[] {
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
