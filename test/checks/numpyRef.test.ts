import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { checkOptions, checkParts } from '../../src/checks/index.js';
import { drilledPlateDxf, type HoleGrid } from '../../src/bench/plates.js';
import { importDxf } from '../../src/import/index.js';
import { pythonModuleAvailable, requireTool, SYSTEM_PYTHON } from '../helpers/reference.js';

const haveScipy = requireTool(pythonModuleAvailable('scipy'), 'python3-scipy');
const dir = mkdtempSync(join(tmpdir(), 'fw-numpy-'));

type Ref = { metrics: Record<string, number | null>; counts: Record<string, number>; findings: Array<{ rule: string; severity: string; measured: number; atMm: [number, number] }> };

/** The vectorised reference (numpy + scipy's k-d tree, test/reference/holes_numpy.py) on the same drawing. */
function reference(file: string): Ref {
  const r = spawnSync(SYSTEM_PYTHON, ['test/reference/holes_numpy.py', file, '--findings'], { input: '{}', encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.status !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout) as Ref;
}

describe.skipIf(!haveScipy)('drilled plates against a vectorised numpy/scipy reference', () => {
  const cases: Array<[string, HoleGrid]> = [
    // 4 mm webs: pitch/D warnings between neighbours and diagonals, e/D warnings along the edges.
    ['2,000 Ø6 holes on 10 mm', { holes: 2000, pitchMm: 10, diameterMm: 6 }],
    // 1.4 mm webs (error below 1.5 mm for a 2 mm plate) and e/D 1.25 (error below 1.5).
    ['600 Ø8 holes on 9.4 mm', { holes: 600, pitchMm: 9.4, diameterMm: 8 }],
    // Ø2.5 holes: smaller than the 3.175 mm bit (drill them), pitch 5 mm.
    ['900 Ø2.5 holes on 5 mm', { holes: 900, pitchMm: 5, diameterMm: 2.5 }],
  ];
  for (const [name, g] of cases) {
    it(`${name}: the same metrics, the same findings per rule and severity, at the same places`, () => {
      const file = join(dir, `${g.holes}-${g.diameterMm}.dxf`);
      const text = drilledPlateDxf(g);
      writeFileSync(file, text);
      const ours = checkParts(importDxf(text, { name: 'plate', thicknessMm: 2 }).parts, checkOptions({ toolDiameterMm: 3.175 }));
      const ref = reference(file);
      expect(ours.parts[0].metrics).toEqual(ref.metrics);
      const counts: Record<string, number> = {};
      for (const f of ours.findings) counts[`${f.rule}/${f.severity}`] = (counts[`${f.rule}/${f.severity}`] ?? 0) + 1;
      expect(counts).toEqual(ref.counts);
      // Every reference finding has one of ours of the same rule and severity at the same place with the same number.
      const key = (rule: string, sev: string, at: readonly number[] | null, m: number | null) => `${rule}|${sev}|${at?.map((x) => x.toFixed(3)).join(',')}|${m?.toFixed(3)}`;
      const mine = new Map<string, number>();
      for (const f of ours.findings) mine.set(key(f.rule, f.severity, f.atMm, f.measured), (mine.get(key(f.rule, f.severity, f.atMm, f.measured)) ?? 0) + 1);
      for (const f of ref.findings) {
        const k = key(f.rule, f.severity, f.atMm, f.measured);
        expect(mine.get(k) ?? 0, k).toBeGreaterThan(0);
        mine.set(k, mine.get(k)! - 1);
      }
    });
  }
});
