import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { woffToSfnt } from '../../src/export/woff.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';

const require = createRequire(import.meta.url);
const SCRIPT = new URL('../reference/woff_tables.py', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'fw-woff-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

type Tables = {
  woffFlavor: string | null;
  ttfFlavor: string | null;
  woff: Record<string, string>;
  ttf: Record<string, string>;
  offsetTable: { numTables: number; searchRange: number; entrySelector: number; rangeShift: number };
  unitsPerEm: number;
  glyphs: number;
  advanceOfA: number;
};

describe('the drawing font unpacked from WOFF (fontTools, Debian python3-fonttools, as the reference)', () => {
  for (const weight of [400, 700]) {
    it(`DejaVu Sans ${weight}: every table as fontTools unpacks it, a well-formed offset table, readable by fontTools`, () => {
      if (!requireTool(pythonModuleAvailable('fontTools'), 'python3-fonttools')) return;
      const woffPath = require.resolve(`@fontsource/dejavu-sans/files/dejavu-sans-latin-${weight}-normal.woff`);
      const ttfPath = join(dir, `${weight}.ttf`);
      writeFileSync(ttfPath, woffToSfnt(readFileSync(woffPath)));
      const r = runPythonJson<Tables>(SCRIPT, {}, [woffPath, ttfPath]);
      expect(r.woffFlavor).toBe('woff');
      expect(r.ttfFlavor).toBeNull();
      expect(Object.keys(r.ttf).length).toBeGreaterThan(8);
      expect(r.ttf).toEqual(r.woff);
      // OpenType spec, offset table: searchRange = 16 × the largest power of two ≤ numTables, and so on.
      const n = r.offsetTable.numTables;
      const p = 2 ** Math.floor(Math.log2(n));
      expect(r.offsetTable).toEqual({ numTables: n, searchRange: 16 * p, entrySelector: Math.log2(p), rangeShift: 16 * n - 16 * p });
      // DejaVu Sans is drawn on a 2048-unit em (from memory); the parsed tables make sense.
      expect(r.unitsPerEm).toBe(2048);
      expect(r.glyphs).toBeGreaterThan(100);
      expect(r.advanceOfA).toBeGreaterThan(0);
    });
  }

  it('bytes that are not a WOFF font are refused with what is wrong', () => {
    expect(() => woffToSfnt(new Uint8Array(10))).toThrow(/not a well-formed WOFF 1.0 font: 10 bytes/);
    expect(() => woffToSfnt(new Uint8Array(64))).toThrow(/no "wOFF" signature/);
    const real = readFileSync(require.resolve('@fontsource/dejavu-sans/files/dejavu-sans-latin-400-normal.woff'));
    expect(() => woffToSfnt(real.subarray(0, real.length - 100))).toThrow(/runs past the end of the file/);
  });
});
