import type { Assembly, Vec3 } from '../assembly/index.js';
import { lowestEigenpairs } from './eigen.js';
import { beamMatrices } from './beamElement.js';
import { buildFrameModel, type FrameModel, type FrameModelOptions } from './frameModel.js';
import { assemble, expand, rigidBodyModes } from './model.js';
import { BENDING_DOFS, MEMBRANE_DOFS, shellBlocksInto } from './shellTriangle.js';
import type { PlateMesh } from './mesh.js';
import { normaliseShape } from './solve.js';
import type { RotationBand } from './rotation.js';

/** What a pilot calls a frame mode, from the four motors' motion and the parts' share of the strain energy. */
export type FrameModeKind = 'bounce' | 'body twist' | 'pitch bending' | 'roll bending' | 'in-plane / yaw' | 'single-arm' | 'top-plate' | 'soft-mounted board' | 'mixed';

/** The key of `sharesByPart` for the springs of soft-mounted boards. */
export const SOFT_MOUNTS = 'soft mounts';

const KIND_WORDS: Record<FrameModeKind, string> = {
  bounce: 'all motors in phase',
  'body twist': 'diagonal motor pairs in opposition',
  'pitch bending': 'front pair against rear pair',
  'roll bending': 'left pair against right pair',
  'in-plane / yaw': 'motors move sideways in plan',
  'single-arm': 'one arm moves, the others nearly still',
  'top-plate': 'the top plate moves, the motors nearly still',
  'soft-mounted board': 'a board rocks or bounces on its soft mounts',
  mixed: 'no single pattern',
};

/** Motion of a rigid point (a motor base, a board, the camera) in a mode scaled to 1 mm largest translation. */
export type BodyMotion = Readonly<{
  /** Translation as a fraction of the mode's largest translation. */
  displacementRatio: number;
  /** Rotation per mm of the mode's largest translation. deg/mm. */
  rotationDegPerMm: number;
}>;

export type FrameMode = Readonly<{
  index: number;
  frequencyHz: number;
  kind: FrameModeKind;
  /** Kind with its plain words, e.g. "body twist (diagonal motor pairs in opposition)". */
  name: string;
  /** Vertical motion of each motor's base (assembly motor order), as a fraction of the mode's largest translation, signed. */
  motorsZ: readonly number[];
  /** Share of the mode's strain energy per plate copy, all standoffs, all camera spacers and all soft mounts together (sums to 1). */
  sharesByPart: Readonly<Record<string, number>>;
  /** The flight controller's mount (the stack board, else the bottom plate at the stack mount): what the gyro sees. */
  flightController: BodyMotion | null;
  /** The camera body's rotation: what the picture shows. */
  camera: BodyMotion | null;
  /** Inside the motors' rotation band. */
  inRotationBand: boolean;
  /** Six values per model node [u, v, w, rx, ry, rz], largest translation 1 mm. */
  shape: Float64Array;
}>;

export type FrameModalResult = Readonly<{
  frame: FrameModel;
  nodes: number;
  dof: number;
  massG: number;
  rotationBand: RotationBand | null;
  modes: readonly FrameMode[];
}>;

export type FrameModesOptions = FrameModelOptions &
  Readonly<{
    /** Elastic modes wanted (default 8). */
    modes?: number;
    rotationBand?: RotationBand | null;
  }>;

/** Below this a mode of the free frame is rigid-body motion (or a mechanism). Hz. */
const RIGID_HZ = 1;

/**
 * Natural modes of the assembled frame, free in space: the lowest elastic modes, each named from the
 * motors' motion and the strain energy per part, with what the flight controller and camera feel.
 * @throws FloatingPartError when a part is held by nothing; NotPositiveDefiniteError for another mechanism
 */
export function assembledFrameModes(asm: Assembly, options: FrameModesOptions = {}): FrameModalResult {
  const count = options.modes ?? 8;
  if (!Number.isInteger(count) || count < 1 || count > 200) throw new RangeError(`mode count must be a whole number from 1 to 200 (got ${count})`);
  const fm = buildFrameModel(asm, options);
  const a = assemble(fm.model);
  const r = lowestEigenpairs(a.k, a.m, count, { deflate: rigidBodyModes(fm.model, a) });
  const shapes: Array<{ f: number; shape: Float64Array }> = [];
  r.values.forEach((lambda, i) => {
    const f = Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI);
    if (f >= RIGID_HZ) shapes.push({ f, shape: normaliseShape(expand(a, r.vectors[i])) });
  });
  const energies = strainEnergyShares(fm, shapes.map((s) => s.shape));
  const band = options.rotationBand ?? null;
  const fcNode = flightControllerNode(fm, asm);
  const camNode = fm.components.find((c) => c.componentKind === 'camera')?.node ?? null;
  const modes = shapes.map(({ f, shape }, i) => {
    const motorsZ = fm.motors.map((m) => pointMotion(fm, shape, m.node, m.baseMm)[2]);
    const motorsH = fm.motors.map((m) => Math.hypot(...pointMotion(fm, shape, m.node, m.baseMm).slice(0, 2)));
    const kind = classify(asm, motorsZ, motorsH, energies[i]);
    return {
      index: i + 1,
      frequencyHz: f,
      kind,
      name: `${kind} (${KIND_WORDS[kind]})`,
      motorsZ,
      sharesByPart: energies[i],
      flightController: fcNode === null ? null : bodyMotion(shape, fcNode),
      camera: camNode === null ? null : bodyMotion(shape, camNode),
      inRotationBand: band !== null && f >= band.lowHz && f <= band.highHz,
      shape,
    };
  });
  return { frame: fm, nodes: fm.model.xyz.length / 3, dof: a.k.n, massG: fm.massG, rotationBand: band, modes };
}

/** Translation of a point rigidly carried by node n (the motor base under its centre of mass). */
function pointMotion(fm: FrameModel, s: Float64Array, n: number, p: readonly number[]): Vec3 {
  const x = fm.model.xyz;
  const r = [p[0] - x[3 * n], p[1] - x[3 * n + 1], p[2] - x[3 * n + 2]];
  const [u, v, w, ax, ay, az] = s.subarray(6 * n, 6 * n + 6);
  return [u + ay * r[2] - az * r[1], v + az * r[0] - ax * r[2], w + ax * r[1] - ay * r[0]];
}

const bodyMotion = (s: Float64Array, n: number): BodyMotion => ({
  displacementRatio: Math.hypot(s[6 * n], s[6 * n + 1], s[6 * n + 2]),
  rotationDegPerMm: (Math.hypot(s[6 * n + 3], s[6 * n + 4], s[6 * n + 5]) * 180) / Math.PI,
});

/** The stack board's node, else the bottom-plate node nearest the first stack mount's centre. */
function flightControllerNode(fm: FrameModel, asm: Assembly): number | null {
  const stack = fm.components.find((c) => c.componentKind === 'stack');
  if (stack) return stack.node;
  const bottom = fm.plates.find((p) => p.plate.part.role === 'bottom');
  const holes = bottom?.plate.part.features.filter((f) => f.purpose === 'stack-bolt' && f.centerMm) ?? [];
  if (!bottom || !holes.length) return null;
  const c = holes.reduce((s, f) => [s[0] + f.centerMm![0] / holes.length, s[1] + f.centerMm![1] / holes.length], [0, 0]);
  let best = bottom.firstNode;
  let bestD = Infinity;
  for (let i = 0; i < bottom.mesh.xy.length / 2; i++) {
    const d = Math.hypot(bottom.mesh.xy[2 * i] - c[0], bottom.mesh.xy[2 * i + 1] - c[1]);
    if (d < bestD) [best, bestD] = [bottom.firstNode + i, d];
  }
  void asm;
  return best;
}

/**
 * Strain energy ½ uᵀK u per plate copy and for the standoffs and spacers together, as shares of the
 * total, for every mode at once. Each distinct triangle's matrices are formed once (copies of a
 * plate share them) and the mode shapes turned into element axes instead.
 */
function strainEnergyShares(fm: FrameModel, shapes: readonly Float64Array[]): Array<Record<string, number>> {
  const { model } = fm;
  const per = shapes.map(() => new Map<string, number>());
  const add = (i: number, key: string, e: number) => per[i].set(key, (per[i].get(key) ?? 0) + e);
  const bend = new Float64Array(81);
  const mem = new Float64Array(81);
  const u = new Float64Array(18);
  const x: [number, number, number] = [0, 0, 0];
  const y: [number, number, number] = [0, 0, 0];
  // Element DOF index (of 18) of each of the 9 rows of the bending and membrane blocks.
  const bendAt = Int32Array.from({ length: 9 }, (_, i) => 6 * Math.floor(i / 3) + BENDING_DOFS[i % 3]);
  const memAt = Int32Array.from({ length: 9 }, (_, i) => 6 * Math.floor(i / 3) + MEMBRANE_DOFS[i % 3]);
  /** uᵀ K u over one 9×9 block of k starting at `at`. */
  const quad = (k: Float64Array, at: number, dofs: Int32Array): number => {
    let e = 0;
    for (let i = 0; i < 9; i++) {
      const ui = u[dofs[i]];
      if (ui === 0) continue;
      let row = 0;
      for (let j = 0; j < 9; j++) row += k[at + i * 9 + j] * u[dofs[j]];
      e += ui * row;
    }
    return e;
  };
  const blocksOf = new Map<PlateMesh, Float64Array[]>();
  for (const pm of fm.plates) {
    const lam = model.laminates[model.triangleLaminate[pm.firstTriangle]];
    const r = model.frames!.subarray(9 * pm.firstTriangle, 9 * pm.firstTriangle + 9);
    const tris = pm.mesh.triangles;
    let blocks = blocksOf.get(pm.mesh);
    if (!blocks) {
      blocks = [];
      for (let t = 0; t < tris.length; t += 3) {
        for (let a = 0; a < 3; a++) {
          x[a] = pm.mesh.xy[2 * tris[t + a]];
          y[a] = pm.mesh.xy[2 * tris[t + a] + 1];
        }
        bend.fill(0);
        mem.fill(0);
        shellBlocksInto(x, y, lam.a, lam.d, lam.shearStiffnessNPerMm, bend, mem);
        const both = new Float64Array(162);
        both.set(bend, 0);
        both.set(mem, 81);
        blocks.push(both);
      }
      blocksOf.set(pm.mesh, blocks);
    }
    shapes.forEach((s, i) => {
      let e = 0;
      for (let t = 0; t < tris.length; t += 3) {
        // The corners' six values in element axes: u_local = r · u_global for translations and rotations.
        for (let a = 0; a < 3; a++) {
          const g = 6 * (pm.firstNode + tris[t + a]);
          for (let h = 0; h < 2; h++) {
            const o = g + 3 * h;
            for (let c = 0; c < 3; c++) u[6 * a + 3 * h + c] = r[3 * c] * s[o] + r[3 * c + 1] * s[o + 1] + r[3 * c + 2] * s[o + 2];
          }
        }
        const kb = blocks![t / 3];
        e += quad(kb, 0, bendAt) + quad(kb, 81, memAt);
      }
      add(i, pm.plate.id, e / 2);
    });
  }
  const energy = (k: Float64Array, dofs: number[], s: Float64Array) => {
    const n = dofs.length;
    let e = 0;
    for (let i = 0; i < n; i++) {
      const ui = s[dofs[i]];
      if (ui === 0) continue;
      let row = 0;
      for (let j = 0; j < n; j++) row += k[i * n + j] * s[dofs[j]];
      e += ui * row;
    }
    return e / 2;
  };
  for (const c of fm.connectors) {
    for (let e = c.firstBeam; e < c.firstBeam + c.beams; e++) {
      const bm = model.beams![e];
      const [p, q] = bm.nodes.map((v) => Array.from(model.xyz.subarray(3 * v, 3 * v + 3)));
      const { k } = beamMatrices(bm.section, p, q);
      const dofs = bm.nodes.flatMap((v) => [0, 1, 2, 3, 4, 5].map((d) => 6 * v + d));
      const key = c.kind === 'standoff' ? 'standoffs' : 'camera spacers';
      shapes.forEach((s, i) => add(i, key, energy(k, dofs, s)));
    }
  }
  for (const sp of model.springs ?? []) {
    const [p, q] = sp.nodes;
    shapes.forEach((s, i) => {
      let e = 0;
      for (let d = 0; d < 3; d++) e += sp.stiffnessNPerMm[d] * (s[6 * p + d] - s[6 * q + d]) ** 2;
      add(i, SOFT_MOUNTS, e / 2);
    });
  }
  return per.map((m) => {
    const total = [...m.values()].reduce((a, b) => a + b, 0);
    return Object.fromEntries([...m.entries()].map(([k, v]) => [k, total > 0 ? v / total : 0]));
  });
}

/** Motors moving less than this fraction of the mode's largest motion do not define it (judgement, no standard). */
const MOTORS_STILL = 0.1;
/** In a single-arm mode the second-largest motor motion is below this fraction of the largest (judgement, no standard). */
const ONE_ARM = 0.25;
/** A pattern must explain this much of the motors' vertical motion to name the mode (judgement). */
const PATTERN_FIT = 0.8;

/**
 * Name a mode: sideways motor motion → in-plane / yaw; motors still and the top plate holding most of
 * the energy → top-plate; one motor moving alone → single-arm; else the best of the four sign
 * patterns of the motors' vertical motion (bounce, body twist, pitch and roll bending).
 */
function classify(asm: Assembly, z: readonly number[], h: readonly number[], shares: Readonly<Record<string, number>>): FrameModeKind {
  if ((shares[SOFT_MOUNTS] ?? 0) > 0.5) return 'soft-mounted board';
  const zMax = Math.max(0, ...z.map(Math.abs));
  const hMax = Math.max(0, ...h);
  const topShare = Object.entries(shares)
    .filter(([k]) => asm.plates.some((p) => p.id === k && p.part.role === 'top'))
    .reduce((s, [, v]) => s + v, 0);
  if (zMax < MOTORS_STILL && hMax < MOTORS_STILL) return topShare > 0.4 ? 'top-plate' : 'mixed';
  if (hMax > 1.5 * zMax) return 'in-plane / yaw';
  if (z.length !== 4) return 'mixed';
  const sorted = z.map(Math.abs).sort((a, b) => b - a);
  if (sorted[1] < ONE_ARM * sorted[0]) return 'single-arm';
  const sites = asm.motors.map((m) => m.site);
  const front = sites.map((s) => (s.startsWith('front') ? 1 : -1));
  const left = sites.map((s) => (s.endsWith('left') ? 1 : -1));
  const patterns: Array<[FrameModeKind, number[]]> = [
    ['bounce', [1, 1, 1, 1]],
    ['body twist', front.map((f, i) => f * left[i])],
    ['pitch bending', front],
    ['roll bending', left],
  ];
  const norm = Math.hypot(...z);
  let best: FrameModeKind = 'mixed';
  let bestFit = PATTERN_FIT;
  for (const [kind, p] of patterns) {
    const fit = Math.abs(p.reduce((s, v, i) => s + v * z[i], 0)) / (2 * norm);
    if (fit > bestFit) [best, bestFit] = [kind, fit];
  }
  return best;
}
