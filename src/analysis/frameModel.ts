import { centreOfMass, componentMassBody, inertiaAboutCentre, type Assembly, type BoltedJoint, type Component, type PlacedPlate, type Standoff, type Vec3 } from '../assembly/index.js';
import type { Vec2 } from '../geometry/index.js';
import { roundBar, type BeamSection } from './beamElement.js';
import type { Laminate } from './laminate.js';
import { meshPart, type PlateMesh, type RingRequest } from './mesh.js';
import type { Beam, FeModel, PointMass, RigidGroup, Spring } from './model.js';
import { defaultMeshSizeMm, G_TO_T, partLaminate } from './plateModel.js';

/**
 * The assembled frame as one finite-element model, built from the assembly stage's model (plates at
 * their poses, bolted joints, standoffs, motors, components). The idealisation (README, "Stiffness
 * and resonance"):
 *  - every plate copy a shell at its own mid-plane, woven laminate from its material;
 *  - a bolted joint makes all plate material within the screw head's radius (the joint's
 *    `headRadiusMm`) move as one rigid body through the whole stack, all six DOFs; that body carries
 *    its screw, nut and washer (`hardwareMass`) as a rigid mass: their mass and rotary inertia at
 *    their centre of mass;
 *  - standoffs and camera spacers are Timoshenko beams from plate mid-plane to plate mid-plane, solid
 *    round of their outside size, ends clamped into their joints, with the spacer's own mass;
 *  - each motor a rigid body with its mass and rotary inertia at its centre of mass, tied to the arm
 *    over its motor screws' head footprints;
 *  - components rigid masses at their centres of mass, tied to what they are screwed or strapped to;
 *  - vertical plates that stand between the bottom and top plate (camera sides) rest on them: their
 *    edge nodes there are tied to the nearest node of the plate they touch.
 */

/** Elements per standoff: the clamped–clamped sway of a beam is within 0.1 % with four (Blevins check in the tests). */
const BEAM_ELEMENTS = 4;
/** A vertical plate's edge within this fraction of its thickness of a plate face rests on that plate. */
const REST_GAP_FRACTION = 0.5;

/** Aluminium alloys of standoffs: E, ν (ASM handbook values; reference-values.md). */
const ALLOY: Record<string, { youngGpa: number; poisson: number }> = {
  'aluminium-6061': { youngGpa: 68.9, poisson: 0.33 },
  'aluminium-7075': { youngGpa: 71.7, poisson: 0.33 },
};

export type PlateInModel = Readonly<{
  plate: PlacedPlate;
  mesh: PlateMesh;
  /** Model nodes firstNode .. firstNode + node count − 1 are this copy's mesh nodes, in mesh order. */
  firstNode: number;
  firstTriangle: number;
}>;

export type ConnectorInModel = Readonly<{ id: string; kind: 'standoff' | 'camera-spacer'; firstBeam: number; beams: number; nodes: readonly number[] }>;

export type BodyInModel = Readonly<{ id: string; kind: 'motor' | 'component'; node: number; massG: number }>;

/** The frame model and where each assembly item went in it. */
export type FrameModel = Readonly<{
  model: FeModel;
  plates: readonly PlateInModel[];
  connectors: readonly ConnectorInModel[];
  motors: readonly (BodyInModel & { site: string; baseMm: Vec3 })[];
  components: readonly (BodyInModel & { componentKind: string })[];
  /** Master node of each joint (its rigid body's reference point). */
  joints: ReadonlyMap<string, number>;
  massG: number;
}>;

/** A part of the assembly that nothing holds: the model would be a mechanism. */
export class FloatingPartError extends Error {
  constructor(readonly partId: string) {
    super(`${partId} is not connected to the rest of the frame: no joint, standoff or resting contact holds it`);
  }
}

export type FrameModelOptions = Readonly<{
  /** One element size for every plate, mm; default per plate (`defaultMeshSizeMm`). */
  meshSizeMm?: number;
}>;

class Builder {
  readonly xyz: number[] = [];
  readonly triangles: number[] = [];
  readonly triLam: number[] = [];
  readonly frames: number[] = [];
  readonly laminates: Laminate[] = [];
  readonly beams: Beam[] = [];
  readonly masses: PointMass[] = [];
  readonly rigid: RigidGroup[] = [];
  readonly springs: Spring[] = [];
  node(p: readonly number[]): number {
    this.xyz.push(p[0], p[1], p[2]);
    return this.xyz.length / 3 - 1;
  }
  at(n: number): Vec3 {
    return [this.xyz[3 * n], this.xyz[3 * n + 1], this.xyz[3 * n + 2]];
  }
}

const sub = (a: readonly number[], b: readonly number[]): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: readonly number[], b: readonly number[]): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: readonly number[], b: readonly number[]): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];

/** A frame point in the plate's own (part) coordinates. */
const toPart = (pl: PlacedPlate, p: readonly number[]): Vec2 => {
  const d = sub(p, pl.pose.originMm);
  return [dot(d, pl.pose.uAxis), dot(d, pl.pose.vAxis)];
};

/** A part point on the plate's mid-plane, in frame coordinates. */
const midPlane = (pl: PlacedPlate, u: number, v: number): Vec3 => {
  const { originMm: o, uAxis: a, vAxis: b, normal: n } = pl.pose;
  const w = pl.thicknessMm / 2;
  return [o[0] + u * a[0] + v * b[0] + w * n[0], o[1] + u * a[1] + v * b[1] + w * n[1], o[2] + u * a[2] + v * b[2] + w * n[2]];
};

/** Where a joint's axis crosses a plate: the head point for camera screws (±y), the plan point for the rest. */
const jointPoint = (j: BoltedJoint): Vec3 => (Math.abs(j.axis[2]) > 0.5 ? [j.planMm[0], j.planMm[1], j.headAtMm[2]] : j.headAtMm);

/**
 * Build the finite-element model of the assembled frame.
 * @throws FloatingPartError naming the first plate, standoff, motor or component that nothing holds
 */
export function buildFrameModel(asm: Assembly, options: FrameModelOptions = {}): FrameModel {
  const b = new Builder();
  const plateById = new Map(asm.plates.map((p) => [p.id, p]));
  // Rings at every joint's head radius about its hole, per plate copy.
  const ringsOf = new Map<string, RingRequest[]>();
  for (const j of asm.joints) {
    for (const id of j.clamps) {
      const pl = plateById.get(id);
      if (!pl) continue;
      const list = ringsOf.get(id) ?? [];
      const c = toPart(pl, jointPoint(j));
      if (!list.some((r) => Math.hypot(r.centreMm[0] - c[0], r.centreMm[1] - c[1]) < 1e-6)) list.push({ centreMm: c, radiusMm: j.headRadiusMm });
      ringsOf.set(id, list);
    }
  }
  const sizeOf = frameMeshSizes(asm);
  const meshes = new Map<string, PlateMesh>();
  /** First triangle of the first copy of each shared mesh (copies reuse its element matrices). */
  const firstOfMesh = new Map<PlateMesh, number>();
  const source: number[] = [];
  const lamIndex = new Map<number, number>();
  const plates: PlateInModel[] = asm.plates.map((pl) => {
    const rings = ringsOf.get(pl.id) ?? [];
    // Copies of a part whose rings coincide share a mesh; mirrored copies mirror their rings' part points anyway.
    const key = `${pl.partIndex}|${rings.map((r) => `${r.centreMm[0].toFixed(4)},${r.centreMm[1].toFixed(4)},${r.radiusMm}`).sort().join(';')}`;
    let mesh = meshes.get(key);
    if (!mesh) {
      mesh = meshPart(pl.part, options.meshSizeMm ?? sizeOf(pl.part), { rings });
      meshes.set(key, mesh);
    }
    if (!lamIndex.has(pl.partIndex)) {
      lamIndex.set(pl.partIndex, b.laminates.length);
      b.laminates.push(partLaminate(pl.part, `plate ${pl.id}`));
    }
    const firstNode = b.xyz.length / 3;
    const firstTriangle = b.triangles.length / 3;
    for (let i = 0; i < mesh.xy.length / 2; i++) b.node(midPlane(pl, mesh.xy[2 * i], mesh.xy[2 * i + 1]));
    const e3 = cross(pl.pose.uAxis, pl.pose.vAxis);
    for (let t = 0; t < mesh.triangles.length; t++) b.triangles.push(firstNode + mesh.triangles[t]);
    const first = firstOfMesh.get(mesh) ?? firstTriangle;
    firstOfMesh.set(mesh, first);
    for (let t = 0; t < mesh.triangles.length / 3; t++) source.push(first + t);
    for (let t = 0; t < mesh.triangles.length / 3; t++) {
      b.frames.push(...pl.pose.uAxis, ...pl.pose.vAxis, ...e3);
      b.triLam.push(lamIndex.get(pl.partIndex)!);
    }
    return { plate: pl, mesh, firstNode, firstTriangle };
  });
  const inModel = new Map(plates.map((p) => [p.plate.id, p]));
  /** Nodes of a plate copy within r of a frame point (measured in the plate's plane). */
  const nodesNear = (id: string, p: readonly number[], r: number): number[] => {
    const pm = inModel.get(id);
    if (!pm) return [];
    const c = toPart(pm.plate, p);
    const out: number[] = [];
    const tol = 1e-6 * Math.max(1, r);
    for (let i = 0; i < pm.mesh.xy.length / 2; i++) if (Math.hypot(pm.mesh.xy[2 * i] - c[0], pm.mesh.xy[2 * i + 1] - c[1]) <= r + tol) out.push(pm.firstNode + i);
    return out;
  };
  const nearestNode = (ids: readonly string[], p: readonly number[]): number => {
    let best = -1;
    let bestD = Infinity;
    for (const id of ids) {
      const pm = inModel.get(id);
      if (!pm) continue;
      for (let i = 0; i < pm.mesh.xy.length / 2; i++) {
        const d = Math.hypot(...sub(b.at(pm.firstNode + i), p));
        if (d < bestD) [best, bestD] = [pm.firstNode + i, d];
      }
    }
    return best;
  };
  /** Nodes of a horizontal plate copy under a box's plan footprint (what a board or battery resting on it covers). */
  const nodesUnder = (id: string, box: Component['boxes'][number]): number[] => {
    const pm = inModel.get(id);
    if (!pm || pm.plate.orientation !== 'horizontal') return [];
    const out: number[] = [];
    const [ax, ay] = box.axes;
    for (let i = 0; i < pm.mesh.xy.length / 2; i++) {
      const p = b.at(pm.firstNode + i);
      const d = [p[0] - box.centreMm[0], p[1] - box.centreMm[1]];
      if (Math.abs(d[0] * ax[0] + d[1] * ax[1]) <= box.halfSizeMm[0] + 1e-6 && Math.abs(d[0] * ay[0] + d[1] * ay[1]) <= box.halfSizeMm[1] + 1e-6) out.push(pm.firstNode + i);
    }
    return out;
  };
  // Standoffs and camera spacers: beams between the mid-planes of the plates their ends are screwed to.
  const endNodes = new Map<string, number>();
  const connectors: ConnectorInModel[] = [];
  const spacerKinds: Array<[readonly Standoff[], ConnectorInModel['kind']]> = [
    [asm.standoffs, 'standoff'],
    [asm.cameraSpacers, 'camera-spacer'],
  ];
  for (const [list, kind] of spacerKinds) {
    for (const so of list) {
      const start = so.startMm;
      const end: Vec3 = [start[0] + so.axis[0] * so.lengthMm, start[1] + so.axis[1] * so.lengthMm, start[2] + so.axis[2] * so.lengthMm];
      const endOn = (which: 'bottom' | 'top', point: Vec3): Vec3 => {
        const j = asm.joints.find((jj) => jj.standoffEnds.some((e) => e.standoff === so.id && e.end === which));
        const touching = j?.clamps.map((id) => plateById.get(id)!).filter(Boolean) ?? [];
        if (!touching.length) return point;
        // The clamped plate nearest the end face along the axis.
        const dist = (pl: PlacedPlate) => Math.abs(dot(sub(midPlane(pl, ...toPart(pl, point)), point), pl.pose.normal));
        const pl = touching.reduce((x, y) => (dist(y) < dist(x) ? y : x));
        const m = midPlane(pl, ...toPart(pl, point));
        const s = dot(sub(m, point), pl.pose.normal) / dot(so.axis, pl.pose.normal);
        return [point[0] + s * so.axis[0], point[1] + s * so.axis[1], point[2] + s * so.axis[2]];
      };
      const a = endOn('bottom', start);
      const z = endOn('top', end);
      const alloy = ALLOY[so.material] ?? ALLOY['aluminium-6061'];
      // Stiff as a solid round bar of the outside size; as heavy as the spacer (hex, threaded bore), its mass spread over the beam.
      const solid: BeamSection = roundBar(so.acrossFlatsMm, alloy.youngGpa, alloy.poisson, so.densityGPerCm3);
      const section: BeamSection = { ...solid, densityTPerMm3: (so.massG * G_TO_T) / (solid.areaMm2 * Math.hypot(...sub(z, a))) };
      const nodes: number[] = [];
      for (let k = 0; k <= BEAM_ELEMENTS; k++) nodes.push(b.node([0, 1, 2].map((i) => a[i] + ((z[i] - a[i]) * k) / BEAM_ELEMENTS)));
      const firstBeam = b.beams.length;
      for (let k = 0; k < BEAM_ELEMENTS; k++) b.beams.push({ nodes: [nodes[k], nodes[k + 1]], section });
      endNodes.set(`${so.id}|bottom`, nodes[0]);
      endNodes.set(`${so.id}|top`, nodes[BEAM_ELEMENTS]);
      connectors.push({ id: so.id, kind, firstBeam, beams: BEAM_ELEMENTS, nodes });
    }
  }
  // Joints: one rigid body over the head footprint in every clamped plate, and the standoff ends.
  const joints = new Map<string, number>();
  for (const j of asm.joints) {
    const ends = j.standoffEnds.map((e) => endNodes.get(`${e.standoff}|${e.end}`)).filter((n): n is number => n !== undefined);
    const slaves: number[] = [];
    for (const id of j.clamps) slaves.push(...nodesNear(id, jointPoint(j), j.headRadiusMm));
    let master: number;
    if (ends.length) master = ends[0];
    else {
      const mids = j.clamps.map((id) => plateById.get(id)).filter((p): p is PlacedPlate => !!p).map((pl) => midPlane(pl, ...toPart(pl, jointPoint(j))));
      const c = mids.reduce((s, p) => [s[0] + p[0] / mids.length, s[1] + p[1] / mids.length, s[2] + p[2] / mids.length], [0, 0, 0]);
      master = b.node(c);
    }
    b.rigid.push({ master, slaves: [...ends.slice(1), ...slaves] });
    joints.set(j.id, master);
    if (j.hardwareMass.massG > 0) {
      const at = b.node(centreOfMass(j.hardwareMass));
      b.rigid.push({ master, slaves: [at] });
      b.masses.push({ node: at, massT: j.hardwareMass.massG * G_TO_T, inertiaTMm2: inertia(inertiaAboutCentre(j.hardwareMass)) });
    }
  }
  // Motors: rigid bodies at their centres of mass, tied to their screws' joints.
  const motors = asm.motors.map((m) => {
    const node = b.node(m.cgMm);
    b.masses.push({ node, massT: m.massG * G_TO_T, inertiaTMm2: inertia(m.inertiaGMm2) });
    const screws = asm.joints.filter((j) => j.kind === 'motor' && j.clamps.includes(m.onPlate) && Math.hypot(j.planMm[0] - m.baseCentreMm[0], j.planMm[1] - m.baseCentreMm[1]) <= m.bellDiameterMm / 2);
    const slaves = screws.map((j) => joints.get(j.id)!);
    if (!slaves.length) slaves.push(...nodesNear(m.onPlate, m.baseCentreMm, m.bellDiameterMm / 4));
    b.rigid.push({ master: node, slaves });
    return { id: `motor ${m.site}`, kind: 'motor' as const, node, massG: m.massG, site: m.site, baseMm: m.baseCentreMm };
  });
  // Components, each a rigid mass on its mounts (see `componentMount`).
  const stackScrews = new Map<string, number[]>();
  const components = asm.components.map((c) => {
    const node = b.node(c.cgMm);
    b.masses.push({ node, massT: c.massG * G_TO_T, inertiaTMm2: inertia(inertiaAboutCentre(componentMassBody(c))) });
    const onPlates = c.mountedOn.filter((id) => plateById.has(id));
    const mount = c.mountedOn.find((id) => id.startsWith('stack mount'));
    // Screws at its mount points (a stack's, the camera's pivots), else the screws of the stack it sits on.
    const screws: number[] = [];
    for (const p of c.mountPointsMm) {
      const j = asm.joints.find((jj) => distanceToAxis(jj, p) < 0.5 && (jj.kind === 'stack' || jj.kind === 'camera-pivot' || jj.clamps.some((id) => onPlates.includes(id))));
      if (j && !screws.includes(joints.get(j.id)!)) screws.push(joints.get(j.id)!);
    }
    if (!screws.length && mount) screws.push(...(stackScrews.get(mount) ?? []));
    if (screws.length && mount && !stackScrews.has(mount)) stackScrews.set(mount, screws);
    if (componentMount(c, screws.length > 0) === 'springs') {
      for (const m of screws) {
        const at = b.node(b.at(m));
        b.rigid.push({ master: node, slaves: [at] });
        const k = c.softMountNPerMm!;
        b.springs.push({ nodes: [at, m], stiffnessNPerMm: [k, k, k] });
      }
    } else {
      let slaves = screws;
      if (!slaves.length) slaves = onPlates.flatMap((id) => nodesUnder(id, c.boxes[0]));
      if (!slaves.length) slaves = [nearestNode(onPlates.length ? onPlates : asm.plates.map((pl) => pl.id), c.mountPointsMm[0] ?? c.cgMm)];
      b.rigid.push({ master: node, slaves });
    }
    return { id: c.id, kind: 'component' as const, node, massG: c.massG, componentKind: c.kind };
  });
  // Vertical plates resting between horizontal ones: their edge nodes at a plate face follow that plate.
  for (const pm of plates.filter((p) => p.plate.orientation === 'vertical')) {
    const gap = REST_GAP_FRACTION * pm.plate.thicknessMm;
    for (const local of pm.mesh.loops[0]) {
      const n = pm.firstNode + local;
      const p = b.at(n);
      for (const other of plates) {
        if (other.plate.orientation !== 'horizontal') continue;
        const lo = other.plate.zLowMm;
        const hi = lo + other.plate.thicknessMm;
        const touches = Math.abs(p[2] - hi) <= gap || Math.abs(p[2] - lo) <= gap;
        if (!touches || !insidePlan(other.plate, p)) continue;
        const m = nearestNode([other.plate.id], p);
        if (m >= 0) b.rigid.push({ master: m, slaves: [n] });
      }
    }
  }
  const nNodes = b.xyz.length / 3;
  const model: FeModel = {
    xyz: Float64Array.from(b.xyz),
    triangles: Uint32Array.from(b.triangles),
    laminates: b.laminates,
    triangleLaminate: Uint16Array.from(b.triLam),
    frames: Float64Array.from(b.frames),
    pointMasses: b.masses,
    fixed: new Uint8Array(6 * nNodes),
    beams: b.beams,
    rigid: b.rigid,
    springs: b.springs,
    triangleSource: Uint32Array.from(source),
  };
  const fm: FrameModel = {
    model,
    plates,
    connectors,
    motors,
    components,
    joints,
    massG:
      asm.plates.reduce((s, p) => s + p.massG, 0) +
      [...asm.standoffs, ...asm.cameraSpacers].reduce((s, so) => s + so.massG, 0) +
      asm.joints.reduce((s, j) => s + j.hardwareMass.massG, 0) +
      asm.motors.reduce((s, m) => s + m.massG, 0) +
      asm.components.reduce((s, c) => s + c.massG, 0),
  };
  checkConnected(fm);
  return fm;
}

/**
 * Elements across the narrowest strut of a part, and the coarser size of braces and camera side
 * plates (stiff small parts that hold little of the strain energy). Measured on Tessel 5 against a
 * mesh at half the size everywhere: first four modes within 1.7 % (three across: 1.1 %, a third
 * more unknowns); the coarser small parts move them by under 0.2 %.
 */
const ELEMENTS_ACROSS_STRUT = 2;
const SMALL_PART_COARSENING = 1.5;

/**
 * Element size per part in the frame model: the bottom plate's default size (a thirtieth of √area)
 * for every plate, finer only where a part has narrow struts (two elements across the narrowest),
 * coarser on braces and camera side plates, so small parts are not meshed finer than the body that
 * carries them. mm.
 */
export function frameMeshSizes(asm: Assembly): (part: PlacedPlate['part']) => number {
  const bottom = asm.plates.find((p) => p.part.role === 'bottom')?.part;
  const body = bottom ? defaultMeshSizeMm(bottom) : Math.max(...asm.plates.map((p) => defaultMeshSizeMm(p.part)));
  return (part) => {
    const widths = part.members.map((m) => m.widthMm).filter((w) => w > 0);
    if (widths.length) return Math.min(body, Math.min(...widths) / ELEMENTS_ACROSS_STRUT);
    return part.role === 'brace' || part.role === 'camera-side' ? SMALL_PART_COARSENING * body : body;
  };
}

/**
 * How a component hangs on the frame (the idealisation of the README): hard-mounted, a rigid body with
 * what holds it — the screws at its mount points (a stack's boards, a board on a stack, the camera
 * clamped between its side plates by its pivot screws), else the plate under its footprint (a
 * strapped battery or a board stuck to a plate; an antenna at the point it leaves the frame);
 * soft-mounted boards (`softMountNPerMm`) instead ride on one spring per mount screw.
 */
export function componentMount(c: Component, onScrews: boolean): 'rigid' | 'springs' {
  return c.softMountNPerMm !== undefined && onScrews ? 'springs' : 'rigid';
}

/** Inertia tensor (row-major 3×3, g·mm²) as the model's [Ixx, Iyy, Izz, Ixy, Iyz, Izx] in t·mm². */
function inertia(m: readonly number[]): [number, number, number, number, number, number] {
  return [m[0], m[4], m[8], m[1], m[5], m[2]].map((x) => x * G_TO_T) as [number, number, number, number, number, number];
}

function distanceToAxis(j: BoltedJoint, p: readonly number[]): number {
  const d = sub(p, j.headAtMm);
  const along = dot(d, j.axis);
  return Math.hypot(d[0] - along * j.axis[0], d[1] - along * j.axis[1], d[2] - along * j.axis[2]);
}

function insidePlan(pl: PlacedPlate, p: readonly number[]): boolean {
  const b = pl.bounds;
  return p[0] >= b.minMm[0] && p[0] <= b.maxMm[0] && p[1] >= b.minMm[1] && p[1] <= b.maxMm[1];
}

/** Every plate, connector, motor and component must be joined (through elements and rigid bodies) to the bottom plate. */
function checkConnected(fm: FrameModel): void {
  const { model } = fm;
  const n = model.xyz.length / 3;
  const up = Int32Array.from({ length: n }, (_, i) => i);
  const find = (v: number): number => {
    while (up[v] !== v) {
      up[v] = up[up[v]];
      v = up[v];
    }
    return v;
  };
  const join = (a: number, c: number) => {
    const ra = find(a);
    const rc = find(c);
    if (ra !== rc) up[ra] = rc;
  };
  const t = model.triangles;
  for (let k = 0; k < t.length; k += 3) {
    join(t[k], t[k + 1]);
    join(t[k], t[k + 2]);
  }
  for (const bm of model.beams ?? []) join(bm.nodes[0], bm.nodes[1]);
  for (const g of model.rigid ?? []) for (const s of g.slaves) join(g.master, s);
  for (const sp of model.springs ?? []) join(sp.nodes[0], sp.nodes[1]);
  const bottom = fm.plates.find((p) => p.plate.part.role === 'bottom') ?? fm.plates[0];
  if (!bottom) return;
  const root = find(bottom.firstNode);
  for (const p of fm.plates) {
    const count = p.mesh.xy.length / 2;
    for (let i = 0; i < count; i++) if (find(p.firstNode + i) !== root) throw new FloatingPartError(`plate ${p.plate.id}`);
  }
  for (const c of fm.connectors) if (c.nodes.some((v) => find(v) !== root)) throw new FloatingPartError(`${c.kind} ${c.id}`);
  for (const m of fm.motors) if (find(m.node) !== root) throw new FloatingPartError(m.id);
  for (const c of fm.components) if (find(c.node) !== root) throw new FloatingPartError(`component ${c.id}`);
}
