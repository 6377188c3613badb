import { lowestEigenpairs } from './eigen.js';
import { ALL_DOFS, assemble, expand, rigidBodyModes, type Assembly } from './model.js';
import type { CholeskyFactor } from './sparse.js';
import type { PlateModel } from './plateModel.js';
import { BENDING_DOFS, MEMBRANE_DOFS } from './shellTriangle.js';

/** One computed natural mode of a flat plate model. */
export type RawMode = Readonly<{
  frequencyHz: number;
  plane: 'out-of-plane' | 'in-plane';
  /** Six values per node [u, v, w, rx, ry, rz], scaled so the largest nodal translation is 1 mm. */
  shape: Float64Array;
}>;

export type PlateSolution = Readonly<{
  modes: RawMode[];
  /** Unconstrained DOFs of the bending and membrane systems together. */
  dof: number;
  /** Rigid-body modes of an unsupported plate (deflated from the solve), plus any mode below 1 Hz. */
  rigidModes: number;
}>;

/** Below this a mode of a plate model is rigid-body motion (elastic modes of these plates are hundreds of Hz). */
const RIGID_HZ = 1;

/**
 * Lowest `count` elastic modes of a flat plate model. A plate in its own plane with a symmetric
 * laminate has uncoupled bending (w, rx, ry) and membrane (u, v, rz) systems; they are solved
 * separately (exactly equivalent to the full six-DOF system, and about four times cheaper) and merged.
 * @throws RangeError when count is not a whole number from 1 to 200
 */
export function solvePlateModes(pm: PlateModel, count: number): PlateSolution {
  if (!Number.isInteger(count) || count < 1 || count > 200) throw new RangeError(`mode count must be a whole number from 1 to 200 (got ${count})`);
  if (pm.model.rigid?.length) return solveCoupled(pm, count);
  const modes: RawMode[] = [];
  let dof = 0;
  let rigid = 0;
  // Each block is assembled and factored once, however many times its modes are asked for.
  const systems = new Map<string, { a: Assembly; deflate: Float64Array[]; factor?: CholeskyFactor }>();
  const solveBlock = (dofs: readonly number[], plane: RawMode['plane'], want: number): RawMode[] => {
    let sys = systems.get(plane);
    if (!sys) {
      const a0 = assemble(pm.model, dofs);
      const free = !pm.model.fixed.some((f) => f === 1);
      sys = { a: a0, deflate: free && a0.k.n ? rigidBodyModes(pm.model, a0) : [] };
      systems.set(plane, sys);
    }
    const a = sys.a;
    if (a.k.n === 0) return [];
    const r = lowestEigenpairs(a.k, a.m, want, { deflate: sys.deflate, factor: sys.factor });
    sys.factor = r.factor ?? undefined;
    dof = Math.max(dof, 0);
    blockDofs.set(plane, a.k.n);
    rigidBy.set(plane, r.deflated);
    const out: RawMode[] = [];
    r.values.forEach((lambda, i) => {
      const f = Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI);
      if (f < RIGID_HZ) {
        rigidBy.set(plane, (rigidBy.get(plane) ?? 0) + 1);
        return;
      }
      out.push({ frequencyHz: f, plane, shape: normaliseShape(expand(a, r.vectors[i])) });
    });
    return out;
  };
  const blockDofs = new Map<string, number>();
  const rigidBy = new Map<string, number>();
  modes.push(...solveBlock(BENDING_DOFS, 'out-of-plane', count));
  // In-plane modes of a plate usually lie far above its bending modes: ask for a few, and for more
  // only while they still reach below the highest bending mode found.
  const top = modes.length === count ? modes[modes.length - 1].frequencyHz : Infinity;
  for (let want = Math.min(count, 3); ; want = Math.min(count, want * 2)) {
    const mem = solveBlock(MEMBRANE_DOFS, 'in-plane', want);
    if (want >= count || mem.length < want || mem[mem.length - 1].frequencyHz > top) {
      modes.push(...mem);
      break;
    }
  }
  dof = [...blockDofs.values()].reduce((s2, x) => s2 + x, 0);
  rigid = [...rigidBy.values()].reduce((s2, x) => s2 + x, 0);
  modes.sort((a, b) => a.frequencyHz - b.frequencyHz);
  return { modes: modes.slice(0, count), dof, rigidModes: rigid };
}

/**
 * All six DOFs at once: a rigid body whose centre of mass lies off the plate's plane (a motor on the
 * arm) couples bending and membrane motion. Each mode is called out-of-plane when the plate's w
 * motion carries most of its translation.
 */
function solveCoupled(pm: PlateModel, count: number): PlateSolution {
  const a = assemble(pm.model);
  const free = !pm.model.fixed.some((f) => f === 1);
  const r = lowestEigenpairs(a.k, a.m, count, { deflate: free ? rigidBodyModes(pm.model, a) : [] });
  let rigid = r.deflated;
  const plateNodes = pm.mesh.xy.length / 2;
  const modes: RawMode[] = [];
  r.values.forEach((lambda, i) => {
    const f = Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI);
    if (f < RIGID_HZ) {
      rigid++;
      return;
    }
    const shape = normaliseShape(expand(a, r.vectors[i]));
    let w2 = 0;
    let uv2 = 0;
    for (let n = 0; n < plateNodes; n++) {
      w2 += shape[6 * n + 2] ** 2;
      uv2 += shape[6 * n] ** 2 + shape[6 * n + 1] ** 2;
    }
    modes.push({ frequencyHz: f, plane: w2 >= uv2 ? 'out-of-plane' : 'in-plane', shape });
  });
  return { modes, dof: a.k.n, rigidModes: rigid };
}

/** Scale so the largest nodal translation is 1 and the largest component is positive (a stable sign). */
export function normaliseShape(s: Float64Array): Float64Array {
  let big2 = 0;
  let signed = 0;
  for (let i = 0; i < s.length; i += 6) {
    const x = s[i];
    const y = s[i + 1];
    const z = s[i + 2];
    const t2 = x * x + y * y + z * z;
    if (t2 > big2 * (1 + 2e-12)) {
      big2 = t2;
      // The largest component of the largest translation fixes the sign.
      signed = Math.abs(x) >= Math.abs(y) && Math.abs(x) >= Math.abs(z) ? x : Math.abs(y) >= Math.abs(z) ? y : z;
    }
  }
  const big = Math.sqrt(big2);
  const k = big > 0 ? Math.sign(signed || 1) / big : 1;
  const out = new Float64Array(s.length);
  for (let i = 0; i < s.length; i++) out[i] = s[i] * k;
  return out;
}
