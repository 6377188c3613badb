import type { Frame, Part } from '../geometry/index.js';
import { cholesky, choleskySolve } from './envelope.js';
import { assemble, expand, restrict } from './model.js';
import { defaultMeshSizeMm, featureCentre, featureNodes, motorsOnPlate, plateModel, withFixed, type PlateModel } from './plateModel.js';
import { BENDING_DOFS } from './shellTriangle.js';

export type ArmStatics = Readonly<{ thrustN: number; tipDeflectionMm: number; stiffnessNPerMm: number }>;
export type TipDeflection = Readonly<{ site: string; thrustN: number; tipDeflectionMm: number }>;
export type BodyTwist = Readonly<{ thrustN: number; twistDeg: number; pattern: string }>;

/** Solve the bending system K u = f; returns six values per node. */
function solveBending(pm: PlateModel, f: Float64Array): Float64Array {
  const a = assemble(pm.model, BENDING_DOFS);
  const l = cholesky(a.k);
  return expand(a, choleskySolve(l, restrict(a, f)));
}

/**
 * Static out-of-plane response of a supported plate model to forces along z, each spread evenly
 * over its nodes. Returns six values per node (w in mm at index 6i + 2).
 * @throws NotPositiveDefiniteError when the supports leave the plate free to move
 */
export function solveStatic(pm: PlateModel, loads: ReadonlyArray<Readonly<{ nodes: readonly number[]; forceN: number }>>): Float64Array {
  const f = new Float64Array(pm.model.fixed.length);
  for (const l of loads) spreadForce(f, l.nodes, l.forceN);
  return solveBending(pm, f);
}

function spreadForce(f: Float64Array, nodes: readonly number[], forceN: number): void {
  for (const n of nodes) f[6 * n + 2] += forceN / nodes.length;
}

const meanW = (u: Float64Array, nodes: readonly number[]) => nodes.reduce((s, n) => s + u[6 * n + 2], 0) / nodes.length;

/**
 * Arm tip deflection: the arm held at its root bolt-hole edges, the thrust spread over the motor
 * bolt-hole edges, deflection = mean w there. mm (positive along the thrust).
 * @throws RangeError when the part has no root or motor bolt holes; NotPositiveDefiniteError if unsupported
 */
export function armTipDeflection(part: Part, thrustN: number, meshSizeMm?: number): ArmStatics {
  const pm0 = plateModel(part, meshSizeMm ?? defaultMeshSizeMm(part));
  const roots = featureNodes(pm0, 'arm-root-bolt').flatMap((r) => r.nodes);
  const tip = featureNodes(pm0, 'motor-bolt').flatMap((r) => r.nodes);
  if (!roots.length || !tip.length) throw new RangeError(`part ${part.name} needs arm-root and motor bolt holes for a tip deflection`);
  const pm = withFixed(pm0, roots, [0, 1, 2]);
  const f = new Float64Array(pm.model.fixed.length);
  spreadForce(f, tip, thrustN);
  const w = meanW(solveBending(pm, f), tip);
  return { thrustN, tipDeflectionMm: w, stiffnessNPerMm: thrustN / w };
}

/** A unibody plate held at its standoff holes; each motor's tip deflection under its own thrust. */
export function unibodyTipDeflections(part: Part, sites: Frame['sites'], thrustN: number, meshSizeMm?: number): TipDeflection[] {
  const pm0 = plateModel(part, meshSizeMm ?? defaultMeshSizeMm(part));
  const held = featureNodes(pm0, 'standoff').flatMap((s) => s.nodes);
  if (!held.length) throw new RangeError(`part ${part.name} has no standoff holes to hold it by`);
  const pm = withFixed(pm0, held, [0, 1, 2]);
  const motors = motorsOnPlate(pm0, sites);
  const a = assemble(pm.model, BENDING_DOFS);
  const l = cholesky(a.k);
  return motors.map((m) => {
    const f = new Float64Array(pm.model.fixed.length);
    spreadForce(f, m.nodes, thrustN);
    const u = expand(a, choleskySolve(l, restrict(a, f)));
    return { site: m.id, thrustN, tipDeflectionMm: meanW(u, m.nodes) };
  });
}

/**
 * Body twist of a unibody plate under opposite thrusts: front-left and rear-right motors push up,
 * front-right and rear-left down (a self-balancing load on a symmetric layout). The plate is held
 * only at the node nearest the stack centre (w and both tilts). Twist = the difference between the
 * roll angle of the front motor pair and that of the rear pair. deg.
 */
export function bodyTwist(part: Part, sites: Frame['sites'], thrustN: number, meshSizeMm?: number): BodyTwist {
  const pm0 = plateModel(part, meshSizeMm ?? defaultMeshSizeMm(part));
  const stacks = featureNodes(pm0, 'stack-bolt').map((f) => featureCentre(pm0, f.feature, f.nodes));
  const c = stacks.length ? [stacks.reduce((s, p) => s + p[0], 0) / stacks.length, stacks.reduce((s, p) => s + p[1], 0) / stacks.length] : [0, 0];
  let hold = 0;
  let best = Infinity;
  for (let i = 0; i < pm0.mesh.xy.length / 2; i++) {
    const d = Math.hypot(pm0.mesh.xy[2 * i] - c[0], pm0.mesh.xy[2 * i + 1] - c[1]);
    if (d < best) [best, hold] = [d, i];
  }
  const pm = withFixed(pm0, [hold], [2, 3, 4]);
  const motors = motorsOnPlate(pm0, sites);
  const f = new Float64Array(pm.model.fixed.length);
  for (const m of motors) spreadForce(f, m.nodes, m.front === m.left ? thrustN : -thrustN);
  const u = solveBending(pm, f);
  const at = (front: boolean, left: boolean) => motors.find((m) => m.front === front && m.left === left)!;
  const roll = (front: boolean) => {
    const l = at(front, true);
    const r = at(front, false);
    return Math.atan2(meanW(u, l.nodes) - meanW(u, r.nodes), l.motorMm[1] - r.motorMm[1]);
  };
  return { thrustN, twistDeg: ((roll(true) - roll(false)) * 180) / Math.PI, pattern: 'front-left and rear-right thrust up, front-right and rear-left down' };
}
