import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import YAML from 'yaml';
import { describe, expect, it } from 'vitest';
import { DESIGNS_DIR, designWith } from '../helpers/demo.js';
import { runCli, STACK_LINE } from '../helpers/cli.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';

const tmp = () => mkdtempSync(join(tmpdir(), 'fw-assembly-'));
const tessel = join(DESIGNS_DIR, 'tessel-5.yaml');
const hasRsvg = requireTool(commandAvailable('rsvg-convert'), 'rsvg-convert');

function writeDesign(patch: Record<string, unknown>): string {
  const file = join(tmp(), 'planted.yaml');
  writeFileSync(file, YAML.stringify(designWith('tessel-5.yaml', patch)));
  return file;
}

const componentsWith = (i: number, patch: Record<string, unknown> | null): Record<string, unknown>[] => {
  const list = (YAML.parse(readFileSync(tessel, 'utf8')) as { components: Record<string, unknown>[] }).components;
  return patch === null ? list : list.map((c, k) => (k === i ? { ...c, ...patch } : c));
};

describe('build writes the assembly (the built CLI)', () => {
  it('hardware.csv, hardware.json, assembly.json, side.svg, front.svg; mass and CG printed; byte-identical twice', () => {
    const a = join(tmp(), 'a');
    const b = join(tmp(), 'b');
    const r = runCli(['build', tessel, '--out', a]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/mass: frame [\d.]+ g, hardware [\d.]+ g, motors 128\.0 g, components 44\.0 g, battery 180\.0 g; all-up [\d.]+ g/);
    expect(r.stdout).toMatch(/centre of gravity \([-\d.]+, -?0\.0, [\d.]+\) mm; thrust centre \(0\.0, 0\.0\) mm; offset [\d.]+ mm/);
    expect(runCli(['build', tessel, '--out', b]).code).toBe(0);
    for (const f of ['hardware.csv', 'hardware.json', 'assembly.json', 'side.svg', 'front.svg']) {
      expect(readFileSync(join(a, f), 'utf8'), f).toBe(readFileSync(join(b, f), 'utf8'));
    }
    const asm = JSON.parse(readFileSync(join(a, 'assembly.json'), 'utf8'));
    expect(Object.keys(asm.massG)).toEqual(['frame', 'hardware', 'motors', 'components', 'battery', 'allUp']);
    expect(asm.cgMm).toHaveLength(3);
    expect(asm.thrustCentreMm).toEqual([0, 0]);
    expect(asm.inertiaGMm2).toHaveLength(3);
    // Each joint says what its screw, nut and washer weigh and where (for tools that model the frame
    // themselves, such as the CalculiX reference); with the spacers they make up the hardware mass.
    type J = { hardwareMassG: number; hardwareCgMm: number[]; hardwareInertiaGMm2: number[][]; headAtMm: number[] };
    const joints: J[] = asm.joints;
    const spacers = asm.standoffs.reduce((s: number, so: { massG: number }) => s + so.massG, 0);
    expect(joints.reduce((s, j) => s + j.hardwareMassG, 0) + spacers).toBeCloseTo(asm.massG.hardware, 2);
    for (const j of joints) {
      expect(j.hardwareCgMm).toHaveLength(3);
      expect(j.hardwareInertiaGMm2.flat()).toHaveLength(9);
      // Along the screw's axis (Tessel 5's screws run along z or y).
      expect(Math.min(Math.hypot(j.hardwareCgMm[0] - j.headAtMm[0], j.hardwareCgMm[1] - j.headAtMm[1]), Math.hypot(j.hardwareCgMm[0] - j.headAtMm[0], j.hardwareCgMm[2] - j.headAtMm[2]))).toBeLessThan(1e-3);
    }
    const hw = JSON.parse(readFileSync(join(a, 'hardware.json'), 'utf8'));
    for (const item of hw.items) expect(Object.keys(item)).toEqual(['item', 'standard', 'size', 'lengthMm', 'count', 'countPerBatch', 'use']);
    // Motor screws: 5 mm arm + 1 × d (3 mm) of thread = 8 mm, an ISO 4762 preferred length, 4 per motor.
    const motor = hw.items.find((i: { use: string }) => i.use === 'motor to arm');
    expect(motor).toMatchObject({ item: 'socket head cap screw', standard: 'ISO 4762', size: 'M3', lengthMm: 8, count: 16 });
    // Arm roots: brace 2 + arm 5 + bottom plate 2.5 + ISO 7040 nut 4 + one 0.5 mm thread = 14 → 16 mm.
    expect(hw.items.find((i: { use: string; standard: string }) => i.use === 'arm root clamp' && i.standard === 'ISO 4762')).toMatchObject({ lengthMm: 16, count: 8 });
    expect(hw.items.find((i: { use: string; standard: string }) => i.use === 'arm root clamp' && i.standard === 'ISO 7040')).toMatchObject({ lengthMm: null, count: 8 });
    // The CSV says the same as the JSON, line for line.
    const csv = readFileSync(join(a, 'hardware.csv'), 'utf8').trim().split('\n');
    expect(csv[0]).toBe('item,standard,size,lengthMm,count,countPerBatch,use');
    expect(csv).toHaveLength(hw.items.length + 1);
  });

  it.runIf(hasRsvg)('the side and front views are SVG at 1:1 that an independent renderer draws', () => {
    const dir = join(tmp(), 'v');
    expect(runCli(['build', tessel, '--out', dir]).code).toBe(0);
    for (const v of ['side', 'front']) {
      const svg = readFileSync(join(dir, `${v}.svg`), 'utf8');
      const m = /width="([\d.]+)mm" height="([\d.]+)mm" viewBox="[-\d.]+ [-\d.]+ ([\d.]+) ([\d.]+)"/.exec(svg)!;
      // One user unit is one millimetre (CSS Values 3: 1 mm = 96/25.4 px).
      expect(m[1]).toBe(m[3]);
      expect(m[2]).toBe(m[4]);
      const png = spawnSync('rsvg-convert', ['-w', '400', join(dir, `${v}.svg`)], { encoding: 'buffer' });
      expect(png.status).toBe(0);
      expect(png.stdout.subarray(1, 4).toString()).toBe('PNG');
      // The stack-up heights are dimensioned: plate gap 25, top plate 2, bottom plate 2.5.
      for (const h of ['>25<', '>2.5<', '>2<']) expect(svg).toContain(h);
    }
  });

  it('check prints mass and balance after the report', () => {
    const r = runCli(['check', tessel]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/all-up [\d.]+ g\ncentre of gravity/);
  });

  it('a design without components still builds (no stack, battery or camera body: no board rules, frame and hardware only)', () => {
    const dir = join(tmp(), 'bare');
    const r = runCli(['build', writeDesign({ components: undefined }), '--out', dir]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/components 0\.0 g, battery 0\.0 g/);
    expect(JSON.parse(readFileSync(join(dir, 'assembly.json'), 'utf8')).components).toEqual([]);
  });
});

describe('bad input: a clear message naming the parameter, exit 2, nothing written', () => {
  const cases: Array<[string, Record<string, unknown>, RegExp]> = [
    ['a component that fits nowhere (its centre off the plate)', { components: componentsWith(2, { atMm: [200, 0] }) }, /components\.2\.atMm: \[200,0\] puts the component's centre outside the bottom-plate/],
    ['a negative height', { components: componentsWith(0, { heightMm: -5 }) }, /components\.0\.heightMm: -5 is below the allowed range 1 to 100 mm/],
    ['a battery heavier than plausible', { components: componentsWith(3, { massG: 900 }) }, /components\.3\.massG: 900 is heavier than a battery of 35 × 75 × 33 mm can be: 10\.39 g\/cm³, above 3 g\/cm³ \(at most 259 g\)/],
    ['an unknown component kind', { components: [...componentsWith(0, null), { kind: 'parachute', massG: 20 }] }, /components\.5\.kind: "parachute" must be one of stack, video-transmitter, receiver, battery, camera, antenna/],
    ['a stack on a mount that does not exist', { components: componentsWith(0, { stack: 3 }) }, /components\.0\.stack: 3 names no stack mount \(stacks has 1: 0 to 0\)/],
    ['a motor taller than the room under the prop band', { motor: { heightMm: 30 } }, /motor\.heightMm: 30 reaches into the prop band/],
    ['a motor kv without the voltage that turns it into a speed', { motor: { kv: 1950 } }, /motor\.supplyVoltageV: \(missing\) is required with motor\.kv/],
    ['a soft mount on a board stuck to a plate (no screws to ride on)', { components: componentsWith(1, { softMountNPerMm: 15 }) }, /components\.1\.softMountNPerMm: 15 needs screws to ride on/],
  ];
  for (const [what, patch, message] of cases) {
    it(what, () => {
      const out = join(tmp(), 'never');
      const r = runCli(['build', writeDesign(patch), '--out', out]);
      expect(r.code).toBe(2);
      expect(r.stderr).not.toMatch(STACK_LINE);
      expect(r.stderr).toMatch(message);
      expect(existsSync(out)).toBe(false);
    });
  }
});
