import type { Frame, Part } from '../geometry/index.js';
import { cholesky, choleskySolve } from './sparse.js';
import { assemble, expand, restrict } from './model.js';
import { defaultMeshSizeMm, featureCentre, featureNodes, motorsOnPlate, plateModel, withFixed, type PlateModel } from './plateModel.js';
import { BENDING_DOFS } from './shellTriangle.js';

export type ArmStatics = Readonly<{ thrustN: number; tipDeflectionMm: number; stiffnessNPerMm: number }>;
export type TipDeflection = Readonly<{ site: string; thrustN: number; tipDeflectionMm: number }>;
export type BodyTwist = Readonly<{ thrustN: number; twistDeg: number; pattern: string }>;

/**
 * The plate held only at the mesh node nearest the stack centre (w and both tilts), so a
 * self-balanced load twists it without any other support stiffening it.
 */
function heldAtStack(pm0: PlateModel): PlateModel {
  const stacks = featureNodes(pm0, 'stack-bolt').map((f) => featureCentre(pm0, f.feature, f.nodes));
  const c = stacks.length ? [stacks.reduce((s, p) => s + p[0], 0) / stacks.length, stacks.reduce((s, p) => s + p[1], 0) / stacks.length] : [0, 0];
  let hold = 0;
  let best = Infinity;
  for (let i = 0; i < pm0.mesh.xy.length / 2; i++) {
    const d = Math.hypot(pm0.mesh.xy[2 * i] - c[0], pm0.mesh.xy[2 * i + 1] - c[1]);
    if (d < best) [best, hold] = [d, i];
  }
  return withFixed(pm0, [hold], [2, 3, 4]);
}

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
  const pm = heldAtStack(pm0);
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

/**
 * Body twist of a separate-arm frame's bottom plate under opposite thrusts (front-left and
 * rear-right up, the others down). Each arm is taken as rigid and clamped at its root bolts, so its
 * thrust F at the motor (distance m along the arm line) reaches the plate as bolt forces that carry
 * both F and the moment F·(m − ā): P_k = F [1/n + (m − ā)(a_k − ā) / Σ(a_j − ā)²] (statics of a
 * rigid bar on n supports; one bolt carries F only). The plate is held at the node nearest the
 * stack centre; twist = roll of the front root pair minus roll of the rear pair. Plate alone: the top
 * plate and standoffs of the assembled frame stiffen it further, so this is an upper bound. deg.
 * @throws RangeError when the plate has no arm-root bolt holes
 */
export function rootLoadedBodyTwist(part: Part, sites: Frame['sites'], thrustN: number, meshSizeMm?: number): BodyTwist {
  const pm0 = plateModel(part, meshSizeMm ?? defaultMeshSizeMm(part));
  const roots = featureNodes(pm0, 'arm-root-bolt').map((r) => ({ ...r, centre: featureCentre(pm0, r.feature, r.nodes) }));
  if (!roots.length) throw new RangeError(`part ${part.name} has no arm-root bolt holes to load`);
  const along = (s: Frame['sites'][number], p: readonly number[]) =>
    (p[0] - s.armLineOriginMm[0]) * Math.cos(s.armDirRad) + (p[1] - s.armLineOriginMm[1]) * Math.sin(s.armDirRad);
  const across = (s: Frame['sites'][number], p: readonly number[]) =>
    Math.abs(-(p[0] - s.armLineOriginMm[0]) * Math.sin(s.armDirRad) + (p[1] - s.armLineOriginMm[1]) * Math.cos(s.armDirRad));
  const bySite = sites.map((s) => ({
    site: s,
    bolts: roots.filter((r) => sites.every((t) => across(s, r.centre) <= across(t, r.centre) && along(s, r.centre) > 0)),
  }));
  const pm = heldAtStack(pm0);
  const f = new Float64Array(pm.model.fixed.length);
  for (const { site, bolts } of bySite) {
    if (!bolts.length) continue;
    const sign = site.front === site.left ? 1 : -1;
    const a = bolts.map((b) => along(site, b.centre));
    const mean = a.reduce((s, x) => s + x, 0) / a.length;
    const spread = a.reduce((s, x) => s + (x - mean) ** 2, 0);
    bolts.forEach((b, k) => {
      const share = 1 / a.length + (spread > 0 ? ((site.motorAlongMm - mean) * (a[k] - mean)) / spread : 0);
      spreadForce(f, b.nodes, sign * thrustN * share);
    });
  }
  const u = solveBending(pm, f);
  const rootW = (front: boolean, left: boolean) => {
    const g = bySite.find((b) => b.site.front === front && b.site.left === left)!;
    const nodes = g.bolts.flatMap((b) => b.nodes);
    const y = g.bolts.reduce((s, b) => s + b.centre[1], 0) / g.bolts.length;
    return { w: meanW(u, nodes), y };
  };
  const roll = (front: boolean) => {
    const l = rootW(front, true);
    const r = rootW(front, false);
    return Math.atan2(l.w - r.w, l.y - r.y);
  };
  return {
    thrustN,
    twistDeg: ((roll(true) - roll(false)) * 180) / Math.PI,
    pattern: 'front-left and rear-right thrust up, front-right and rear-left down; bottom plate alone, loads through rigid arms at the root bolts',
  };
}
