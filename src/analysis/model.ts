import { Envelope, reverseCuthillMcKee } from './envelope.js';
import type { Laminate } from './laminate.js';
import { BENDING_DOFS, DOF_PER_NODE, MEMBRANE_DOFS, shellLumpedMass, shellStiffness, toGlobal } from './shellTriangle.js';

/**
 * A finite-element model of flat shell triangles in 3D, in consistent units (mm, N, tonne, s).
 * Every node has six DOFs [u, v, w, rx, ry, rz] in global axes. A plate on its own lies in the
 * global x–y plane (no frames needed); plates placed in a frame carry one direction-cosine matrix
 * per triangle, and connectors can be added as further element kinds without changing the DOF map.
 */
export type ShellModel = Readonly<{
  /** x, y, z per node, mm. */
  xyz: Float64Array;
  /** Three node indices per triangle, counter-clockwise seen from the element's +z. */
  triangles: Uint32Array;
  laminates: readonly Laminate[];
  /** Index into `laminates` per triangle. */
  triangleLaminate: Uint16Array;
  /** Optional 9 numbers per triangle: rows are the element's x, y, z axes in global components. */
  frames?: Float64Array;
  /** Concentrated masses on the translations of a node, tonnes. */
  pointMasses: ReadonlyArray<Readonly<{ node: number; massT: number }>>;
  /** 1 where DOF d of node i (index 6i + d) is held at zero. */
  fixed: Uint8Array;
}>;

export const modelNodeCount = (m: ShellModel): number => m.xyz.length / 3;

/** The assembled system over the active, unconstrained DOFs. */
export type Assembly = Readonly<{
  k: Envelope;
  /** Lumped (diagonal) mass. */
  m: Float64Array;
  /** Equation number of DOF 6·node + d, or −1 when it is fixed or not active. */
  eq: Int32Array;
  /** Which of the six node DOFs take part. */
  dofs: readonly number[];
}>;

/**
 * Assemble stiffness and lumped mass over the DOFs `dofs` (subset of 0..5) of every node, skipping
 * fixed ones. For a plate in the x–y plane the bending set [2, 3, 4] and the membrane set [0, 1, 5]
 * are uncoupled and may be assembled and solved separately; a 3D model uses all six.
 * Nodes are renumbered by reverse Cuthill–McKee to keep the envelope narrow.
 */
export function assemble(model: ShellModel, dofs: readonly number[]): Assembly {
  const nNodes = modelNodeCount(model);
  const tris = model.triangles;
  const adj: number[][] = Array.from({ length: nNodes }, () => []);
  const seen = new Set<number>();
  for (let t = 0; t < tris.length; t += 3) {
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) {
      const i = tris[t + a];
      const j = tris[t + b];
      if (i === j) continue;
      const key = i * nNodes + j;
      if (!seen.has(key)) {
        seen.add(key);
        adj[i].push(j);
      }
    }
  }
  const order = reverseCuthillMcKee(adj);
  const eq = new Int32Array(nNodes * DOF_PER_NODE).fill(-1);
  let neq = 0;
  for (const node of order) for (const d of dofs) if (!model.fixed[node * DOF_PER_NODE + d]) eq[node * DOF_PER_NODE + d] = neq++;
  const first = new Int32Array(neq);
  for (let i = 0; i < neq; i++) first[i] = i;
  const elemEq = new Int32Array(18);
  const gather = (t: number) => {
    for (let a = 0; a < 3; a++) for (let d = 0; d < 6; d++) elemEq[a * 6 + d] = eq[tris[t + a] * DOF_PER_NODE + d];
  };
  for (let t = 0; t < tris.length; t += 3) {
    gather(t);
    let lo = Infinity;
    for (const e of elemEq) if (e >= 0 && e < lo) lo = e;
    for (const e of elemEq) if (e >= 0 && first[e] > lo) first[e] = lo;
  }
  const k = new Envelope(first);
  const m = new Float64Array(neq);
  const xyz = model.xyz;
  // A flat model solved block by block needs only the bending or only the membrane stiffness.
  const parts = model.frames
    ? { bending: true, membrane: true }
    : { bending: dofs.some((d) => BENDING_DOFS.includes(d as 2 | 3 | 4)), membrane: dofs.some((d) => MEMBRANE_DOFS.includes(d as 0 | 1 | 5)) };
  for (let t = 0; t < tris.length; t += 3) {
    const tri = t / 3;
    const lam = model.laminates[model.triangleLaminate[tri]];
    const r = model.frames ? Array.from(model.frames.subarray(9 * tri, 9 * tri + 9)) : null;
    const x: [number, number, number] = [0, 0, 0];
    const y: [number, number, number] = [0, 0, 0];
    for (let a = 0; a < 3; a++) {
      const n = tris[t + a];
      const p = [xyz[3 * n], xyz[3 * n + 1], xyz[3 * n + 2]];
      x[a] = r ? r[0] * p[0] + r[1] * p[1] + r[2] * p[2] : p[0];
      y[a] = r ? r[3] * p[0] + r[4] * p[1] + r[5] * p[2] : p[1];
    }
    let ke = shellStiffness(x, y, lam.a, lam.d, lam.shearStiffnessNPerMm, parts);
    if (r) ke = toGlobal(ke, r);
    gather(t);
    for (let i = 0; i < 18; i++) {
      const ei = elemEq[i];
      if (ei < 0) continue;
      for (let j = 0; j < 18; j++) {
        const ej = elemEq[j];
        if (ej < 0 || ej > ei) continue;
        k.add(ei, ej, ke[i * 18 + j]);
      }
    }
    // Lumped mass in element axes; for a plate placed in 3D its rotary part is carried to global
    // axes by the diagonal of RᵀJR (exact when the element axes line up with the global ones).
    const local = shellLumpedMass(x, y, lam.arealMassTPerMm2, lam.rotaryInertiaT);
    const me = r ? rotateRotaryMass(local, r) : local;
    for (let a = 0; a < 3; a++) for (let d = 0; d < 6; d++) {
      const e = elemEq[a * 6 + d];
      if (e >= 0) m[e] += me[d];
    }
  }
  for (const pm of model.pointMasses) for (let d = 0; d < 3; d++) {
    const e = eq[pm.node * DOF_PER_NODE + d];
    if (e >= 0) m[e] += pm.massT;
  }
  return { k, m, eq, dofs };
}

function rotateRotaryMass(local: Float64Array, r: readonly number[]): Float64Array {
  const out = Float64Array.from(local);
  for (let d = 0; d < 3; d++) {
    let v = 0;
    for (let a = 0; a < 3; a++) v += r[a * 3 + d] * r[a * 3 + d] * local[3 + a];
    out[3 + d] = v;
  }
  return out;
}

/** Scatter a solution over equations back to six values per node (fixed and inactive DOFs are 0). */
export function expand(a: Assembly, x: Float64Array): Float64Array {
  const out = new Float64Array(a.eq.length);
  for (let i = 0; i < a.eq.length; i++) if (a.eq[i] >= 0) out[i] = x[a.eq[i]];
  return out;
}

/** Gather a per-node load vector (six values per node, N and N·mm) onto the equations. */
export function restrict(a: Assembly, f: Float64Array): Float64Array {
  const out = new Float64Array(a.k.n);
  for (let i = 0; i < a.eq.length; i++) if (a.eq[i] >= 0) out[a.eq[i]] += f[i];
  return out;
}

/**
 * The six rigid-body motions of the model restricted to the assembly's equations: translations along
 * x, y, z and rotations ω about the axes through the model's centroid (displacement ω × r, rotation
 * DOFs ω). Used to deflate the eigen solver for an unsupported model; only meaningful when nothing is fixed.
 */
export function rigidBodyModes(model: ShellModel, a: Assembly): Float64Array[] {
  const n = modelNodeCount(model);
  const c = [0, 0, 0];
  for (let i = 0; i < n; i++) for (let d = 0; d < 3; d++) c[d] += model.xyz[3 * i + d] / n;
  const modes: Float64Array[] = [];
  for (let k = 0; k < 6; k++) {
    const v = new Float64Array(a.k.n);
    for (let i = 0; i < n; i++) {
      const r = [model.xyz[3 * i] - c[0], model.xyz[3 * i + 1] - c[1], model.xyz[3 * i + 2] - c[2]];
      const vals = new Array<number>(6).fill(0);
      if (k < 3) vals[k] = 1;
      else {
        const w = [0, 0, 0];
        w[k - 3] = 1;
        vals[0] = w[1] * r[2] - w[2] * r[1];
        vals[1] = w[2] * r[0] - w[0] * r[2];
        vals[2] = w[0] * r[1] - w[1] * r[0];
        vals[k] = 1;
      }
      for (let d = 0; d < 6; d++) {
        const e = a.eq[6 * i + d];
        if (e >= 0) v[e] = vals[d];
      }
    }
    modes.push(v);
  }
  return modes;
}
