import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildAssembly, massBalance, motorHeightMm } from '../../src/assembly/index.js';
import { assemble, assembledFrameModes, buildFrameModel, FloatingPartError, partModes, rotationBandFromTipSpeed, rotationBandOf } from '../../src/analysis/index.js';
import { runCli } from '../helpers/cli.js';
import { commandAvailable, pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { demoFrame, REPO } from './helpers.js';

const tessel = demoFrame('tessel-5.yaml');
const tesselAssembly = buildAssembly(tessel.design, tessel);

describe('the assembled frame', () => {
  const r = assembledFrameModes(tesselAssembly, { modes: 4 });

  it('a square X frame twists first, diagonal motor pairs in opposition (domain.md, "Resonance in flight")', () => {
    const m = r.modes[0];
    expect(m.kind).toBe('body twist');
    const z = m.motorsZ;
    // Assembly order front-right, front-left, rear-left, rear-right: diagonals move together.
    expect(Math.sign(z[0])).toBe(Math.sign(z[2]));
    expect(Math.sign(z[1])).toBe(Math.sign(z[3]));
    expect(Math.sign(z[0])).toBe(-Math.sign(z[1]));
    // Left–right symmetric design (the camera and battery make front and rear differ): each pair moves alike.
    expect(Math.abs(Math.abs(z[1]) / Math.abs(z[0]) - 1)).toBeLessThan(0.02);
    expect(Math.abs(Math.abs(z[3]) / Math.abs(z[2]) - 1)).toBeLessThan(0.02);
  });

  it('strain-energy shares add up to one, and the bottom plate carries most of the twist (the arm-root pads)', () => {
    for (const m of r.modes) expect(Object.values(m.sharesByPart).reduce((a, b) => a + b, 0)).toBeCloseTo(1, 9);
    const shares = r.modes[0].sharesByPart;
    expect(Object.entries(shares).sort((a, b) => b[1] - a[1])[0][0]).toBe('bottom-plate');
  });

  it('the rotation band of a 5.1-inch prop at 240 m/s tops out near 590 Hz (v / πD; domain.md quotes 500–650 Hz)', () => {
    const band = rotationBandFromTipSpeed(5.1 * 25.4);
    expect(band.highHz).toBeCloseTo(240 / (Math.PI * 0.12954), 6);
    expect(band.highHz).toBeGreaterThan(500);
    expect(band.highHz).toBeLessThan(650);
  });

  it('a soft-mounted stack on four grommets of k bounces at √(4k (1/m + 1/M)) / 2π against the free frame of mass M, when the frame is much stiffer (two-body oscillator; Thomson, Theory of Vibration, ch. 2), within 1 %', () => {
    const k = 0.2;
    const soft = { ...tessel.design, components: tessel.design.components.map((c) => (c.kind === 'stack' ? { ...c, softMountNPerMm: k } : c)) };
    const asm = buildAssembly(soft, { ...tessel, design: soft });
    const stack = asm.components.find((c) => c.kind === 'stack')!;
    const r = assembledFrameModes(asm, { modes: 8 });
    const rest = r.massG - stack.massG;
    const bounce = Math.sqrt(4 * k * (1 / (stack.massG * 1e-6) + 1 / (rest * 1e-6))) / (2 * Math.PI);
    const boards = r.modes.filter((m) => m.kind === 'soft-mounted board');
    expect(boards.length).toBeGreaterThanOrEqual(3);
    expect(Math.min(...boards.map((m) => Math.abs(m.frequencyHz / bounce - 1)))).toBeLessThan(0.01);
    // The frame's own first mode is far above: the boards are isolated from it.
    expect(r.modes.find((m) => m.kind === 'body twist')!.frequencyHz).toBeGreaterThan(2 * bounce);
  });

  it('the rotation band from a motor kv and voltage: 2400 kv on 22.2 V at 80 % under load tops out at 710.4 Hz (kv × V × 0.8 / 60, by hand; domain.md)', () => {
    const band = rotationBandOf({ motor: { kv: 2400, supplyVoltageV: 22.2 }, props: {} }, 5.1 * 25.4);
    expect(band.highHz).toBeCloseTo(710.4, 9);
    expect(band.lowHz).toBeCloseTo(0.3 * 710.4, 9);
    // Without kv and voltage: the tip-speed rule, with the design's own tip speed when it gives one.
    expect(rotationBandOf({ motor: {}, props: { maxTipSpeedMps: 200 } }, 127).highHz).toBeCloseTo(200 / (Math.PI * 0.127), 9);
  });

  it('one motor model for every stage: the design height, else 0.6 × the bell diameter, never into the prop band (by hand)', () => {
    const d = tessel.design;
    expect(motorHeightMm(d)).toBe(19);
    // 28 mm bell: 16.8 mm; the prop band starts 23 − 6/2 = 20 mm above the arm, so 16.8 stands.
    expect(motorHeightMm({ ...d, motor: { ...d.motor, heightMm: undefined } })).toBeCloseTo(16.8, 9);
    // A prop band starting 12 mm above the arm caps it.
    expect(motorHeightMm({ ...d, motor: { ...d.motor, heightMm: undefined }, props: { ...d.props, heightAboveArmMm: 15 } })).toBeCloseTo(12, 9);
    // The assembly's motors (fit checks, mass and balance) and the frame model's carry that height: centre of mass half of it above the arm top.
    for (const m of tesselAssembly.motors) expect(m.cgMm[2] - m.baseCentreMm[2]).toBeCloseTo(19 / 2, 9);
  });

  for (const file of ['tessel-5.yaml', 'mote-3.yaml', 'farline-7.yaml']) {
    it(`${file}: the model weighs what mass and balance says, all up (plates, screws, nuts, washers, spacers, motors, components): within 0.1 g, centre of gravity within 0.1 mm`, () => {
      const frame = demoFrame(file);
      const asm = buildAssembly(frame.design, frame);
      const mb = massBalance(asm);
      const fm = buildFrameModel(asm);
      expect(fm.massG).toBeCloseTo(mb.massG.allUp, 9);
      // From the assembled mass matrix (lumped shells, consistent beams, rigid masses carried onto
      // their masters): M applied to rigid translations and rotations about the origin gives the
      // mass and its first moments (xᵀ M x = m for a unit translation; a unit rotation about z moves
      // a point (x, y) by (−y, x), so t_xᵀ M r_z = −∫y dm), a route independent of the mass bodies.
      const a = assemble(fm.model);
      const rigid = (f: (p: ArrayLike<number>) => readonly number[]) => {
        const v = new Float64Array(a.k.n);
        for (let i = 0; i < fm.model.xyz.length / 3; i++) {
          const u = f(fm.model.xyz.subarray(3 * i, 3 * i + 3));
          for (let d = 0; d < 6; d++) if (a.eq[6 * i + d] >= 0) v[a.eq[6 * i + d]] = u[d];
        }
        return v;
      };
      const dotp = (x: Float64Array, y: Float64Array) => x.reduce((s, xi, i) => s + xi * y[i], 0);
      const mx = a.m.multiply(rigid(() => [1, 0, 0, 0, 0, 0]));
      const my = a.m.multiply(rigid(() => [0, 1, 0, 0, 0, 0]));
      const rz = rigid((p) => [-p[1], p[0], 0, 0, 0, 1]);
      const ry = rigid((p) => [p[2], 0, -p[0], 0, 1, 0]);
      const massG = dotp(mx, rigid(() => [1, 0, 0, 0, 0, 0])) / 1e-6;
      const cg = [dotp(my, rz) / 1e-6 / massG, -dotp(mx, rz) / 1e-6 / massG, dotp(mx, ry) / 1e-6 / massG];
      expect(Math.abs(massG - mb.massG.allUp)).toBeLessThan(0.1);
      for (let k = 0; k < 3; k++) expect(Math.abs(cg[k] - mb.cgMm[k])).toBeLessThan(0.1);
    });
  }

  it('a zero-thickness part is refused with its name (no stiffness to solve for)', () => {
    const arm = tessel.parts.find((p) => p.role === 'arm')!;
    expect(() => partModes({ ...arm, thicknessMm: 0 }, { modes: 2 })).toThrow(/part arm: thickness must be positive \(got 0 mm\)/);
    const asm = { ...tesselAssembly, plates: tesselAssembly.plates.map((p) => (p.id === 'top-plate' ? { ...p, part: { ...p.part, thicknessMm: 0 } } : p)) };
    expect(() => assembledFrameModes(asm, { modes: 2 })).toThrow(/plate top-plate: thickness must be positive/);
  });

  it('an arm whose root screws are gone is a floating part: the error names it', () => {
    const asm = { ...tesselAssembly, joints: tesselAssembly.joints.filter((j) => !(j.kind === 'arm-root' && j.clamps.includes('arm front-left'))) };
    expect(() => assembledFrameModes(asm, { modes: 2 })).toThrow(FloatingPartError);
    expect(() => assembledFrameModes(asm, { modes: 2 })).toThrow(/arm front-left is not connected/);
  });
});

describe('CalculiX reference for the assembled frame (test/reference/ccx/frame_modes.py, from the exported DXFs, assembly.json and the design)', () => {
  // Element sizes of the second-order reference mesh, each within 0.5 % of a mesh half as big on the
  // first four modes (measured while writing this test: Tessel 5 at 3 / 4 / 6 mm 125.3 / 125.4 / 126.0 Hz
  // first, Mote 3 at 2 / 3 mm 174.8 / 174.7 Hz).
  const cases = [
    { file: 'tessel-5.yaml', construction: 'separate', sizeMm: 4 },
    { file: 'mote-3.yaml', construction: 'unibody', sizeMm: 3 },
  ] as const;
  for (const c of cases) {
    it(`${c.file} (${c.construction} arms), every plate, joint, standoff, motor and component: first four elastic modes within 5 %`, () => {
      if (!requireTool(commandAvailable('ccx') && commandAvailable('gmsh') && pythonModuleAvailable('ezdxf') && pythonModuleAvailable('yaml') && pythonModuleAvailable('numpy'), 'calculix-ccx + gmsh + python3-ezdxf + python3-yaml + python3-numpy')) return;
      const frame = demoFrame(c.file);
      expect(frame.design.arms.construction).toBe(c.construction);
      const dir = mkdtempSync(join(tmpdir(), 'fw-frame-'));
      try {
        const build = runCli(['build', `designs/${c.file}`, '--out', dir]);
        expect(build.code).toBe(0);
        const ref = runPythonJson<{ frequenciesHz: number[] }>(join(REPO, 'test', 'reference', 'ccx', 'frame_modes.py'), {
          design: join(REPO, 'designs', c.file),
          dxfDir: dir,
          sizeMm: c.sizeMm,
          modes: 10,
        }).frequenciesHz.filter((f) => f > 1).slice(0, 4);
        const ours = assembledFrameModes(buildAssembly(frame.design, frame), { modes: 4 }).modes.map((m) => m.frequencyHz);
        const rel = ours.map((f, i) => Math.abs(f / ref[i] - 1));
        console.log(`${c.file} assembled frame: framewright ${ours.map((f) => f.toFixed(1)).join(' / ')} Hz, CalculiX ${ref.map((f) => f.toFixed(1)).join(' / ')} Hz, worst ${(100 * Math.max(...rel)).toFixed(1)} %`);
        expect(ref).toHaveLength(4);
        for (const x of rel) expect(x).toBeLessThan(0.05);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    }, 300_000);
  }
});

describe('modes --json', () => {
  it('gives designs[i].frame.modes[] with frequencyHz, name, motorsZ and sharesByPart', () => {
    const out = runCli(['modes', 'designs/tessel-5.yaml', '--modes', '3', '--json']);
    expect(out.code).toBe(0);
    const frame = JSON.parse(out.stdout).designs[0].frame;
    expect(frame.name).toBe('Tessel 5');
    expect(frame.modes).toHaveLength(3);
    for (const m of frame.modes) {
      expect(m.frequencyHz).toBeGreaterThan(0);
      expect(typeof m.name).toBe('string');
      expect(m.motorsZ).toHaveLength(4);
      expect(Object.keys(m.sharesByPart)).toContain('bottom-plate');
    }
    expect(frame.modes[0].name).toMatch(/^body twist/);
  }, 120_000);
});
