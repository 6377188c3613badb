import { buildAssembly } from '../assembly/build.js';
import type { Assembly } from '../assembly/types.js';
import { motorHeightMm } from '../assembly/parts.js';
import { assembledFrameModes, type FrameModalResult } from './frameModes.js';
import { rotationBandOf } from './rotation.js';
import { type Feature, type Frame, type Material, type Part, type PartRole, type Vec2 } from '../geometry/index.js';
import { describeModes, motionAt, type PointMotion, type ShapeContext } from './describe.js';
import type { PlateMesh } from './mesh.js';
import { defaultMeshSizeMm, featureCentre, featureNodes, footprintRadiusMm, footprintRings, meshMassG, motorsOnPlate, nodesWithin, plateModel, withFixed, withMasses, withRigidMass, type AddedMass, type PlateModel } from './plateModel.js';
import { solvePlateModes } from './solve.js';
import { armTipDeflection, bodyTwist, rootLoadedBodyTwist, type ArmStatics, type BodyTwist, type TipDeflection, unibodyTipDeflections } from './statics.js';
import { DEFAULT_THRUST_N } from './defaults.js';

export type ModeOptions = Readonly<{
  /** Elastic modes wanted per model (default 6, 1 to 200). */
  modes?: number;
  /** Element size, mm; default a thirtieth of √area, 0.5 to 4 mm (`defaultMeshSizeMm`). */
  meshSizeMm?: number;
  /** Mass of one motor, g, spread over its bolt-hole edges. Default: estimated from the bell diameter in frameModes, 0 otherwise. */
  motorMassG?: number;
  /**
   * Screws, nuts and washers that hold one motor, g: carried with the motor (its rigid body, at its
   * centre of mass). frameModes takes them from the assembly's motor joints. Default 0.
   */
  motorScrewsG?: number;
  /** Flight-controller stack, g, spread over the stack bolt holes (bottom plate with motors). Default 0. */
  stackMassG?: number;
  /** Battery, g, spread over the standoff holes (it rides on the top plate). Default 0. */
  batteryMassG?: number;
  /** Camera, g, spread over the front standoff holes. Default 0. */
  cameraMassG?: number;
  /** Thrust of one motor for the static figures, N. Default 10. */
  thrustN?: number;
  /**
   * The motor as a body on the arm: a solid cylinder of the bell diameter and height standing on the
   * arm's top face (its mass is `motorMassG`). Without it the motor is a mass at the bolt-circle centre.
   */
  motor?: Readonly<{ bellDiameterMm: number; heightMm: number }>;
  /** frameModes: also solve the assembled frame (default true). */
  assembled?: boolean;
  /** frameModes: elastic modes of the assembled frame (default `modes`, else 8). */
  assembledModes?: number;
}>;

export type Boundary = 'free' | 'arm-root-clamped' | 'body-with-motors';

export type ModeResult = Readonly<{
  index: number;
  frequencyHz: number;
  plane: 'out-of-plane' | 'in-plane';
  description: string;
  /** Motion at the flight-controller stack (bottom plates only). */
  stack?: PointMotion;
  /** Six values per mesh node [u, v, w, rx, ry, rz], largest translation 1 mm. */
  shape: Float64Array;
}>;

export type ModalResult = Readonly<{
  part: string;
  role: PartRole;
  boundary: Boundary;
  thicknessMm: number;
  weaveDeg: number;
  material: Material;
  /** Bending stiffness D in part axes (classical laminate theory), N·mm. */
  bendingStiffnessNmm: Readonly<{ d11: number; d12: number; d22: number; d16: number; d26: number; d66: number }>;
  meshSizeMm: number;
  nodes: number;
  triangles: number;
  dof: number;
  rigidModes: number;
  plateMassG: number;
  addedMasses: ReadonlyArray<Readonly<{ what: string; massG: number }>>;
  stackAtMm: Vec2 | null;
  modes: readonly ModeResult[];
  mesh: PlateMesh;
}>;

export { DEFAULT_THRUST_N };

/**
 * Natural modes of a part as cut, free in space (free–free): the lowest `modes` elastic modes.
 * Works for any part, imported DXF parts included.
 * @throws RangeError for a bad mode count or mesh size
 * @example partModes(frame.parts[0], { modes: 6 }).modes[0].frequencyHz
 */
export function partModes(part: Part, options: ModeOptions = {}): ModalResult {
  const pm = plateModel(part, options.meshSizeMm ?? defaultMeshSizeMm(part));
  const stack = part.role === 'bottom' ? stackPoint(pm) : null;
  return run(pm, 'free', [], { kind: 'plate' }, stack, options);
}

/**
 * Modes of an arm as built: held as the frame holds it, every node within each root screw's head
 * radius fixed in all six DOFs (the bolted-joint idealisation of the frame model), and carrying its
 * motor as a rigid body tied to the arm over its motor screws' head footprints (a solid cylinder on
 * the arm's top face when `options.motor` gives its size).
 * @throws RangeError when the part has no arm-root or motor bolt holes
 */
export function armModes(part: Part, options: ModeOptions = {}): ModalResult {
  const rings = footprintRings(part, ['arm-root-bolt', 'motor-bolt']);
  const pm0 = plateModel(part, options.meshSizeMm ?? defaultMeshSizeMm(part), rings);
  const { pm, ctx, masses } = armSetup(pm0, part, options);
  return run(pm, 'arm-root-clamped', masses, ctx, null, options);
}

function armSetup(pm0: PlateModel, part: Part, options: ModeOptions) {
  const roots = part.features.filter((f) => f.purpose === 'arm-root-bolt');
  const motors = part.features.filter((f) => f.purpose === 'motor-bolt');
  if (!roots.length) throw new RangeError(`part ${part.name} has no arm-root bolt holes to clamp`);
  if (!motors.length) throw new RangeError(`part ${part.name} has no motor bolt holes`);
  // Round holes: the head's footprint; a slot (no single centre): its edge nodes.
  const footprint = (f: Feature) => {
    const r = footprintRadiusMm(f);
    return r !== null && f.centerMm ? nodesWithin(pm0, f.centerMm, r) : [...pm0.mesh.loops[part.features.indexOf(f) + 1]];
  };
  const centre = (fs: readonly Feature[]): Vec2 => {
    const cs = fs.map((f) => featureCentre(pm0, f, pm0.mesh.loops[part.features.indexOf(f) + 1]));
    return [cs.reduce((s, c) => s + c[0], 0) / cs.length, cs.reduce((s, c) => s + c[1], 0) / cs.length];
  };
  const clamped = roots.flatMap(footprint);
  const tipNodes = motors.flatMap(footprint);
  const carried = [
    { what: 'motor', massG: options.motorMassG ?? 0 },
    { what: 'motor screws', massG: options.motorScrewsG ?? 0 },
  ];
  const masses: AddedMass[] = carried.filter((m) => m.massG > 0).map((m) => ({ ...m, nodes: tipNodes }));
  // The screws ride in the motor's rigid body: one mass of both.
  const motorG = carried.reduce((s, m) => s + m.massG, 0);
  let pm = withFixed(pm0, clamped, [0, 1, 2, 3, 4, 5]);
  if (motorG > 0) {
    const c = centre(motors);
    const m = options.motor;
    // The motor's centre of mass: half its height above the arm's top face (the plate's mid-plane is z = 0).
    const z = m ? part.thicknessMm / 2 + m.heightMm / 2 : 0;
    pm = withRigidMass(pm, [c[0], c[1], z], motorG, m ? cylinderInertiaGMm2(motorG, m.bellDiameterMm, m.heightMm) : [0, 0, 0], tipNodes);
  }
  const ctx: ShapeContext = { kind: 'arm', rootMm: centre(roots), tipMm: centre(motors), tipNodes };
  return { pm, ctx, masses, tipNodes };
}

/** Principal inertia of a solid cylinder (axis z) about its centre: m(3r² + h²)/12 twice, m r²/2. g·mm². */
export function cylinderInertiaGMm2(massG: number, diameterMm: number, heightMm: number): [number, number, number] {
  const r = diameterMm / 2;
  const side = (massG * (3 * r * r + heightMm * heightMm)) / 12;
  return [side, side, (massG * r * r) / 2];
}

/**
 * Modes of a one-piece (unibody) bottom plate, free in space, carrying its motors and the
 * optional stack, battery and camera masses.
 */
export function bodyModes(part: Part, sites: Frame['sites'], options: ModeOptions = {}): ModalResult {
  const pm0 = plateModel(part, options.meshSizeMm ?? defaultMeshSizeMm(part));
  const { pm, motors, masses } = bodySetup(pm0, sites, options);
  return run(pm, 'body-with-motors', masses, { kind: 'body', motors }, stackPoint(pm0), options);
}

function bodySetup(pm0: PlateModel, sites: Frame['sites'], options: ModeOptions) {
  const motors = motorsOnPlate(pm0, sites);
  const masses: AddedMass[] = [];
  const mm = (options.motorMassG ?? 0) + (options.motorScrewsG ?? 0);
  if (mm > 0) for (const m of motors) masses.push({ what: `motor ${m.id}`, massG: mm, nodes: m.nodes });
  const stackNodes = featureNodes(pm0, 'stack-bolt').flatMap((f) => f.nodes);
  const standoffs = featureNodes(pm0, 'standoff');
  if ((options.stackMassG ?? 0) > 0) masses.push({ what: 'stack', massG: options.stackMassG!, nodes: stackNodes });
  if ((options.batteryMassG ?? 0) > 0) masses.push({ what: 'battery', massG: options.batteryMassG!, nodes: standoffs.flatMap((f) => f.nodes) });
  if ((options.cameraMassG ?? 0) > 0) {
    const xs = standoffs.map((f) => featureCentre(pm0, f.feature, f.nodes)[0]);
    const front = Math.max(...xs);
    masses.push({ what: 'camera', massG: options.cameraMassG!, nodes: standoffs.filter((_, i) => xs[i] > front - 1).flatMap((f) => f.nodes) });
  }
  for (const m of masses) if (!m.nodes.length) throw new RangeError(`no ${m.what.split(' ')[0]} mounting holes on part ${pm0.part.name} to carry its ${m.massG} g`);
  return { pm: withMasses(pm0, masses), motors, masses };
}

/** The flight-controller stack position: the centre of the stack bolt holes, else the frame centre. */
function stackPoint(pm: PlateModel): Vec2 {
  const cs = featureNodes(pm, 'stack-bolt').map((f) => featureCentre(pm, f.feature, f.nodes));
  if (!cs.length) return [0, 0];
  return [cs.reduce((s, c) => s + c[0], 0) / cs.length, cs.reduce((s, c) => s + c[1], 0) / cs.length];
}

function run(pm: PlateModel, boundary: Boundary, masses: readonly AddedMass[], ctx: ShapeContext, stack: Vec2 | null, options: ModeOptions): ModalResult {
  const count = options.modes ?? 6;
  const sol = solvePlateModes(pm, count);
  const words = describeModes(pm.mesh, sol.modes, ctx);
  const p = pm.part;
  const d = pm.laminate.d;
  return {
    part: p.name,
    role: p.role,
    boundary,
    thicknessMm: p.thicknessMm,
    weaveDeg: (p.weaveRad * 180) / Math.PI,
    material: p.material,
    bendingStiffnessNmm: { d11: d[0], d12: d[1], d22: d[4], d16: d[2], d26: d[5], d66: d[8] },
    meshSizeMm: pm.mesh.sizeMm,
    nodes: pm.mesh.xy.length / 2,
    triangles: pm.mesh.triangles.length / 3,
    dof: sol.dof,
    rigidModes: sol.rigidModes,
    plateMassG: meshMassG(pm),
    addedMasses: masses.map((m) => ({ what: m.what, massG: m.massG })),
    stackAtMm: stack,
    modes: sol.modes.map((m, i) => ({
      index: i + 1,
      frequencyHz: m.frequencyHz,
      plane: m.plane,
      description: words[i],
      ...(stack ? { stack: motionAt(pm.mesh, m.shape, stack) } : {}),
      shape: m.shape,
    })),
    mesh: pm.mesh,
  };
}

export type ArmResult = Readonly<{ modal: ModalResult; statics: ArmStatics }>;
export type BodyResult = Readonly<{ modal: ModalResult; twist: BodyTwist; tipDeflections: readonly TipDeflection[] }>;

export type FrameModes = Readonly<{
  frame: string;
  motorMassG: number;
  thrustN: number;
  /** Every part as cut, free–free. */
  parts: readonly ModalResult[];
  /** Each distinct arm held at its root bolts, with its motor. */
  arms: readonly ArmResult[];
  /** A one-piece bottom plate carrying its motors (unibody frames only). */
  body: BodyResult | null;
  /** Separate-arm frames: bottom-plate twist with the arm loads brought in at the root bolts. */
  rootTwist: BodyTwist | null;
  /** The assembled frame (plates, joints, standoffs, motors, components), free in space; null for a part subset or a drawing. */
  assembled: FrameModalResult | null;
}>;

/**
 * Screws, nuts and washers of one motor on the copies of a part, g: the assembly's motor joints through
 * those copies, over the motors they hold. 0 when the part carries no motor.
 */
function motorScrewsG(asm: Assembly, partName: string): number {
  const copies = new Set(asm.plates.filter((pl) => pl.part.name === partName).map((pl) => pl.id));
  const motors = asm.motors.filter((m) => copies.has(m.onPlate)).length;
  const grams = asm.joints.filter((j) => j.kind === 'motor' && j.clamps.some((id) => copies.has(id))).reduce((sum, j) => sum + j.hardwareMass.massG, 0);
  return motors ? grams / motors : 0;
}

/**
 * Everything the `modes` command reports for a frame: free–free modes of every part, arms clamped
 * at their root bolts with their motors, and for a unibody frame the bottom plate carrying its
 * motors, with arm-tip deflection and body twist under motor thrust.
 */
export function frameModes(frame: Frame, options: ModeOptions = {}): FrameModes {
  const motorMassG = options.motorMassG ?? frame.design.motorMassG;
  const thrustN = options.thrustN ?? DEFAULT_THRUST_N;
  const motor = options.motor ?? { bellDiameterMm: frame.design.motor.bellDiameterMm, heightMm: motorHeightMm(frame.design) };
  const opts = { ...options, motorMassG, thrustN, motor };
  const asm = buildAssembly(frame.design, frame);
  const parts = frame.parts.map((p) => partModes(p, opts));
  const arms = frame.parts
    .filter((p) => p.role === 'arm')
    .map((p) => ({ modal: armModes(p, { ...opts, motorScrewsG: options.motorScrewsG ?? motorScrewsG(asm, p.name) }), statics: armTipDeflection(p, thrustN, opts.meshSizeMm) }));
  let body: BodyResult | null = null;
  const bottom = frame.parts.find((p) => p.role === 'bottom');
  if (bottom && frame.design.arms.construction === 'unibody') {
    body = {
      modal: bodyModes(bottom, frame.sites, { ...opts, motorScrewsG: options.motorScrewsG ?? motorScrewsG(asm, bottom.name) }),
      twist: bodyTwist(bottom, frame.sites, thrustN, opts.meshSizeMm),
      tipDeflections: unibodyTipDeflections(bottom, frame.sites, thrustN, opts.meshSizeMm),
    };
  }
  const rootTwist = bottom && frame.design.arms.construction === 'separate' ? rootLoadedBodyTwist(bottom, frame.sites, thrustN, opts.meshSizeMm) : null;
  const assembled =
    options.assembled === false
      ? null
      : assembledFrameModes(asm, { modes: options.assembledModes ?? options.modes ?? 8, rotationBand: rotationBandOf(frame.design, frame.propDiameterMm) });
  return { frame: frame.name, motorMassG, thrustN, parts, arms, body, rootTwist, assembled };
}
