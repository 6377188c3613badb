import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { armModes, bodyModes, partModes, type ModalResult } from '../../src/analysis/index.js';
import { partArea, type Frame, type Part } from '../../src/geometry/index.js';
import { commandAvailable, pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { DEMOS, demoFrame, REPO } from './helpers.js';

/**
 * Independent finite-element reference: every demo part, each arm with its motor and the unibody
 * bottom plate with its motors are meshed by gmsh (second-order triangles) and solved by CalculiX
 * with S6 shell elements (test/reference/ccx/plate_modes.py). framewright must agree within 5 % on
 * the first three elastic modes (issue 7).
 */
const SCRIPT = join(REPO, 'test', 'reference', 'ccx', 'plate_modes.py');
const haveTools = () => requireTool(commandAvailable('ccx') && commandAvailable('gmsh') && pythonModuleAvailable('json'), 'calculix-ccx + gmsh');

type Footprint = { centre: readonly [number, number]; radiusMm: number } | { loop: number };
type Spec = {
  fixedLoops?: number[];
  masses?: Array<{ loops: number[]; massG: number }>;
  clampFootprints?: Footprint[];
  rigidMasses?: Array<{ footprints: Footprint[]; massG: number; cgMm: number[]; diameterMm: number; heightMm: number }>;
};

/** ISO 4762 socket head diameters dk (reference-values.md, "Assembly hardware"; M5 from memory). */
const ISO_4762_HEAD_MM: Record<string, number> = { M2: 3.8, 'M2.5': 4.5, M3: 5.5, M4: 7.0, M5: 8.5 };

/**
 * Element size of the quadratic reference mesh: a twentieth of √area. The reference is itself
 * converged there: Tessel 5's bottom plate gave 584.3 / 1084.1 / 1770.8 Hz at √A/6, 581.9 / 1074.2 /
 * 1754.0 at √A/20 and 581.5 / 1070.9 / 1750.9 with a mesh ten times finer (measured while writing this test).
 */
const ccxSize = (p: Part) => Math.sqrt(Math.abs(partArea(p))) / 20;

function ccxModes(p: Part, rigid: number, spec: Spec = {}): number[] {
  const r = runPythonJson<{ frequenciesHz: number[] }>(SCRIPT, {
    loops: [p.outline, ...p.features.map((f) => f.loop)],
    thicknessMm: p.thicknessMm,
    weaveRad: p.weaveRad,
    material: p.material,
    sizeMm: ccxSize(p),
    modes: rigid + 3,
    ...spec,
  });
  return r.frequenciesHz.slice(rigid, rigid + 3);
}

const loopsOf = (p: Part, purpose: string) => p.features.flatMap((f, i) => (f.purpose === purpose ? [i + 1] : []));

function expectWithin5(ours: ModalResult, ref: number[], label: string) {
  const got = ours.modes.slice(0, 3).map((m) => m.frequencyHz);
  const rel = got.map((f, i) => Math.abs(f - ref[i]) / ref[i]);
  // Printed so the figures can be quoted (issue 7 asks for the comparison).
  console.log(`${label}: framewright ${got.map((f) => f.toFixed(0)).join(' / ')} Hz, CalculiX ${ref.map((f) => f.toFixed(0)).join(' / ')} Hz, worst ${(100 * Math.max(...rel)).toFixed(1)} %`);
  expect(ref).toHaveLength(3);
  for (const r of rel) expect(r).toBeLessThan(0.05);
}

describe.each(DEMOS)('CalculiX S6 shell reference, %s', (file) => {
  const frame = demoFrame(file);
  const motorG = frame.design.motorMassG;

  for (const part of frame.parts) {
    it(`${part.name} free–free: first three elastic modes within 5 %`, () => {
      if (!haveTools()) return;
      expectWithin5(partModes(part, { modes: 3 }), ccxModes(part, 6), `${file} ${part.name} free`);
    }, 120_000);
  }

  for (const arm of frame.parts.filter((p) => p.role === 'arm')) {
    it(`${arm.name} as built (root screw heads clamped in six DOFs, the motor a rigid cylinder on top): within 5 % including twist`, () => {
      if (!haveTools()) return;
      const d = frame.design;
      const footprints = (purpose: string): Array<{ centre: readonly [number, number]; radiusMm: number }> => arm.features.filter((f) => f.purpose === purpose && f.centerMm && f.screw).map((f) => ({ centre: f.centerMm!, radiusMm: ISO_4762_HEAD_MM[f.screw!] / 2 }));
      // Round motor holes: the head's footprint; slotted ones: the slot's edge (its loop).
      const motor: Footprint[] = [...footprints('motor-bolt'), ...loopsOf(arm, 'motor-bolt').filter((i) => !arm.features[i - 1].centerMm).map((loop) => ({ loop }))];
      const bore = arm.features.find((f) => f.purpose === 'motor-bore')?.centerMm;
      const round = footprints('motor-bolt');
      const [cx, cy] = bore ?? [round.reduce((s, f) => s + f.centre[0], 0) / round.length, round.reduce((s, f) => s + f.centre[1], 0) / round.length];
      // The motor's height: the design's, else 0.6 × the bell diameter but not into the prop band (the design reference's rule).
      const heightMm = d.motor.heightMm ?? Math.min(0.6 * d.motor.bellDiameterMm, d.props.heightAboveArmMm - d.props.bandMm / 2);
      const ref = ccxModes(arm, 0, {
        clampFootprints: footprints('arm-root-bolt'),
        rigidMasses: [{ footprints: motor, massG: motorG, cgMm: [cx, cy, arm.thicknessMm / 2 + heightMm / 2], diameterMm: d.motor.bellDiameterMm, heightMm }],
      });
      expectWithin5(armModes(arm, { modes: 3, motorMassG: motorG, motor: { bellDiameterMm: d.motor.bellDiameterMm, heightMm } }), ref, `${file} ${arm.name} as built + motor`);
    }, 120_000);
  }

  if (frame.design.arms.construction === 'unibody') {
    it(`unibody bottom plate carrying four ${motorG} g motors: within 5 %`, () => {
      if (!haveTools()) return;
      const bottom = frame.parts.find((p) => p.role === 'bottom')!;
      const ours = bodyModes(bottom, frame.sites, { modes: 3, motorMassG: motorG });
      // Motor bolt holes grouped per motor as framewright does; each motor's mass on its own holes.
      const masses = frame.sites.map((s) => ({
        loops: bottom.features.flatMap((f, i) => (f.purpose === 'motor-bolt' && f.centerMm && nearest(frame, f.centerMm) === s.id ? [i + 1] : [])),
        massG: motorG,
      }));
      expectWithin5(ours, ccxModes(bottom, 6, { masses }), `${file} bottom plate with motors`);
    }, 120_000);
  }
});

function nearest(frame: Frame, p: readonly [number, number]): string {
  return frame.sites.reduce((b, s) => (Math.hypot(p[0] - s.motorMm[0], p[1] - s.motorMm[1]) < Math.hypot(p[0] - b.motorMm[0], p[1] - b.motorMm[1]) ? s : b)).id;
}
