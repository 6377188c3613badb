import { describe, expect, it } from 'vitest';
import { allmanStiffness, laminate, plateBendingStiffness, plateCurvatureMatrix, shellStiffness, toGlobal } from '../../src/analysis/index.js';
import { WOVEN } from './helpers.js';

// An arbitrary scalene triangle (mm), counter-clockwise.
const X = [1.3, 6.1, 2.2] as const;
const Y = [0.4, 1.9, 5.7] as const;
const lam = laminate(WOVEN, 2.5, 0.3);

const mul = (k: Float64Array, u: number[]) => u.map((_, i) => u.reduce((s, uj, j) => s + k[i * u.length + j] * uj, 0));
const dot = (a: number[], b: number[]) => a.reduce((s, x, i) => s + x * b[i], 0);

describe('flat shell triangle', () => {
  it('bending: rigid motions (w = a + b y − c x, rx = b, ry = c) cost no energy, with and without shear', () => {
    for (const shear of [0, lam.shearStiffnessNPerMm]) {
      const k = plateBendingStiffness(X, Y, lam.d, shear);
      for (const [a, b, c] of [[1, 0, 0], [0, 1, 0], [0, 0, 1]]) {
        const u = [0, 1, 2].flatMap((i) => [a + b * Y[i] - c * X[i], b, c]);
        for (const f of mul(k, u)) expect(Math.abs(f)).toBeLessThan(1e-9 * Math.max(...k.map(Math.abs)));
      }
    }
  });

  it('bending patch test: w = x²/2 + xy − y² gives exact constant curvature (−1, 2, −2) at every point (Batoz et al. 1980 pass it)', () => {
    const w = (x: number, y: number) => x * x / 2 + x * y - y * y;
    const u = [0, 1, 2].flatMap((i) => [w(X[i], Y[i]), X[i] - 2 * Y[i] /* rx = w,y */, -(X[i] + Y[i]) /* ry = −w,x */]);
    for (const shear of [0, lam.shearStiffnessNPerMm]) {
      for (const L of [[1, 0, 0], [0.2, 0.3, 0.5], [0.6, 0.1, 0.3]] as const) {
        const b = plateCurvatureMatrix(X, Y, L, lam.d, shear);
        const k = [0, 1, 2].map((r) => dot(Array.from(b.subarray(9 * r, 9 * r + 9)), u));
        // κ = [−w,xx, −w,yy, −2w,xy]
        expect(k[0]).toBeCloseTo(-1, 9);
        expect(k[1]).toBeCloseTo(2, 9);
        expect(k[2]).toBeCloseTo(-2, 9);
      }
      // Strain energy = ½ κᵀ D κ · area: the shear part stays zero in pure bending.
      const energy = 0.5 * dot(u, mul(plateBendingStiffness(X, Y, lam.d, shear), u));
      const kap = [-1, 2, -2];
      const area = ((X[1] - X[0]) * (Y[2] - Y[0]) - (X[2] - X[0]) * (Y[1] - Y[0])) / 2;
      expect(energy).toBeCloseTo(0.5 * dot(kap, mul(Float64Array.from(lam.d), kap)) * area, 6);
    }
  });

  it('membrane: rigid translation and rotation (u = −θy, v = θx, rz = θ) cost no energy; constant strain is exact', () => {
    const k = allmanStiffness(X, Y, lam.a);
    const scale = Math.max(...k.map(Math.abs));
    for (const u of [[1, 0, 0], [0, 1, 0]].map(([a, b]) => [0, 1, 2].flatMap(() => [a, b, 0])).concat([[0, 1, 2].flatMap((i) => [-Y[i], X[i], 1])])) {
      for (const f of mul(k, u)) expect(Math.abs(f)).toBeLessThan(1e-9 * scale);
    }
    // u = εx, v = εy, γ = 0 (ω = 0 so rz = 0): energy ½ εᵀ A ε · area
    const eps = [1e-3, -4e-4, 0];
    const u = [0, 1, 2].flatMap((i) => [eps[0] * X[i], eps[1] * Y[i], 0]);
    const area = ((X[1] - X[0]) * (Y[2] - Y[0]) - (X[2] - X[0]) * (Y[1] - Y[0])) / 2;
    expect(0.5 * dot(u, mul(k, u))).toBeCloseTo(0.5 * dot(eps, mul(Float64Array.from(lam.a), eps)) * area, 9);
  });

  it('a shell element turned into another plane keeps its eigenvalues (T is orthogonal)', () => {
    const k = shellStiffness(X, Y, lam.a, lam.d, lam.shearStiffnessNPerMm);
    const c = Math.cos(0.7);
    const s = Math.sin(0.7);
    const r = [1, 0, 0, 0, c, s, 0, -s, c];
    const g = toGlobal(k, r);
    const trace = (m: Float64Array) => Array.from({ length: 18 }, (_, i) => m[i * 19]).reduce((a, b) => a + b, 0);
    const frob = (m: Float64Array) => Math.sqrt(m.reduce((a, b) => a + b * b, 0));
    expect(trace(g)).toBeCloseTo(trace(k), 3);
    expect(frob(g) / frob(k)).toBeCloseTo(1, 12);
  });
});

describe('a plate placed in 3D', () => {
  it('standing in the x–z plane (per-triangle frames, all six DOFs solved together) it has the same modes as flat', async () => {
    const { assemble, lowestEigenpairs, partModes, plateModel, rigidBodyModes } = await import('../../src/analysis/index.js');
    const { platePart, rectangle } = await import('./helpers.js');
    const part = platePart(rectangle(60, 25), 2, WOVEN, 0.4);
    const flat = partModes(part, { modes: 5, meshSizeMm: 3 }).modes.map((m) => m.frequencyHz);
    const pm = plateModel(part, 3);
    const n = pm.mesh.xy.length / 2;
    // Part x → global x, part y → global z, part normal → global −y.
    const xyz = new Float64Array(3 * n);
    for (let i = 0; i < n; i++) xyz.set([pm.mesh.xy[2 * i], 0, pm.mesh.xy[2 * i + 1]], 3 * i);
    const tris = pm.mesh.triangles.length / 3;
    const frames = new Float64Array(9 * tris);
    for (let t = 0; t < tris; t++) frames.set([1, 0, 0, 0, 0, 1, 0, -1, 0], 9 * t);
    const model = { ...pm.model, xyz, frames };
    const a = assemble(model, [0, 1, 2, 3, 4, 5]);
    const r = lowestEigenpairs(a.k, a.m, 5, { deflate: rigidBodyModes(model, a) });
    expect(r.deflated).toBe(6);
    const standing = r.values.map((v) => Math.sqrt(v) / (2 * Math.PI));
    // Within what the Lanczos tolerance (1e-3 on the residual) leaves: frequencies to about 1e-6.
    standing.forEach((f, i) => expect(f / flat[i]).toBeCloseTo(1, 5));
  });
});
