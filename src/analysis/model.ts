import { beamMatrices, type BeamSection } from './beamElement.js';
import type { Laminate } from './laminate.js';
import { blockGraph, fillReducingOrder, SparseSymmetric } from './sparse.js';
import { BENDING_DOFS, DOF_PER_NODE, MEMBRANE_DOFS, scatterBlock, shellBlocksInto, toGlobalInto, twiceArea } from './shellTriangle.js';

/** A concentrated mass at a node: on its translations, and optionally a rotary inertia about the node. */
export type PointMass = Readonly<{
  node: number;
  massT: number;
  /** Inertia tensor about the node in global axes, t·mm²: [Ixx, Iyy, Izz, Ixy, Iyz, Izx]. */
  inertiaTMm2?: readonly [number, number, number, number, number, number];
}>;

/** A beam element between two nodes (a standoff). */
export type Beam = Readonly<{ nodes: readonly [number, number]; section: BeamSection }>;

/**
 * A rigid body: the slaves' six DOFs follow the master's exactly (u_s = u_m + θ_m × (x_s − x_m),
 * θ_s = θ_m). The slave DOFs are eliminated (master–slave elimination), so a rigid body adds no
 * stiffness and no ill-conditioning. Groups that share a node act as one body.
 */
export type RigidGroup = Readonly<{ master: number; slaves: readonly number[] }>;

/** A translational spring between two nodes, one stiffness per global axis (a soft mount's grommet). N/mm. */
export type Spring = Readonly<{ nodes: readonly [number, number]; stiffnessNPerMm: readonly [number, number, number] }>;

/**
 * A finite-element model in 3D, in consistent units (mm, N, tonne, s): flat shell triangles,
 * beams, rigid bodies and concentrated masses. Every node has six DOFs [u, v, w, rx, ry, rz] in
 * global axes. A plate on its own lies in the global x–y plane (no frames needed); plates placed
 * in a frame carry one direction-cosine matrix per triangle.
 */
export type FeModel = Readonly<{
  /** x, y, z per node, mm. */
  xyz: Float64Array;
  /** Three node indices per triangle, counter-clockwise seen from the element's +z. */
  triangles: Uint32Array;
  laminates: readonly Laminate[];
  /** Index into `laminates` per triangle. */
  triangleLaminate: Uint16Array;
  /** Optional 9 numbers per triangle: rows are the element's x, y, z axes in global components. */
  frames?: Float64Array;
  pointMasses: readonly PointMass[];
  /** 1 where DOF d of node i (index 6i + d) is held at zero. */
  fixed: Uint8Array;
  beams?: readonly Beam[];
  rigid?: readonly RigidGroup[];
  springs?: readonly Spring[];
  /**
   * Optional, per triangle: an earlier triangle with the same corners in its own axes and the same
   * laminate (copies of one plate mesh), whose element matrices it reuses.
   */
  triangleSource?: Uint32Array;
}>;

export const modelNodeCount = (m: FeModel): number => m.xyz.length / 3;

export const ALL_DOFS: readonly number[] = [0, 1, 2, 3, 4, 5];

/** The assembled system over the active, unconstrained, independent DOFs. */
export type Assembly = Readonly<{
  k: SparseSymmetric;
  /** Mass on the same pattern (lumped for shells; consistent for beams; rigid bodies carry their inertia). */
  m: SparseSymmetric;
  /** Equation number of DOF 6·node + d, or −1 when it is fixed, not active, or the node is a slave. */
  eq: Int32Array;
  /** Which of the six node DOFs take part. */
  dofs: readonly number[];
  /** Master node of each node that is part of a rigid body (−1 otherwise). */
  masterOf: Int32Array;
  xyz: Float64Array;
}>;

/**
 * The master of every node in a rigid body, groups that share a node merged (union–find); −1 for
 * nodes in no body or that are themselves the master.
 * @throws RangeError when a slave has a fixed DOF (hold the master instead)
 */
export function rigidMasters(model: FeModel): Int32Array {
  const n = modelNodeCount(model);
  const up = new Int32Array(n).fill(-1);
  const find = (v: number): number => {
    let r = v;
    while (up[r] >= 0) r = up[r];
    while (up[v] >= 0) {
      const t = up[v];
      up[v] = r;
      v = t;
    }
    return r;
  };
  const inGroup = new Uint8Array(n);
  const rootMaster = new Map<number, number>();
  for (const g of model.rigid ?? []) {
    inGroup[g.master] = 1;
    for (const s of g.slaves) {
      inGroup[s] = 1;
      const a = find(g.master);
      const b = find(s);
      if (a !== b) up[b] = a;
    }
  }
  // The master of a merged body: the first-listed master in it.
  for (const g of model.rigid ?? []) {
    const r = find(g.master);
    if (!rootMaster.has(r)) rootMaster.set(r, g.master);
  }
  const masterOf = new Int32Array(n).fill(-1);
  for (let v = 0; v < n; v++) {
    if (!inGroup[v]) continue;
    const m = rootMaster.get(find(v))!;
    if (m === v) continue;
    masterOf[v] = m;
    for (let d = 0; d < 6; d++) if (model.fixed[6 * v + d]) throw new RangeError(`node ${v} follows a rigid body and cannot be held itself; hold the body's master node ${m}`);
  }
  return masterOf;
}

/**
 * Assemble stiffness and mass over the DOFs `dofs` (a subset of 0..5) of every node, skipping fixed
 * ones and eliminating the slaves of rigid bodies. For a plate in the x–y plane the bending set
 * [2, 3, 4] and the membrane set [0, 1, 5] are uncoupled and may be assembled and solved separately;
 * a 3D model uses all six. Equations are numbered node by node in a minimum-degree order
 * (see `fillReducingOrder`), ready for the sparse Cholesky factorisation.
 */
export function assemble(model: FeModel, dofs: readonly number[] = ALL_DOFS): Assembly {
  const nNodes = modelNodeCount(model);
  const masterOf = rigidMasters(model);
  const rep = (v: number) => (masterOf[v] >= 0 ? masterOf[v] : v);
  const tris = model.triangles;
  const beams = model.beams ?? [];
  // Blocks: independent nodes with at least one free active DOF.
  const springs = model.springs ?? [];
  const width = new Int32Array(nNodes);
  for (let v = 0; v < nNodes; v++) if (masterOf[v] < 0) for (const d of dofs) if (!model.fixed[6 * v + d]) width[v]++;
  const used = new Uint8Array(nNodes);
  for (const v of tris) used[rep(v)] = 1;
  for (const b of beams) for (const v of b.nodes) used[rep(v)] = 1;
  for (const s of springs) for (const v of s.nodes) used[rep(v)] = 1;
  for (const pm of model.pointMasses) used[rep(pm.node)] = 1;
  for (const g of model.rigid ?? []) used[rep(g.master)] = 1;
  const blockOfNode = new Int32Array(nNodes).fill(-1);
  const blockNode: number[] = [];
  for (let v = 0; v < nNodes; v++) {
    if (used[v] && width[v] > 0) {
      blockOfNode[v] = blockNode.length;
      blockNode.push(v);
    }
  }
  const nb = blockNode.length;
  const cliques: number[][] = [];
  const cliqueOf = (nodes: ArrayLike<number>): number[] => {
    const out: number[] = [];
    for (let i = 0; i < nodes.length; i++) {
      const b = blockOfNode[rep(nodes[i])];
      if (b >= 0 && !out.includes(b)) out.push(b);
    }
    return out;
  };
  for (let t = 0; t < tris.length; t += 3) cliques.push(cliqueOf(tris.subarray(t, t + 3)));
  for (const b of beams) cliques.push(cliqueOf(b.nodes));
  for (const sp of springs) cliques.push(cliqueOf(sp.nodes));
  for (let b = 0; b < nb; b++) cliques.push([b]);
  const graph = blockGraph(nb, cliques);
  const order = fillReducingOrder(graph, Int32Array.from(blockNode, (v) => width[v]));
  const posOf = new Int32Array(nb);
  order.forEach((b, k) => (posOf[b] = k));
  // Equations, node by node in the order; local index of each DOF inside its block.
  const eq = new Int32Array(nNodes * DOF_PER_NODE).fill(-1);
  const blockStart = new Int32Array(nb + 1);
  let neq = 0;
  for (let k = 0; k < nb; k++) {
    const v = blockNode[order[k]];
    blockStart[k] = neq;
    for (const d of dofs) if (!model.fixed[6 * v + d]) eq[6 * v + d] = neq++;
  }
  blockStart[nb] = neq;
  // Pattern: each block column holds its own block and its later neighbours, by position. Sizes
  // first, then typed arrays filled in place (the pattern of a frame has millions of entries).
  const lowPtr = new Int32Array(nb + 1);
  const colPtr = new Int32Array(neq + 1);
  let lowCount = 0;
  let nnz = 0;
  for (let k = 0; k < nb; k++) {
    const b = order[k];
    const w = blockStart[k + 1] - blockStart[k];
    let below = 0;
    for (let p = graph.ptr[b]; p < graph.ptr[b + 1]; p++) {
      const q = posOf[graph.adj[p]];
      if (q > k) {
        lowCount++;
        below += blockStart[q + 1] - blockStart[q];
      }
    }
    lowPtr[k + 1] = lowCount;
    nnz += (w * (w + 1)) / 2 + w * below;
  }
  const lowPos = new Int32Array(lowCount);
  const lowOff = new Int32Array(lowCount);
  const rowIdx = new Int32Array(nnz);
  let fill = 0;
  for (let k = 0; k < nb; k++) {
    const b = order[k];
    const first = lowPtr[k];
    let n = first;
    for (let p = graph.ptr[b]; p < graph.ptr[b + 1]; p++) {
      const q = posOf[graph.adj[p]];
      if (q > k) lowPos[n++] = q;
    }
    lowPos.subarray(first, n).sort();
    let off = blockStart[k + 1] - blockStart[k];
    for (let e = first; e < n; e++) {
      lowOff[e] = off;
      off += blockStart[lowPos[e] + 1] - blockStart[lowPos[e]];
    }
    for (let j = blockStart[k]; j < blockStart[k + 1]; j++) {
      for (let i = j; i < blockStart[k + 1]; i++) rowIdx[fill++] = i;
      for (let e = first; e < n; e++) for (let i = blockStart[lowPos[e]]; i < blockStart[lowPos[e] + 1]; i++) rowIdx[fill++] = i;
      colPtr[j + 1] = fill;
    }
  }
  const k = new SparseSymmetric(colPtr, rowIdx, blockStart);
  const m = k.zerosLike();
  const lowPosA = lowPos;
  const lowOffA = lowOff;
  /** Offset of block position r's rows in the first column of block position c (r ≥ c). */
  const blockOffset = (r: number, c: number): number => {
    if (r === c) return 0;
    let lo = lowPtr[c];
    let hi = lowPtr[c + 1] - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (lowPosA[mid] === r) return lowOffA[mid];
      if (lowPosA[mid] < r) lo = mid + 1;
      else hi = mid - 1;
    }
    throw new RangeError(`blocks ${r}, ${c} are not coupled in the pattern`);
  };
  // Local equation index (within its block) of each DOF of each independent node.
  const local = new Int32Array(nNodes * DOF_PER_NODE).fill(-1);
  for (let v = 0; v < nNodes; v++) {
    const b = blockOfNode[v];
    if (b < 0) continue;
    const s = blockStart[posOf[b]];
    for (let d = 0; d < 6; d++) if (eq[6 * v + d] >= 0) local[6 * v + d] = eq[6 * v + d] - s;
  }
  const scatter = new Scatter(model.xyz, masterOf, blockOfNode, posOf, blockStart, local, colPtr, blockOffset);
  // Shells: element matrices in element axes once per distinct triangle (copies of a plate share
  // them), turned to global axes only where the element's axes are not the global ones.
  const parts = model.frames
    ? { bending: true, membrane: true }
    : { bending: dofs.some((d) => BENDING_DOFS.includes(d as 2 | 3 | 4)), membrane: dofs.some((d) => MEMBRANE_DOFS.includes(d as 0 | 1 | 5)) };
  const xyz = model.xyz;
  const nodes3 = [0, 0, 0];
  const x: [number, number, number] = [0, 0, 0];
  const y: [number, number, number] = [0, 0, 0];
  const source = model.triangleSource;
  const nTri = tris.length / 3;
  const cacheSlot = source ? new Int32Array(nTri).fill(-1) : null;
  const cache: Float64Array[] = [];
  const ke = new Float64Array(324);
  const keG = new Float64Array(324);
  const tmp = new Float64Array(324);
  const bend = new Float64Array(81);
  const mem = new Float64Array(81);
  const me = new Float64Array(6);
  for (let tri = 0; tri < nTri; tri++) {
    const t = 3 * tri;
    const lam = model.laminates[model.triangleLaminate[tri]];
    const f = model.frames;
    const r = f ? f.subarray(9 * tri, 9 * tri + 9) : null;
    for (let a = 0; a < 3; a++) {
      const n = tris[t + a];
      nodes3[a] = n;
      const p0 = xyz[3 * n];
      const p1 = xyz[3 * n + 1];
      const p2 = xyz[3 * n + 2];
      x[a] = r ? r[0] * p0 + r[1] * p1 + r[2] * p2 : p0;
      y[a] = r ? r[3] * p0 + r[4] * p1 + r[5] * p2 : p1;
    }
    const src = source ? source[tri] : tri;
    let blocks: Float64Array | null = cacheSlot && src !== tri && cacheSlot[src] >= 0 ? cache[cacheSlot[src]] : null;
    if (!blocks) {
      bend.fill(0);
      mem.fill(0);
      shellBlocksInto(x, y, lam.a, lam.d, lam.shearStiffnessNPerMm, parts.bending ? bend : null, parts.membrane ? mem : null);
      if (cacheSlot && src === tri) {
        blocks = new Float64Array(162);
        blocks.set(bend, 0);
        blocks.set(mem, 81);
        cacheSlot[tri] = cache.length;
        cache.push(blocks);
      }
    }
    ke.fill(0);
    if (parts.bending) scatterBlock(ke, blocks ? blocks.subarray(0, 81) : bend, BENDING_DOFS);
    if (parts.membrane) scatterBlock(ke, blocks ? blocks.subarray(81, 162) : mem, MEMBRANE_DOFS);
    const turned = r !== null && !isIdentity(r);
    if (turned) toGlobalInto(ke, r, tmp, keG);
    scatter.element(k.val, nodes3, turned ? keG : ke);
    // Lumped mass in element axes; for a plate placed in 3D its rotary part is carried to global
    // axes by the diagonal of RᵀJR (exact when the element axes line up with the global ones).
    const area = twiceArea(x, y) / 2;
    const mt = (lam.arealMassTPerMm2 * area) / 3;
    const j = (lam.rotaryInertiaT * area) / 3;
    me[0] = me[1] = me[2] = mt;
    me[3] = j;
    me[4] = j;
    me[5] = (mt * area) / 12;
    if (turned) rotateRotaryMassInPlace(me, r);
    for (let a = 0; a < 3; a++) scatter.nodeDiagonal(m.val, nodes3[a], me);
  }
  for (const b of beams) {
    const pa = Array.from(xyz.subarray(3 * b.nodes[0], 3 * b.nodes[0] + 3));
    const pb = Array.from(xyz.subarray(3 * b.nodes[1], 3 * b.nodes[1] + 3));
    const { k: kb, m: mb } = beamMatrices(b.section, pa, pb);
    scatter.element(k.val, b.nodes, kb);
    scatter.element(m.val, b.nodes, mb);
  }
  for (const sp of springs) {
    const ks = new Float64Array(144);
    for (let d = 0; d < 3; d++) {
      const kd = sp.stiffnessNPerMm[d];
      ks[d * 12 + d] = ks[(6 + d) * 12 + 6 + d] = kd;
      ks[d * 12 + 6 + d] = ks[(6 + d) * 12 + d] = -kd;
    }
    scatter.element(k.val, sp.nodes, ks);
  }
  for (const pm of model.pointMasses) scatter.element(m.val, [pm.node], pointMassMatrix(pm));
  return { k, m, eq, dofs, masterOf, xyz: model.xyz };
}

/** Adds element matrices (node-major, six DOFs per node, global axes) into a block-ordered pattern. */
class Scatter {
  constructor(
    private readonly xyz: Float64Array,
    private readonly masterOf: Int32Array,
    private readonly blockOfNode: Int32Array,
    private readonly posOf: Int32Array,
    private readonly blockStart: Int32Array,
    private readonly local: Int32Array,
    private readonly colPtr: Int32Array,
    private readonly blockOffset: (r: number, c: number) => number,
  ) {}

  /** ke is (6·nodes)² row-major; slave nodes are carried onto their masters (Tᵀ ke T). */
  private copy = new Float64Array(324);
  private target = new Int32Array(3);

  element(val: Float64Array, nodes: ArrayLike<number>, ke0: Float64Array): void {
    const nn = nodes.length;
    const size = 6 * nn;
    let ke = ke0;
    if (this.target.length < nn) this.target = new Int32Array(nn);
    const target = this.target;
    for (let a = 0; a < nn; a++) {
      const v = nodes[a];
      const ms = this.masterOf[v];
      if (ms >= 0) {
        if (ke === ke0) {
          if (this.copy.length < ke0.length) this.copy = new Float64Array(ke0.length);
          ke = this.copy.subarray(0, ke0.length);
          ke.set(ke0);
        }
        carryToMaster(ke, size, a, this.offset(v, ms));
        target[a] = ms;
      } else target[a] = v;
    }
    for (let a = 0; a < nn; a++) {
      const ra = target[a];
      const ba = this.blockOfNode[ra];
      if (ba < 0) continue;
      const pa = this.posOf[ba];
      for (let b = 0; b < nn; b++) {
        const rb = target[b];
        const bb = this.blockOfNode[rb];
        if (bb < 0) continue;
        const pb = this.posOf[bb];
        if (pa < pb) continue;
        const off = this.blockOffset(pa, pb);
        for (let da = 0; da < 6; da++) {
          const li = this.local[6 * ra + da];
          if (li < 0) continue;
          for (let db = 0; db < 6; db++) {
            const lj = this.local[6 * rb + db];
            if (lj < 0 || (pa === pb && li < lj)) continue;
            const j = this.blockStart[pb] + lj;
            val[this.colPtr[j] + off - lj + li] += ke[(6 * a + da) * size + 6 * b + db];
          }
        }
      }
    }
  }

  private diag = new Float64Array(36);
  private one = [0];

  /** A diagonal 6×6 node matrix (lumped mass). */
  nodeDiagonal(val: Float64Array, node: number, d: Float64Array): void {
    if (this.masterOf[node] >= 0) {
      const me = this.diag;
      me.fill(0);
      for (let i = 0; i < 6; i++) me[7 * i] = d[i];
      this.one[0] = node;
      this.element(val, this.one, me);
      return;
    }
    const b = this.blockOfNode[node];
    if (b < 0) return;
    const s = this.blockStart[this.posOf[b]];
    for (let i = 0; i < 6; i++) {
      const li = this.local[6 * node + i];
      if (li >= 0) val[this.colPtr[s + li]] += d[i];
    }
  }

  private offset(v: number, ms: number): number[] {
    const x = this.xyz;
    return [x[3 * v] - x[3 * ms], x[3 * v + 1] - x[3 * ms + 1], x[3 * v + 2] - x[3 * ms + 2]];
  }
}

/**
 * In place K ← Tᵀ K T for node a of an element whose DOFs follow a master at offset −r:
 * u_a = u_m − r × … i.e. u_a = u_m + θ_m × r, θ_a = θ_m, so T = [[I, −[r×]], [0, I]].
 */
function carryToMaster(k: Float64Array, size: number, a: number, r: readonly number[]): void {
  // −[r×] = [[0, rz, −ry], [−rz, 0, rx], [ry, −rx, 0]]: translation i gains Σ_j c[i][j] θ_j.
  const c = [0, r[2], -r[1], -r[2], 0, r[0], r[1], -r[0], 0];
  const t0 = 6 * a;
  // Columns: col(θ_j) += Σ_i col(u_i) c[i][j].
  for (let row = 0; row < size; row++) {
    const base = row * size + t0;
    for (let j = 0; j < 3; j++) k[base + 3 + j] += k[base] * c[j] + k[base + 1] * c[3 + j] + k[base + 2] * c[6 + j];
  }
  // Rows: row(θ_j) += Σ_i row(u_i) c[i][j].
  for (let col = 0; col < size; col++) {
    for (let j = 0; j < 3; j++) k[(t0 + 3 + j) * size + col] += k[t0 * size + col] * c[j] + k[(t0 + 1) * size + col] * c[3 + j] + k[(t0 + 2) * size + col] * c[6 + j];
  }
}

function rotateRotaryMassInPlace(m: Float64Array, r: ArrayLike<number>): void {
  const j0 = m[3];
  const j1 = m[4];
  const j2 = m[5];
  for (let d = 0; d < 3; d++) m[3 + d] = r[d] * r[d] * j0 + r[3 + d] * r[3 + d] * j1 + r[6 + d] * r[6 + d] * j2;
}

const isIdentity = (r: ArrayLike<number>): boolean => r[0] === 1 && r[4] === 1 && r[8] === 1 && r[1] === 0 && r[2] === 0 && r[3] === 0 && r[5] === 0 && r[6] === 0 && r[7] === 0;

/** The 6×6 mass matrix of a point mass with its optional rotary inertia. */
function pointMassMatrix(pm: PointMass): Float64Array {
  const me = new Float64Array(36);
  me[0] = me[7] = me[14] = pm.massT;
  if (pm.inertiaTMm2) {
    const [ixx, iyy, izz, ixy, iyz, izx] = pm.inertiaTMm2;
    const j = [ixx, ixy, izx, ixy, iyy, iyz, izx, iyz, izz];
    for (let a = 0; a < 3; a++) for (let c = 0; c < 3; c++) me[(3 + a) * 6 + 3 + c] = j[3 * a + c];
  }
  return me;
}

/** The six DOF values of node v from its master's (rigid-body kinematics). */
function slaveValues(a: Assembly, v: number, get: (i: number) => number, out: Float64Array): void {
  const m = a.masterOf[v];
  const r = [a.xyz[3 * v] - a.xyz[3 * m], a.xyz[3 * v + 1] - a.xyz[3 * m + 1], a.xyz[3 * v + 2] - a.xyz[3 * m + 2]];
  const u = [0, 1, 2, 3, 4, 5].map((d) => get(6 * m + d));
  out[6 * v] = u[0] + u[4] * r[2] - u[5] * r[1];
  out[6 * v + 1] = u[1] + u[5] * r[0] - u[3] * r[2];
  out[6 * v + 2] = u[2] + u[3] * r[1] - u[4] * r[0];
  out[6 * v + 3] = u[3];
  out[6 * v + 4] = u[4];
  out[6 * v + 5] = u[5];
}

/** Scatter a solution over equations back to six values per node (fixed and inactive DOFs are 0; slaves follow their masters). */
export function expand(a: Assembly, x: Float64Array): Float64Array {
  const out = new Float64Array(a.eq.length);
  for (let i = 0; i < a.eq.length; i++) if (a.eq[i] >= 0) out[i] = x[a.eq[i]];
  const n = a.masterOf.length;
  for (let v = 0; v < n; v++) if (a.masterOf[v] >= 0) slaveValues(a, v, (i) => (a.eq[i] >= 0 ? x[a.eq[i]] : 0), out);
  return out;
}

/** Gather a per-node load vector (six values per node, N and N·mm) onto the equations; loads on slaves move to their masters with their moment. */
export function restrict(a: Assembly, f: Float64Array): Float64Array {
  const out = new Float64Array(a.k.n);
  const add = (i: number, v: number) => {
    if (a.eq[i] >= 0) out[a.eq[i]] += v;
  };
  for (let v = 0; v < a.masterOf.length; v++) {
    const m = a.masterOf[v];
    if (m < 0) {
      for (let d = 0; d < 6; d++) add(6 * v + d, f[6 * v + d]);
      continue;
    }
    const r = [a.xyz[3 * v] - a.xyz[3 * m], a.xyz[3 * v + 1] - a.xyz[3 * m + 1], a.xyz[3 * v + 2] - a.xyz[3 * m + 2]];
    const [fx, fy, fz] = [f[6 * v], f[6 * v + 1], f[6 * v + 2]];
    add(6 * m, fx);
    add(6 * m + 1, fy);
    add(6 * m + 2, fz);
    add(6 * m + 3, f[6 * v + 3] + r[1] * fz - r[2] * fy);
    add(6 * m + 4, f[6 * v + 4] + r[2] * fx - r[0] * fz);
    add(6 * m + 5, f[6 * v + 5] + r[0] * fy - r[1] * fx);
  }
  return out;
}

/**
 * The six rigid-body motions of the model restricted to the assembly's equations: translations along
 * x, y, z and rotations ω about the axes through the model's centroid (displacement ω × r, rotation
 * DOFs ω). Used to deflate the eigen solver for an unsupported model; only meaningful when nothing is fixed.
 */
export function rigidBodyModes(model: FeModel, a: Assembly): Float64Array[] {
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
