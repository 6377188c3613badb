import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';
import { built, circleRing, plateRings, tesselWith } from './helpers.js';
import { armRootFootprintRule } from '../../src/checks/fit.js';
import { optionsForDesign } from '../../src/checks/options.js';
import { assemblyPrisms } from '../../src/checks/solids.js';

const SCRIPT = join(import.meta.dirname, 'shapely_assembly.py');
const hasShapely = requireTool(pythonModuleAvailable('shapely'), 'python3-shapely');
type Ref = { overlaps: number[]; distances: number[]; outside: [number, number][]; overhangs: number[] };

const fitError = (report: ReturnType<typeof built>['report'], rule: string, a: string, b: string) =>
  report.findings.find((f) => f.rule === rule && f.severity === 'error' && f.parts && ((f.parts[0] === a && f.parts[1] === b) || (f.parts[0] === b && f.parts[1] === a)));

describe.skipIf(!hasShapely)('fit checks against Shapely (GEOS), an independent geometry library', () => {
  it('arm against arm on the 7-inch variant: overlap volume = intersection area × arm thickness', () => {
    const b = built('tessel-5-7in-variant.yaml');
    const fl = b.assembly.plates.find((p) => p.id === 'arm front-left')!;
    const rl = b.assembly.plates.find((p) => p.id === 'arm rear-left')!;
    const ref = runPythonJson<Ref>(SCRIPT, { overlaps: [{ a: plateRings(fl), b: plateRings(rl) }] });
    const f = fitError(b.report, 'interference', fl.id, rl.id)!;
    expect(f).toBeDefined();
    // Our polygons are flattened to 0.05 mm chords: well within 1 % of the area here.
    expect(f.measured! / (ref.overlaps[0] * fl.thicknessMm)).toBeCloseTo(1, 2);
    expect(f.unit).toBe('mm³');
  });

  it('arm roots clamped outside the bottom plate: (convex hull of the root screw heads ∩ arm) − body, area', () => {
    const b = tesselWith({});
    // The demo's pads carry every root: no such error.
    expect(b.report.findings.filter((f) => / root: .* outside the bottom plate/.test(f.message))).toEqual([]);
    // A body cut down to a 44 mm square leaves every root hanging out of it.
    const square = [[-22, -22], [22, -22], [22, 22], [-22, 22]];
    const prisms = assemblyPrisms(b.assembly).map((p) => (p.id === 'bottom-plate' ? { ...p, paths: [square.map(([x, y]) => ({ x, y }))] } : p));
    const found = armRootFootprintRule(b.assembly, optionsForDesign(b.design), prisms);
    expect(found.map((f) => f.parts![0]).sort()).toEqual(['arm front-left', 'arm front-right', 'arm rear-left', 'arm rear-right']);
    for (const f of found) {
      const arm = b.assembly.plates.find((p) => p.id === f.parts![0])!;
      const roots = b.assembly.joints.filter((j) => j.kind === 'arm-root' && j.clamps.includes(arm.id));
      const ref = runPythonJson<Ref>(SCRIPT, { overhangs: [{ centres: roots.map((j) => j.planMm), radius: roots[0].headRadiusMm, arm: [plateRings(arm)[0]], body: [square] }] });
      // Our hull takes 32 points per head circle and 0.05 mm chords on the arm: within 1 %.
      expect(f.measured! / ref.overhangs[0]).toBeCloseTo(1, 2);
      expect(f.severity).toBe('error');
      expect(f.parts![1]).toBe('bottom-plate');
    }
  });

  it('a standoff screw head under the bottom plate against an arm root: circle ∩ arm × the head height', () => {
    const b = built('tessel-5-7in-variant.yaml');
    const arm = b.assembly.plates.find((p) => p.id === 'arm rear-right')!;
    const j = b.assembly.joints.find((x) => x.id === 'standoff 4 bottom')!;
    const ref = runPythonJson<Ref>(SCRIPT, { overlaps: [{ a: plateRings(arm), b: [circleRing(j.planMm, j.headDiameterMm / 2)] }] });
    const f = fitError(b.report, 'interference', arm.id, 'standoff 4 bottom head')!;
    expect(f).toBeDefined();
    // The ISO 4762 M3 head is 3.0 mm high and lies wholly within the 6 mm arm's height.
    expect(j.headHeightMm).toBe(3);
    expect(f.measured! / (ref.overlaps[0] * 3)).toBeCloseTo(1, 2);
  });

  it('prop disc to a hex standoff: the plan distance to the hexagon less the prop radius', () => {
    const b = tesselWith({ body: { standoffs: { positionsMm: [[52, 21], [52, -21], [-52, 21], [-52, -21]] } } });
    const so = b.assembly.standoffs[0];
    const prop = b.assembly.props.find((p) => p.site === 'front-left')!;
    const r = so.acrossFlatsMm / Math.sqrt(3);
    const hex = Array.from({ length: 6 }, (_, k) => [so.planMm[0] + r * Math.cos((k * Math.PI) / 3), so.planMm[1] + r * Math.sin((k * Math.PI) / 3)]);
    const ref = runPythonJson<Ref>(SCRIPT, { distances: [{ point: [prop.centreMm[0], prop.centreMm[1]], rings: [hex] }] });
    const f = fitError(b.report, 'prop-clearance', 'prop front-left', so.id)!;
    expect(f).toBeDefined();
    expect(f.measured!).toBeCloseTo(ref.distances[0] - prop.diameterMm / 2, 3);
  });

  it('prop disc between the plates: the distance to the region the bottom and top plates share', () => {
    const b = built('prop-between-plates.yaml');
    const bottom = b.assembly.plates.find((p) => p.id === 'bottom-plate')!;
    const top = b.assembly.plates.find((p) => p.id === 'top-plate')!;
    const prop = b.assembly.props.find((p) => p.site === 'rear-left')!;
    // The shared region is the top plate here (the bottom plate only adds arm-root pads); check that
    // by its overlap with the bottom plate, then measure the distance to it.
    const ref = runPythonJson<Ref>(SCRIPT, {
      overlaps: [{ a: [plateRings(bottom)[0]], b: [plateRings(top)[0]] }],
      distances: [{ point: [prop.centreMm[0], prop.centreMm[1]], rings: [plateRings(top)[0]] }],
      outside: [{ inner: [plateRings(top)[0]], outer: [plateRings(bottom)[0]] }],
    });
    expect(ref.outside[0][0]).toBeLessThan(1e-6);
    const f = fitError(b.report, 'prop-clearance', 'prop rear-left', 'bottom-plate')!;
    expect(f).toBeDefined();
    expect(f.message).toMatch(/the space between the bottom and top plates/);
    // 0.05 mm chords: the polygon distance may differ by that much.
    expect(Math.abs(f.measured! - (ref.distances[0] - prop.diameterMm / 2))).toBeLessThan(0.06);
  });

  it('stack boards wider than the body: how far the board reaches outside the plate', () => {
    const b = built('stack-wider-than-body.yaml');
    const stack = b.assembly.components.find((c) => c.kind === 'stack')!;
    const box = stack.boxes[0];
    const [cx, cy] = box.centreMm;
    const [hx, hy] = box.halfSizeMm;
    const board = [[cx - hx, cy - hy], [cx + hx, cy - hy], [cx + hx, cy + hy], [cx - hx, cy + hy]];
    const f = fitError(b.report, 'stack-fit', stack.id, 'top-plate')!;
    expect(f).toBeDefined();
    const top = b.assembly.plates.find((p) => p.id === 'top-plate')!;
    const ref = runPythonJson<Ref>(SCRIPT, { outside: [{ inner: [board], outer: [plateRings(top)[0]] }] });
    expect(ref.outside[0][0]).toBeGreaterThan(0);
    expect(Math.abs(f.measured! - ref.outside[0][1])).toBeLessThan(0.06);
  });
});
