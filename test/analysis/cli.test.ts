import { outputNames, runCli } from '../helpers/cli.js';
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { commandAvailable, requireTool } from '../helpers/reference.js';
import { REPO } from './helpers.js';
import { xmlProblem } from '../helpers/xml.js';

/** `framewright modes ...` through the built CLI (npm test builds dist/ first). */
const cli = (args: string[]) => runCli(['modes', ...args]);
const STACK = /^\s+at .+:\d+:\d+\)?$/m;

describe('framewright modes', () => {
  it('--json states thickness, material, mesh size, DOF and the masses used, and is deterministic', () => {
    const a = cli(['designs/mote-3.yaml', '--part', 'bottom-plate', '--modes', '3', '--json']);
    expect(a.code).toBe(0);
    const b = cli(['designs/mote-3.yaml', '--part', 'bottom-plate', '--modes', '3', '--json']);
    expect(b.stdout).toBe(a.stdout);
    const j = JSON.parse(a.stdout);
    expect(j.units.frequency).toBe('Hz');
    const d = j.designs[0];
    expect(d.motorMassG).toBeCloseTo(8.5, 6); // estimate for an 18 mm bell (common practice, no source)
    const free = d.parts[0];
    expect(free.thicknessMm).toBe(3);
    expect(free.material.e1Gpa).toBe(65);
    expect(free.meshSizeMm).toBeGreaterThan(0);
    expect(free.dof).toBeGreaterThan(1000);
    expect(free.rigidModes).toBe(6);
    expect(free.modes).toHaveLength(3);
    expect(free.modes[0].shape).toBeUndefined();
    // The unibody body model carries four motors and reports stack motion per mode.
    expect(d.body.addedMasses).toHaveLength(4);
    expect(d.body.modes[0].stack.displacementRatio).toBeGreaterThanOrEqual(0);
    expect(d.body.twist.twistDeg).toBeGreaterThan(0);
  }, 60_000);

  it('compares several designs side by side: the asymmetric layout shows its cost', () => {
    const r = cli(['test/analysis/fixtures/symmetric-unibody.yaml', 'test/analysis/fixtures/asymmetric-unibody.yaml', '--modes', '3', '--part', 'bottom-plate']);
    expect(r.code).toBe(0);
    const rows = r.stdout.split('\n').filter((l) => /^Mote 3 (a)?symmetric test/.test(l));
    expect(rows).toHaveLength(2);
    const col = (row: string) => row.replace(/^Mote 3 \w+ test\s+/, '').trim().split(/\s+/).map(Number);
    const [sym, asym] = rows.map(col);
    // columns: bottom plate 1st, body+motors 1st, alternating Hz, stack tilt, tip deflection, twist (arm column blank)
    expect(asym[1]).toBeLessThan(sym[1]);
    expect(asym[3]).toBeGreaterThan(sym[3]);
  }, 60_000);

  it('compares the assembled frames: first twist and bending modes of each layout and their change in % against the first design', () => {
    const r = cli(['test/analysis/fixtures/symmetric-unibody.yaml', 'test/analysis/fixtures/asymmetric-unibody.yaml', '--modes', '3']);
    expect(r.code).toBe(0);
    const row = (name: string) => r.stdout.split('\n').find((l) => l.startsWith(name))!;
    const sym = row('Mote 3 symmetric test').replace('Mote 3 symmetric test', '').trim().split(/\s+/).map(Number);
    const m = row('Mote 3 asymmetric test').match(/test\s+(\d+)\s+([+-]\d+(?:\.\d)?) %\s+(\d+)\s+([+-]\d+(?:\.\d)?) %/)!;
    expect(m).not.toBeNull();
    const [twist, twistChange, bending, bendingChange] = [Number(m[1]), Number(m[2]), Number(m[3]), Number(m[4])];
    // The asymmetric layout (short splayed front arms) twists and bends lower (domain.md, "Resonance in flight").
    expect(twist).toBeLessThan(sym[0]);
    expect(bending).toBeLessThan(sym[1]);
    // The change is (b − a) / a, worked from the printed whole hertz to within their rounding.
    expect(Math.abs(twistChange - (100 * (twist - sym[0])) / sym[0])).toBeLessThan(0.5);
    expect(Math.abs(bendingChange - (100 * (bending - sym[1])) / sym[1])).toBeLessThan(0.5);
  }, 120_000);

  it('--plot writes one SVG per mode that an independent renderer accepts', () => {
    const dir = mkdtempSync(join(tmpdir(), 'fw-modes-'));
    const r = cli(['designs/tessel-5.yaml', '--part', 'arm', '--modes', '2', '--plot', dir]);
    expect(r.code).toBe(0);
    const files = outputNames(dir);
    expect(files).toEqual(['arm-arm-root-clamped-mode1.svg', 'arm-arm-root-clamped-mode2.svg', 'arm-free-mode1.svg', 'arm-free-mode2.svg']);
    const svg = readFileSync(join(dir, files[0]), 'utf8');
    expect(svg).toMatch(/ Hz — Tessel 5 · arm · mode 1/);
    expect(svg).toMatch(/props off/);
    if (!requireTool(commandAvailable('rsvg-convert'), 'librsvg2-bin')) return;
    const png = spawnSync('rsvg-convert', [join(dir, files[0])], { encoding: 'buffer' });
    expect(png.status).toBe(0);
    expect(png.stdout.subarray(1, 4).toString()).toBe('PNG');
  }, 60_000);

  it('--plot draws each assembled-frame mode in plan (front up, with a front arrow and scale bar) and from the side, at rest and moved; well-formed and rendered by rsvg-convert', () => {
    const dir = mkdtempSync(join(tmpdir(), 'fw-modes-'));
    const r = cli(['designs/tessel-5.yaml', '--modes', '2', '--plot', dir]);
    expect(r.code).toBe(0);
    const files = outputNames(dir).filter((f) => f.startsWith('frame-'));
    expect(files).toEqual(['frame-mode1.svg', 'frame-mode2.svg']);
    const svg = readFileSync(join(dir, files[0]), 'utf8');
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toMatch(/Hz — Tessel 5 · assembled frame · mode 1/);
    expect(svg).toMatch(/body twist/);
    for (const id of ['plan-rest', 'plan-moved', 'side-rest', 'side-moved', 'plan-foot', 'side-foot']) expect(svg).toContain(`id="${id}"`);
    expect(svg).toContain('class="scale-bar"');
    expect(svg).toMatch(/>front</);
    expect(svg).toMatch(/the largest motion drawn as \d+ mm/);
    // Plan view, front up: the front motors' labels sit above the rear ones (smaller y in SVG); body twist moves diagonal pairs opposite ways.
    const label = (site: string) => svg.match(new RegExp(`<text[^>]* y="([^"]+)"[^>]*>${site}, (up|down) `))!;
    expect(Number(label('front-left')[1])).toBeLessThan(Number(label('rear-left')[1]));
    expect(label('front-left')[2]).toBe(label('rear-right')[2]);
    expect(label('front-left')[2]).not.toBe(label('front-right')[2]);
    if (!requireTool(commandAvailable('rsvg-convert'), 'librsvg2-bin')) return;
    const png = spawnSync('rsvg-convert', [join(dir, files[0])], { encoding: 'buffer' });
    expect(png.status).toBe(0);
    expect(png.stdout.subarray(1, 4).toString()).toBe('PNG');
  }, 120_000);

  it('bad input: a clear message naming the flag, exit 2, no stack trace, nothing written', () => {
    const dir = join(mkdtempSync(join(tmpdir(), 'fw-modes-')), 'plots');
    for (const args of [
      ['designs/tessel-5.yaml', '--modes', '0', '--plot', dir],
      ['designs/tessel-5.yaml', '--mesh-size', 'fine'],
      ['designs/tessel-5.yaml', '--part', 'wing'],
      ['no-such-file.yaml'],
    ]) {
      const r = cli(args);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/--modes|--mesh-size|--part|cannot read/);
      expect(r.stderr).not.toMatch(STACK);
    }
    expect(() => readdirSync(dir)).toThrow();
  }, 60_000);
});

describe('framewright modes on a DXF drawing', () => {
  it('a part written to DXF and read back gives the same free–free modes as the part itself (thickness from --thickness)', async () => {
    const { partToDxf } = await import('../../src/export/dxf.js');
    const { partModes } = await import('../../src/analysis/index.js');
    const { writeFileSync } = await import('node:fs');
    const { demoFrame } = await import('./helpers.js');
    const top = demoFrame('tessel-5.yaml').parts.find((p) => p.name === 'top-plate')!;
    const dir = mkdtempSync(join(tmpdir(), 'fw-modes-dxf-'));
    const file = join(dir, 'top.dxf');
    writeFileSync(file, partToDxf(top));
    const r = cli([file, '--thickness', String(top.thicknessMm), '--modes', '3', '--json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const got = JSON.parse(r.stdout).designs[0].parts[0].modes.map((m: { frequencyHz: number }) => m.frequencyHz);
    const want = partModes(top, { modes: 3 }).modes.map((m) => m.frequencyHz);
    got.forEach((f: number, i: number) => expect(Math.abs(f / want[i] - 1)).toBeLessThan(0.01));
    // Without a thickness the command refuses rather than guessing.
    const bad = cli([file]);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--thickness/);
  }, 60_000);
});
