import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { defaultMeshSizeMm, meshPart } from '../../src/analysis/index.js';
import { MAX_MESH_NODES, meshNodeEstimate } from '../../src/analysis/meshLimit.js';
import { drilledPlateDxf, METRE_PLATE, SQUARES_PLATE } from '../../src/bench/plates.js';
import { DEFAULT_LIMITS } from '../../src/import/index.js';
import { runCli, STACK_LINE } from '../helpers/cli.js';
import { demoFrame } from '../quote/fixtures.js';

const dir = mkdtempSync(join(tmpdir(), 'fw-limits-'));
const file = (name: string, text: string) => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};

function expectRefused(r: { code: number; stdout: string; stderr: string }, limit: RegExp): void {
  expect(r.code).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr).not.toMatch(STACK_LINE);
  expect(r.stderr.trim().split('\n')).toHaveLength(1);
  expect(r.stderr).toMatch(limit);
}

describe('input limits: refused with the limit named, exit 2, nothing written', () => {
  const metre = file('metre.dxf', drilledPlateDxf(METRE_PLATE));
  const squares = file('squares.dxf', drilledPlateDxf(SQUARES_PLATE));

  it(`check: a 1 m plate with 99,999 holes is beyond the ${DEFAULT_LIMITS.maxContours} contours of one drawing`, () => {
    const out = join(dir, 'annotated');
    expectRefused(runCli(['check', metre, '--thickness', '2', '--annotate', out]), /at least 99999 closed contours \(outlines and holes\), more than 50000, the reader's limit/);
    expect(readdirSync(dir)).not.toContain('annotated');
  });

  it(`modes: every line and arc needs a mesh node, and one model has at most ${MAX_MESH_NODES}`, () => {
    expectRefused(runCli(['modes', metre, '--thickness', '2']), /at least 99999 closed contours/);
    expectRefused(runCli(['modes', squares, '--thickness', '2']), /the drawing has 100008 drawn entities: more than 20000 lines and arcs, the limit here: modes meshes at most 20000 nodes in one model/);
  });

  it('modes: a design meshed finer than the node limit allows is refused before meshing, with what to change', () => {
    const r = runCli(['modes', 'designs/tessel-5.yaml', '--mesh-size', '0.3']);
    expectRefused(r, /the mesh of [a-z-]+ would have about \d+ nodes \(\d+ holes\), more than the 20000 of one model; analyse one part \(--part\), use a coarser --mesh-size/);
  });

  it('the node estimate never falls short of the mesh actually made, and errs high by under 25 % (every demo part, default and 1 mm sizes)', () => {
    for (const design of ['tessel-5', 'mote-3', 'farline-7']) {
      for (const part of demoFrame(design).parts) {
        for (const size of [defaultMeshSizeMm(part), 1]) {
          const ratio = meshNodeEstimate(part, size) / (meshPart(part, size).xy.length / 2);
          expect(ratio).toBeGreaterThanOrEqual(1);
          expect(ratio).toBeLessThan(1.25);
        }
      }
    }
  });
});
