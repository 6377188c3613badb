import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { DEMO_FILES, DESIGNS_DIR, demoText } from '../helpers/demo.js';
import { built, tesselWith, type Built } from './helpers.js';
import { join } from 'node:path';

const FIT_RULES = ['interference', 'prop-clearance', 'stack-fit', 'camera-fit', 'battery-fit', 'motor-screw'];

const errorsOf = (b: Built, rule: string) => b.report.findings.filter((f) => f.rule === rule && f.severity === 'error');
const names = (b: Built, rule: string) => errorsOf(b, rule).map((f) => [...(f.parts ?? [])].sort().join(' & '));

describe('regression designs (test/fixtures/assembly): each clash is the right error, naming both parts', () => {
  it('issue 11: the 7-inch variant of Tessel 5 (arm roots overlap) — arm against arm, and standoff heads against the arm roots', () => {
    const b = built('tessel-5-7in-variant.yaml');
    const clash = names(b, 'interference');
    for (const pair of ['arm front-left & arm front-right', 'arm front-left & arm rear-left', 'arm front-right & arm rear-right', 'arm rear-left & arm rear-right']) expect(clash).toContain(pair);
    expect(clash).toContain('arm rear-right & standoff 4 bottom head');
    const f = errorsOf(b, 'interference').find((x) => x.parts!.includes('arm front-left') && x.parts!.includes('arm front-right'))!;
    // The two front arms meet on the forward axis, at the arms' height (under the bottom plate).
    expect(f.where![1]).toBeCloseTo(0, 1);
    expect(f.where![2]).toBeLessThan(0);
    expect(f.atMm).toEqual([f.where![0], f.where![1]]);
    expect(f.part).toBe('frame');
  });

  it('prop disc between the plates', () => {
    const b = built('prop-between-plates.yaml');
    const f = errorsOf(b, 'prop-clearance').filter((x) => /the space between the bottom and top plates/.test(x.message));
    expect(f.map((x) => x.parts![0]).sort()).toEqual(['prop front-left', 'prop front-right', 'prop rear-left', 'prop rear-right']);
    for (const x of f) expect(x.parts![1]).toBe('bottom-plate');
  });

  it('stack taller than the plate gap: the standoff length that would fit is stated', () => {
    const b = built('stack-taller-than-gap.yaml');
    const f = errorsOf(b, 'stack-fit').find((x) => x.parts![1] === 'top-plate')!;
    expect(f.parts![0]).toBe('flight stack');
    // Stack from the bottom plate's top (2.5) 26 mm high; an ISO 7040 M3 nut (4 mm) on it; the stack
    // screw M3 × 35 from z 0 (grip 2.5 + 26 + 4 + 0.5 = 33 → 35) ends at 35. Plus 1.5 mm clearance,
    // less the 2.5 mm plate: standoffs of ⌈35 + 1.5 − 2.5⌉ = 34 mm would fit.
    expect(f.message).toMatch(/use standoffs of 34 mm/);
    expect(f.measured).toBeCloseTo(27.5 - 35, 6);
  });

  it('stack wider than the body', () => {
    const b = built('stack-wider-than-body.yaml');
    expect(names(b, 'stack-fit')).toContain('flight stack & top-plate');
  });

  it('camera wider than its plates', () => {
    const b = built('camera-wider-than-plates.yaml');
    const f = errorsOf(b, 'camera-fit');
    expect(f).toHaveLength(1);
    expect(f[0].parts).toEqual(['camera', 'camera-side left']);
    // 22 mm camera between plates 19 mm apart: 3 mm too wide (tolerance 0.3 mm).
    expect(f[0].measured).toBeCloseTo(3, 9);
    expect(f[0].limit).toBeCloseTo(0.3, 9);
  });

  for (const file of DEMO_FILES) {
    it(`demo ${file}: none of the fit errors (no false positives)`, () => {
      const b = built(join(DESIGNS_DIR, file));
      for (const rule of FIT_RULES) expect(errorsOf(b, rule).map((f) => f.message)).toEqual([]);
    });
  }
});

describe('fit rules, planted one at a time on Tessel 5', () => {
  it('a near miss: the camera 0.3 mm wider than its plates still fits (the stated tolerance); 0.31 mm does not', () => {
    const ok = tesselWith({ components: componentsWith({ kind: 'camera', name: 'camera', widthMm: 19.3, depthMm: 18, pivotBehindFaceMm: 11, massG: 9 }) });
    expect(errorsOf(ok, 'camera-fit')).toHaveLength(0);
    const bad = tesselWith({ components: componentsWith({ kind: 'camera', name: 'camera', widthMm: 19.31, depthMm: 18, pivotBehindFaceMm: 11, massG: 9 }) });
    expect(errorsOf(bad, 'camera-fit')).toHaveLength(1);
  });

  it('a camera pivoting too close to the camera spacers hits them somewhere in its tilt range, and the tilt is named', () => {
    const b = tesselWith({ camera: { forwardOffsetMm: 8 } });
    const f = errorsOf(b, 'camera-fit').filter((x) => x.parts![1].startsWith('camera spacer'));
    expect(f.length).toBeGreaterThan(0);
    expect(f[0].message).toMatch(/from \d+(\.\d+)?° uptilt/);
    expect(f[0].unit).toBe('deg');
  });

  it('motor screws that would reach the windings are an error (Farline 7 with a 3.5 mm thread: M3 × 10 through 6 mm)', () => {
    const b = built({ ...farline(), motor: { ...farline().motor, threadDepthMm: 3.5 } });
    const f = errorsOf(b, 'motor-screw');
    expect(f).toHaveLength(4);
    // 10 − 6 = 4 mm into the motor, 0.5 mm past a 3.5 mm thread.
    expect(f[0].measured).toBeCloseTo(4, 9);
    expect(f[0].limit).toBeCloseTo(3.5, 9);
    expect(f[0].parts![1]).toMatch(/^motor /);
  });

  it('battery straps: a battery longer than the gap between its slots, and a strap too short', () => {
    const long = tesselWith({ components: componentsWith({ kind: 'battery', name: 'battery', sizeMm: [75, 35, 33], massG: 180 }) });
    expect(names(long, 'battery-fit')).toEqual(['battery & top-plate']);
    // 2 × 44 + 2 × (33 + 2) + 40 = 198 mm needed: a 190 mm strap is short, 198 mm is enough.
    const short = tesselWith({ components: componentsWith({ kind: 'battery', name: 'battery', sizeMm: [35, 75, 33], massG: 180, strapLengthMm: 190 }) });
    const f = errorsOf(short, 'battery-fit');
    expect(f).toHaveLength(1);
    expect(f[0].measured).toBeCloseTo(198, 9);
    const enough = tesselWith({ components: componentsWith({ kind: 'battery', name: 'battery', sizeMm: [35, 75, 33], massG: 180, strapLengthMm: 198 }) });
    expect(errorsOf(enough, 'battery-fit')).toHaveLength(0);
  });

  it('an antenna pointing into a prop disc is an error naming both', () => {
    // Level with the prop plane (arm top 0 + props.heightAboveArmMm 23), pointing at the rear-right motor.
    const b = tesselWith({ components: [...tesselComponents(), { kind: 'antenna', name: 'antenna', atMm: [-50, -20], zMm: 23, lengthMm: 60, directionDeg: -135, elevationDeg: 0, massG: 5 }] });
    expect(names(b, 'prop-clearance')).toContain('antenna & prop rear-right');
  });

  it('arms on top of the body (over-body stacking) put the braces above them and raise the prop plane', () => {
    const under = tesselWith({});
    const over = tesselWith({ assembly: { armStacking: 'over-body' } });
    expect(under.assembly.stackUp.armTopMm).toBe(0);
    expect(over.assembly.stackUp.armTopMm).toBe(2.5 + 5);
    const brace = over.assembly.plates.find((p) => p.id === 'brace front')!;
    expect(brace.zLowMm).toBe(7.5);
    // The arm-root bolt clamps the same three plates, listed from the head (below) up.
    const root = over.assembly.joints.find((j) => j.kind === 'arm-root')!;
    expect(root.clamps).toEqual(['bottom-plate', 'arm front-right', 'brace front']);
    expect(under.assembly.joints.find((j) => j.kind === 'arm-root')!.clamps).toEqual(['brace front', 'arm front-right', 'bottom-plate']);
  });
});


const tesselComponents = (): Record<string, unknown>[] => YAML.parse(demoText('tessel-5.yaml')).components;
function componentsWith(replacement: Record<string, unknown>): Record<string, unknown>[] {
  return tesselComponents().map((c) => (c.kind === replacement.kind ? replacement : c));
}
const farline = (): Record<string, Record<string, unknown>> & { motor: Record<string, unknown> } => YAML.parse(demoText('farline-7.yaml'));
