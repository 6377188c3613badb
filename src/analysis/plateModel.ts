import { screwHead } from '../assembly/standards.js';
import { partArea, type Feature, type FeaturePurpose, type Frame, type Part, type Vec2 } from '../geometry/index.js';
import type { MotorOnPlate } from './describe.js';
import { laminate, type Laminate } from './laminate.js';
import { meshPart, nodeCount, type PlateMesh, type RingRequest } from './mesh.js';
import type { FeModel } from './model.js';

/** A part meshed and turned into a shell model lying in the x–y plane (part coordinates). */
export type PlateModel = Readonly<{
  part: Part;
  mesh: PlateMesh;
  laminate: Laminate;
  model: FeModel;
}>;

/** Mass added to the plate: where it sits and how much, for the report. */
export type AddedMass = Readonly<{ what: string; massG: number; nodes: readonly number[] }>;

/** Grams to tonnes (the solver's mass unit with mm, N, s). */
export const G_TO_T = 1e-6;

/**
 * Default element size for a part: a thirtieth of the square root of its area, kept between
 * 0.5 and 4 mm. The convergence studies in test/analysis show the first modes of the demo parts
 * within 1–2 % of the fine-mesh value at this size, well inside the 5 % comparison bar.
 */
export function defaultMeshSizeMm(part: Part): number {
  return Math.min(4, Math.max(0.5, Math.sqrt(Math.abs(partArea(part))) / 30));
}

/**
 * Mesh a part and build its shell model: one orthotropic laminate from the part's material,
 * thickness and weave angle; masses and supports are added by the caller through `withMasses`
 * and `withFixed`.
 * @param sizeMm element size, mm (default `defaultMeshSizeMm`)
 * @param rings circles of nodes to lay (screw-head footprints, see `footprintRings`)
 */
export function plateModel(part: Part, sizeMm = defaultMeshSizeMm(part), rings: readonly RingRequest[] = []): PlateModel {
  const lam = partLaminate(part);
  const mesh = meshPart(part, sizeMm, { rings });
  const n = nodeCount(mesh);
  const xyz = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    xyz[3 * i] = mesh.xy[2 * i];
    xyz[3 * i + 1] = mesh.xy[2 * i + 1];
  }
  const model: FeModel = {
    xyz,
    triangles: mesh.triangles,
    laminates: [lam],
    triangleLaminate: new Uint16Array(mesh.triangles.length / 3),
    pointMasses: [],
    fixed: new Uint8Array(6 * n),
  };
  return { part, mesh, laminate: lam, model };
}

/**
 * The part's laminate (its material, thickness and weave angle).
 * @throws RangeError naming the part when its thickness or density is not positive (a zero-thickness part has no stiffness)
 */
export function partLaminate(part: Pick<Part, 'name' | 'material' | 'thicknessMm' | 'weaveRad'>, label = `part ${part.name}`): Laminate {
  try {
    return laminate(part.material, part.thicknessMm, part.weaveRad);
  } catch (e) {
    if (e instanceof RangeError) throw new RangeError(`${label}: ${e.message}`);
    throw e;
  }
}

/** Boundary nodes of the part's features with the given purpose, one list per feature. */
export function featureNodes(pm: PlateModel, purpose: FeaturePurpose): Array<{ feature: Feature; nodes: number[] }> {
  const out: Array<{ feature: Feature; nodes: number[] }> = [];
  pm.part.features.forEach((f, k) => {
    if (f.purpose === purpose) out.push({ feature: f, nodes: [...pm.mesh.loops[k + 1]] });
  });
  return out;
}

/** The model with extra concentrated masses, each spread evenly over its nodes. */
export function withMasses(pm: PlateModel, masses: readonly AddedMass[]): PlateModel {
  const extra = masses.flatMap((m) => (m.nodes.length && m.massG > 0 ? m.nodes.map((node) => ({ node, massT: (m.massG * G_TO_T) / m.nodes.length })) : []));
  return { ...pm, model: { ...pm.model, pointMasses: [...pm.model.pointMasses, ...extra] } };
}

/**
 * The model with a rigid body: a new node at `atMm` (x, y in part coordinates, z above the plate's
 * mid-plane) carrying the mass and principal inertia (about that point, part axes), with the given
 * plate nodes following it rigidly in all six DOFs.
 */
export function withRigidMass(pm: PlateModel, atMm: readonly [number, number, number], massG: number, inertiaGMm2: readonly [number, number, number], nodes: readonly number[]): PlateModel {
  const node = pm.model.xyz.length / 3;
  const xyz = new Float64Array(pm.model.xyz.length + 3);
  xyz.set(pm.model.xyz);
  xyz.set(atMm, 3 * node);
  const fixed = new Uint8Array(pm.model.fixed.length + 6);
  fixed.set(pm.model.fixed);
  const [ixx, iyy, izz] = inertiaGMm2.map((v) => v * G_TO_T);
  return {
    ...pm,
    model: {
      ...pm.model,
      xyz,
      fixed,
      pointMasses: [...pm.model.pointMasses, { node, massT: massG * G_TO_T, inertiaTMm2: [ixx, iyy, izz, 0, 0, 0] }],
      rigid: [...(pm.model.rigid ?? []), { master: node, slaves: [...nodes] }],
    },
  };
}

/** The model with the given DOFs (0..5: u, v, w, rx, ry, rz) held at zero on the given nodes. */
export function withFixed(pm: PlateModel, nodes: readonly number[], dofs: readonly number[]): PlateModel {
  const fixed = new Uint8Array(pm.model.fixed);
  for (const n of nodes) for (const d of dofs) fixed[6 * n + d] = 1;
  return { ...pm, model: { ...pm.model, fixed } };
}

/** Centre of a feature: its stated centre, else the mean of its boundary nodes. */
export function featureCentre(pm: PlateModel, f: Feature, nodes: readonly number[]): Vec2 {
  if (f.centerMm) return f.centerMm;
  let x = 0;
  let y = 0;
  for (const n of nodes) {
    x += pm.mesh.xy[2 * n];
    y += pm.mesh.xy[2 * n + 1];
  }
  return [x / nodes.length, y / nodes.length];
}

/** Plate mass from the mesh (the area of the triangulation times ρt). g. */
export function meshMassG(pm: PlateModel): number {
  const { xy, triangles } = pm.mesh;
  let a = 0;
  for (let t = 0; t < triangles.length; t += 3) {
    const [i, j, k] = [triangles[t], triangles[t + 1], triangles[t + 2]];
    a += ((xy[2 * j] - xy[2 * i]) * (xy[2 * k + 1] - xy[2 * i + 1]) - (xy[2 * k] - xy[2 * i]) * (xy[2 * j + 1] - xy[2 * i + 1])) / 2;
  }
  return (a * pm.laminate.arealMassTPerMm2) / G_TO_T;
}

/** Motors of a one-piece bottom plate: motor bolt holes grouped by the nearest motor site. */
export function motorsOnPlate(pm: PlateModel, sites: Frame['sites']): MotorOnPlate[] {
  const bolts = featureNodes(pm, 'motor-bolt');
  return sites.map((s) => {
    const nodes: number[] = [];
    for (const b of bolts) {
      const c = featureCentre(pm, b.feature, b.nodes);
      const nearest = sites.reduce((best, site) => (Math.hypot(c[0] - site.motorMm[0], c[1] - site.motorMm[1]) < Math.hypot(c[0] - best.motorMm[0], c[1] - best.motorMm[1]) ? site : best), sites[0]);
      if (nearest.id === s.id) nodes.push(...b.nodes);
    }
    return { id: s.id, front: s.front, left: s.left, motorMm: s.motorMm, armDirRad: s.armDirRad, nodes };
  });
}


/**
 * Radius of the plate area a screw through this hole clamps: half the head diameter (ISO 4762 socket
 * head, or the countersunk head where the hole is countersunk), the joint idealisation of the frame
 * model. mm; null for a feature without a screw.
 */
export function footprintRadiusMm(f: Feature): number | null {
  if (!f.screw || !f.centerMm) return null;
  return screwHead(f.screw, f.countersink ? 'countersunk' : 'socket').diameterMm / 2;
}

/** Footprint rings of the part's holes with the given purposes. */
export function footprintRings(part: Part, purposes: readonly FeaturePurpose[]): RingRequest[] {
  return part.features.flatMap((f) => {
    const r = purposes.includes(f.purpose) ? footprintRadiusMm(f) : null;
    return r === null ? [] : [{ centreMm: f.centerMm!, radiusMm: r }];
  });
}

/** Mesh nodes within r of a point of the part (a footprint). */
export function nodesWithin(pm: PlateModel, centre: Vec2, radiusMm: number): number[] {
  const out: number[] = [];
  const tol = 1e-6 * Math.max(1, radiusMm);
  for (let i = 0; i < pm.mesh.xy.length / 2; i++) if (Math.hypot(pm.mesh.xy[2 * i] - centre[0], pm.mesh.xy[2 * i + 1] - centre[1]) <= radiusMm + tol) out.push(i);
  return out;
}
