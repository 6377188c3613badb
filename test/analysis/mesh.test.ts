import { describe, expect, it } from 'vitest';
import { meshPart, partModes } from '../../src/analysis/index.js';
import { arc, line, partArea, type Part } from '../../src/geometry/index.js';
import { circle, roundedRect } from '../../src/geometry/primitives.js';
import { DEMOS, demoFrame } from './helpers.js';

/** Invariants of the mesher on every demo part: the exact geometry is the reference. */
describe.each(DEMOS)('mesh of %s', (file) => {
  for (const part of demoFrame(file).parts) {
    it(`${part.name}: covers the material (area within the chord error), every triangle counter-clockwise, every node used`, () => {
      const m = meshPart(part, 2);
      const { xy, triangles } = m;
      let area = 0;
      let minAngle = Math.PI;
      const used = new Uint8Array(xy.length / 2);
      for (let t = 0; t < triangles.length; t += 3) {
        const p = [0, 1, 2].map((k) => [xy[2 * triangles[t + k]], xy[2 * triangles[t + k] + 1]]);
        [0, 1, 2].forEach((k) => (used[triangles[t + k]] = 1));
        const a2 = (p[1][0] - p[0][0]) * (p[2][1] - p[0][1]) - (p[2][0] - p[0][0]) * (p[1][1] - p[0][1]);
        expect(a2).toBeGreaterThan(0);
        area += a2 / 2;
        for (let k = 0; k < 3; k++) {
          const [a, b, c] = [p[k], p[(k + 1) % 3], p[(k + 2) % 3]];
          const u = [b[0] - a[0], b[1] - a[1]];
          const v = [c[0] - a[0], c[1] - a[1]];
          minAngle = Math.min(minAngle, Math.acos((u[0] * v[0] + u[1] * v[1]) / Math.hypot(u[0], u[1]) / Math.hypot(v[0], v[1])));
        }
      }
      // Arcs become chords: the mesh area may differ from the exact area (Green's theorem on true arcs) by a little.
      expect(Math.abs(area / partArea(part) - 1)).toBeLessThan(0.01);
      expect(used.every((u) => u === 1)).toBe(true);
      expect((minAngle * 180) / Math.PI).toBeGreaterThan(5);
      // Every hole keeps its own ring of boundary nodes.
      expect(m.loops).toHaveLength(part.features.length + 1);
      for (const l of m.loops) expect(l.length).toBeGreaterThanOrEqual(3);
    });
  }
});

describe('a drawn part whose long edge lies on the hull', () => {
  // From the DXF fuzz test (seed 23731): a 1 m circular segment with a small tab, its top a straight
  // 1,028 mm edge sloping 2 mm. Its boundary nodes are nearly collinear; while they formed the
  // triangulation's hull, constraining the edges failed ("no further intersect after non-convex")
  // at these three sizes and modes exited with a stack trace.
  const part: Part = {
    name: 'long-edge', role: 'imported', quantity: 1, thicknessMm: 2, weaveRad: 0, features: [], members: [], placements: [], sourcePath: 'test',
    material: { name: 'woven-cf', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 },
    outline: [line([20, -2], [30, -2]), arc([544, 514.0000000000001], 728.321357643726, -2.3542527450599016, Math.PI / 2), line([1060, 0], [32, 2]), line([32, 2], [20, 2]), line([20, 2], [20, -2])],
  };
  it.each([4, 3.996, 3.88])('meshes at %s mm: the material covered, every node used', (size) => {
    const { xy, triangles } = meshPart(part, size);
    let area = 0;
    const used = new Uint8Array(xy.length / 2);
    for (let t = 0; t < triangles.length; t += 3) {
      const [a, b, c] = [triangles[t], triangles[t + 1], triangles[t + 2]];
      [a, b, c].forEach((k) => (used[k] = 1));
      const a2 = (xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * c] - xy[2 * a]) * (xy[2 * b + 1] - xy[2 * a + 1]);
      expect(a2).toBeGreaterThan(0);
      area += a2 / 2;
    }
    expect(Math.abs(area / partArea(part) - 1)).toBeLessThan(0.01);
    expect(used.every((u) => u === 1)).toBe(true);
  });
});

describe('a part the mesh cannot follow', () => {
  it('is refused with a one-line RangeError naming the mesh size, not the triangulator failing', () => {
    // The same hole twice: its boundary nodes coincide, so the triangulation cannot hold both rings.
    const hole = { loop: circle([20, 20], 3, false), kind: 'hole' as const, purpose: 'imported' as const, centerMm: [20, 20] as const, diameterMm: 6 };
    const part = { outline: roundedRect([30, 20], 60, 40, 5), features: [hole, hole] };
    expect(() => meshPart(part, 2)).toThrow(RangeError);
    expect(() => meshPart(part, 2)).toThrow(/^the mesh at 2 mm could not follow the part's edges \([^\n]+\); contours that coincide/);
  });
});

describe('determinism and convergence', () => {
  const part = demoFrame('tessel-5.yaml').parts.find((p) => p.role === 'arm')!;
  it('the same part gives byte-identical results', () => {
    const a = partModes(part, { modes: 2 });
    const b = partModes(part, { modes: 2 });
    expect(a.modes.map((m) => m.frequencyHz)).toEqual(b.modes.map((m) => m.frequencyHz));
    expect(Array.from(a.mesh.xy)).toEqual(Array.from(b.mesh.xy));
  });
  it('the default mesh is within 2 % of a mesh twice as fine on the first three modes', () => {
    const coarse = partModes(part, { modes: 3 });
    const fine = partModes(part, { modes: 3, meshSizeMm: coarse.meshSizeMm / 2 });
    coarse.modes.forEach((m, i) => expect(Math.abs(m.frequencyHz / fine.modes[i].frequencyHz - 1)).toBeLessThan(0.02));
  });
  it('a mesh size that is not positive is refused with its value', () => {
    expect(() => meshPart(part, 0)).toThrow(/mesh size must be positive \(got 0 mm\)/);
  });
});
