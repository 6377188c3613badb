import type { Design, SeparateArms } from '../params/design.js';
import { DesignError, type DesignIssue } from '../params/errors.js';
import { clearanceHoleMm } from '../params/screws.js';
import { degToRad } from '../params/units.js';
import { armRootWidthMm, armShape, filletedUnion, rootBlockLength } from './arm.js';
import { BooleanGuardError } from './boolean.js';
import { FilletError } from './fillet.js';
import { relieveCorners, type CornerRelief } from './relief.js';
import { cutout, roundedCutout, screwHole, squareHoles, type SourcedFeature } from './holes.js';
import { alongArm, motorSites, type MotorSite } from './layout.js';
import { transformLoop, transformPoint, type Transform } from './loop.js';
import type { Feature, Member, Part, PartRole, Placement } from './part.js';
import { arcSlot, circle, hullOfCircles, roundedRect, slot } from './primitives.js';
import { checkPartGeometry } from './partCheck.js';
import type { Loop, Vec2 } from './types.js';

/** Everything the later stages need from one design: the parts and where the motors are. */
export type Frame = Readonly<{
  name: string;
  revision: string;
  parts: readonly Part[];
  sites: readonly MotorSite[];
  propDiameterMm: number;
  /**
   * Top face of the arms (where the motors sit), the reference for prop height. mm above the bottom
   * plate's lower face; 0 when separate arms sit under the body.
   */
  armTopZMm: number;
  /** The camera body seen from above (a square of the camera width about the pivot), for drawings. */
  cameraPlanMm: Loop | null;
  design: Design;
}>;

/**
 * Build every plate of the frame as exact geometry. Pure: no files, no clock.
 * Throws DesignError (naming the parameter) when a part cannot be built or is not a valid cut contour.
 */
export function buildFrame(d: Design): Frame {
  const sites = motorSites(d);
  const parts: Part[] = [];
  const a = d.arms;
  parts.push(bottomPlate(d, sites));
  if (a.construction === 'separate') parts.push(...arms(d, a, sites));
  parts.push(topPlate(d));
  if (d.braces && a.construction === 'separate') parts.push(...braces(d, a, sites));
  if (d.camera) parts.push(cameraSide(d));
  const relieved = parts.map((p) => withReliefs(d, p));
  const armTopZMm = armLayerZMm(d) + (a.construction === 'separate' ? a.thicknessMm : d.body.thicknessMm);
  return { name: d.name, revision: d.revision, parts: relieved, sites, propDiameterMm: d.props.diameterMm, armTopZMm, cameraPlanMm: cameraPlan(d), design: d };
}

/**
 * The part with the corner reliefs its design section asks for (`<section>.cornerRelief`, else
 * `cutting.cornerRelief`), sized to the design's tool.
 */
function withReliefs(d: Design, part: Part): Part {
  const section = (d as unknown as Record<string, { cornerRelief?: CornerRelief } | undefined>)[part.sourcePath];
  const style = section?.cornerRelief ?? d.cutting.cornerRelief;
  return style === 'none' ? part : relieveCorners(part, d.cutting.toolDiameterMm, style).part;
}

/**
 * Lower face of the arm layer (z, mm above the bottom plate's lower face). Separate arms follow
 * `assembly.armStacking`: under the body (domain.md, from the bottom up: braces, arms, bottom plate)
 * or on top of it; a unibody's arms are the bottom plate.
 */
export function armLayerZMm(d: Design): number {
  const a = d.arms;
  if (a.construction === 'unibody') return 0;
  return d.assembly.armStacking === 'under-body' ? -a.thicknessMm : d.body.thicknessMm;
}

/** Lower face of the brace plates: below the arms under the body, above them on top of it. mm. */
export function braceZMm(d: Design): number {
  const armZ = armLayerZMm(d);
  const armT = d.arms.construction === 'separate' ? d.arms.thicknessMm : 0;
  return d.assembly.armStacking === 'under-body' ? armZ - (d.braces?.thicknessMm ?? 0) : armZ + armT;
}

/** Where to point the designer when an outline cannot be built, by what went wrong. */
type Blame = Readonly<{ fillet: [path: string, value: unknown]; disjoint: [path: string, value: unknown]; hint: string }>;

function guarded<T>(blame: Blame, what: string, build: () => T): T {
  try {
    return build();
  } catch (e) {
    if (e instanceof FilletError) {
      const at = `(${e.at[0].toFixed(2)}, ${e.at[1].toFixed(2)}) mm`;
      throw new DesignError([{ path: blame.fillet[0], value: blame.fillet[1], message: `is too large for ${what}: ${e.message} at ${at}; use a smaller radius or give the corner more room` }]);
    }
    if (e instanceof BooleanGuardError) {
      const [path, value] = e.kind === 'disjoint' ? blame.disjoint : blame.fillet;
      throw new DesignError([{ path, value, message: `cannot build ${what}: ${e.message}${e.kind === 'disjoint' ? `; ${blame.hint}` : ''}` }]);
    }
    throw e;
  }
}

function makePart(
  fields: Omit<Part, 'features'> & { features: readonly SourcedFeature[] },
): Part {
  const problems: DesignIssue[] = checkPartGeometry(fields);
  if (problems.length) throw new DesignError(problems);
  const features: Feature[] = fields.features.map(({ sourcePath: _s, ...f }) => f);
  return { ...fields, features };
}

function material(d: Design, sec: { material?: string; weaveDeg: number }) {
  return { material: d.materialFor(sec.material), weaveRad: degToRad(sec.weaveDeg) };
}

/** Standoff and stack holes shared by the bottom and top plates. */
function standoffHoles(d: Design): SourcedFeature[] {
  return d.body.standoffs.positionsMm.map((p, i) => screwHole(d, p, d.body.standoffs.boltSize, 'standoff', `body.standoffs.positionsMm.${i}`));
}

/** Centre of stack mount i on the bottom plate (frame coordinates, mm). */
export function stackCentre(d: Design, i: number): Vec2 {
  const s = d.stacks[i];
  const x = typeof s.place === 'number' ? s.place : s.place === 'front' ? d.body.lengthMm / 4 : s.place === 'rear' ? -d.body.lengthMm / 4 : 0;
  return [x, s.yMm];
}

function bottomPlate(d: Design, sites: readonly MotorSite[]): Part {
  const a = d.arms;
  const unibody = a.construction === 'unibody';
  const body = roundedRect([0, 0], d.body.lengthMm, d.body.widthMm, d.body.cornerRadiusMm);
  const pieces: Loop[] = [body];
  const features: SourcedFeature[] = [...standoffHoles(d)];
  const members: Member[] = [];
  d.stacks.forEach((s, i) => {
    s.patternsMm.forEach((side, k) => features.push(...squareHoles(d, stackCentre(d, i), side, d.stackBoltSizes[i][k], `stacks.${i}.patternsMm`, s.countersunk)));
  });
  for (const site of sites) {
    if (a.construction === 'unibody') {
      const shape = armShape(d, site.motorAlongMm);
      const tf: Transform = { rotateRad: site.armDirRad, translate: site.armLineOriginMm, mirrorY: site.left };
      pieces.push(...shape.pieces.map((p) => transformLoop(p, tf)));
      features.push(...shape.features.map((f) => moveFeature(f, tf)));
      members.push(...shape.members.map((m) => ({ ...m, name: `${site.id} ${m.name}`, startMm: transformPoint(m.startMm, tf), endMm: transformPoint(m.endMm, tf) })));
    } else {
      // A pad under each arm root carries the root bolts.
      const r = a.root;
      const end = r.reachMm + (r.boltCount - 1) * r.boltSpacingMm + r.edgeMarginMm;
      const centre = alongArm(site, end / 2);
      const w = armRootWidthMm(d);
      pieces.push(roundedRect(centre, end, w, Math.min(2, w / 2 - 0.01), site.armDirRad));
      for (let i = 0; i < r.boltCount; i++) {
        features.push(screwHole(d, alongArm(site, r.reachMm + i * r.boltSpacingMm), r.boltSize, 'arm-root-bolt', 'arms.root.reachMm'));
      }
    }
  }
  const blame: Blame = {
    fillet: ['arms.rootFilletMm', d.arms.rootFilletMm],
    disjoint: ['body.widthMm', d.body.widthMm],
    hint: unibody ? 'the arms do not meet the body plate' : 'the arm-root pads (arms.root.reachMm) do not reach the body plate; widen or lengthen the body or move the roots in',
  };
  const { outline, windows } = guarded(blame, 'the bottom plate outline', () => filletedUnion(pieces, d.arms.rootFilletMm));
  features.push(...windows.map((w) => ({ loop: w, kind: 'cutout' as const, purpose: 'truss-window' as const, sourcePath: 'arms.truss' })));
  return makePart({
    name: 'bottom-plate',
    role: 'bottom',
    quantity: 1,
    thicknessMm: d.body.thicknessMm,
    ...material(d, d.body),
    outline,
    features,
    members,
    placements: [{ rotateRad: 0, translateMm: [0, 0], mirrorY: false, zMm: 0 }],
    sourcePath: 'body',
  });
}

function moveFeature(f: SourcedFeature, tf: Transform): SourcedFeature {
  return {
    ...f,
    loop: transformLoop(f.loop, tf),
    ...(f.centerMm ? { centerMm: transformPoint(f.centerMm, tf) } : {}),
  };
}

function arms(d: Design, a: SeparateArms, sites: readonly MotorSite[]): Part[] {
  const start = a.root.reachMm - a.root.edgeMarginMm;
  const groups = new Map<number, MotorSite[]>();
  for (const s of sites) {
    const key = Math.round((s.motorAlongMm - start) * 1e6) / 1e6;
    groups.set(key, [...(groups.get(key) ?? []), s]);
  }
  const symmetric = groups.size === 1;
  return [...groups.entries()].map(([length, group]) => {
    const path = 'arms';
    if (length <= rootBlockLength(d)) {
      throw new DesignError([{ path: 'arms.root.reachMm', value: a.root.reachMm, message: `leaves a ${length.toFixed(1)} mm arm, shorter than its root block (${rootBlockLength(d).toFixed(1)} mm)` }]);
    }
    const shape = armShape(d, length, path);
    const blame: Blame = { fillet: ['arms.rootFilletMm', d.arms.rootFilletMm], disjoint: ['arms.truss', 'present'], hint: 'the struts do not meet' };
    const { outline, windows } = guarded(blame, 'the arm outline', () => filletedUnion(shape.pieces, d.arms.rootFilletMm));
    const placements: Placement[] = group.map((s) => ({
      rotateRad: s.armDirRad,
      translateMm: alongArm(s, start),
      mirrorY: s.left,
      zMm: armLayerZMm(d),
    }));
    return makePart({
      name: symmetric ? 'arm' : group[0].front ? 'arm-front' : 'arm-rear',
      role: 'arm' as PartRole,
      quantity: group.length,
      thicknessMm: a.thicknessMm,
      ...material(d, a),
      outline,
      features: [...shape.features, ...windows.map((w) => ({ loop: w, kind: 'cutout' as const, purpose: 'truss-window' as const, sourcePath: 'arms.truss' }))],
      members: shape.members,
      placements,
      sourcePath: path,
    });
  });
}

function topPlate(d: Design): Part {
  const t = d.topPlate;
  const length = t.lengthMm ?? d.body.lengthMm;
  const width = t.widthMm ?? d.body.widthMm;
  const features: SourcedFeature[] = [...standoffHoles(d)];
  const slotLen = t.strapSlots.strapWidthMm + 1;
  t.strapSlots.xPositionsMm.forEach((x, i) => {
    const h = slotLen / 2 - t.strapSlots.slotWidthMm / 2;
    // A strap slot is long across the frame: two straight sides joined by half circles.
    features.push(cutout(slot([x, -h], [x, h], t.strapSlots.slotWidthMm), 'slot', 'strap-slot', `topPlate.strapSlots.xPositionsMm.${i}`));
  });
  if (t.leadOpening) {
    const o = t.leadOpening;
    features.push(roundedCutout([o.xMm, 0], o.lengthMm, o.widthMm, Math.min(2, o.lengthMm / 2, o.widthMm / 2), 'lead-opening', 'topPlate.leadOpening'));
  }
  t.accessoryHoles.forEach((h, i) => features.push(screwHole(d, h.atMm, h.boltSize, 'accessory', `topPlate.accessoryHoles.${i}`)));
  t.lightening.forEach((c, i) => features.push(roundedCutout(c.atMm, c.lengthMm, c.widthMm, c.cornerRadiusMm, 'lightening', `topPlate.lightening.${i}`)));
  return makePart({
    name: 'top-plate',
    role: 'top',
    quantity: 1,
    thicknessMm: t.thicknessMm,
    ...material(d, t),
    outline: roundedRect([0, 0], length, width, t.cornerRadiusMm),
    features,
    members: [],
    placements: [{ rotateRad: 0, translateMm: [0, 0], mirrorY: false, zMm: d.body.thicknessMm + d.body.standoffs.heightMm }],
    sourcePath: 'topPlate',
  });
}

function braces(d: Design, a: SeparateArms, sites: readonly MotorSite[]): Part[] {
  const b = d.braces!;
  const r = a.root;
  const holeR = clearanceHoleMm(r.boltSize, d.cutting.holeSeries) / 2;
  const make = (front: boolean): { part: Omit<Part, 'features'> & { features: SourcedFeature[] }; key: string } => {
    const pair = sites.filter((s) => s.front === front);
    const centres: Vec2[] = [];
    for (const s of pair) for (let i = 0; i < r.boltCount; i++) centres.push(alongArm(s, r.reachMm + i * r.boltSpacingMm));
    // The brace is drawn about its own centre so front and rear copies can be compared and stacked.
    const cx = centres.reduce((a, p) => a + p[0], 0) / centres.length;
    const local = centres.map((p) => [front ? p[0] - cx : -(p[0] - cx), front ? p[1] : -p[1]] as Vec2);
    const outline = hullOfCircles(local, holeR + b.marginMm);
    const features = local.map((p) => screwHole(d, p, r.boltSize, 'arm-root-bolt', 'arms.root'));
    const key = local.map((p) => `${p[0].toFixed(6)},${p[1].toFixed(6)}`).sort().join(';');
    return {
      key,
      part: {
        name: front ? 'brace-front' : 'brace-rear',
        role: 'brace',
        quantity: 1,
        thicknessMm: b.thicknessMm,
        ...material(d, b),
        outline,
        features,
        members: [],
        placements: [{ rotateRad: front ? 0 : Math.PI, translateMm: [cx, 0], mirrorY: false, zMm: braceZMm(d) }],
        sourcePath: 'braces',
      },
    };
  };
  const f = make(true);
  const rr = make(false);
  if (f.key === rr.key) {
    return [makePart({ ...f.part, name: 'brace', quantity: 2, placements: [...f.part.placements, ...rr.part.placements] })];
  }
  return [makePart(f.part), makePart(rr.part)];
}

/** Pivot of the camera in the frame's x–z plane: ahead of the front standoffs, at the set height. */
function cameraPivot(d: Design): Vec2 {
  const frontStandoffX = Math.max(...d.body.standoffs.positionsMm.map((p) => p[0]));
  return [frontStandoffX + d.camera!.forwardOffsetMm, d.camera!.pivotHeightMm];
}

/** Typical small cameras are about as deep as they are wide (common practice, no source). */
function cameraPlan(d: Design): Loop | null {
  if (!d.camera) return null;
  const w = d.camera.cameraWidthMm;
  return roundedRect([cameraPivot(d)[0], 0], w, w, 1);
}

/**
 * Camera side plate, drawn in the frame's x–z plane (part x = frame x, part y = height above the
 * bottom plate's lower face). Two copies stand either side of the camera.
 */
function cameraSide(d: Design): Part {
  const c = d.camera!;
  const frontStandoffX = Math.max(...d.body.standoffs.positionsMm.map((p) => p[0]));
  const pivot = cameraPivot(d);
  const slotW = c.tiltSlotWidthMm;
  const mountD = clearanceHoleMm(c.mountBoltSize, d.cutting.holeSeries);
  const zLow = d.body.thicknessMm + c.plateMarginMm + mountD / 2;
  const zHigh = d.body.thicknessMm + d.body.standoffs.heightMm - c.plateMarginMm - mountD / 2;
  const mountX = frontStandoffX;
  const lo = degToRad(-90 + c.uptiltMinDeg);
  const sweep = degToRad(c.uptiltMaxDeg - c.uptiltMinDeg);
  const discR = c.tiltSlotRadiusMm + slotW / 2 + c.plateMarginMm;
  const mountPad = mountD / 2 + c.plateMarginMm;
  const xMin = Math.min(mountX, pivot[0]) - mountPad;
  const xMax = Math.max(mountX, pivot[0]);
  const zMin = Math.min(zLow, pivot[1]) - mountPad;
  const zMax = Math.max(zHigh, pivot[1]) + mountPad;
  const pieces: Loop[] = [
    roundedRect([(xMin + xMax) / 2, (zMin + zMax) / 2], xMax - xMin, zMax - zMin, Math.min(mountPad, (xMax - xMin) / 2 - 0.01)),
    circle(pivot, discR),
  ];
  const blame: Blame = { fillet: ['camera.forwardOffsetMm', c.forwardOffsetMm], disjoint: ['camera.forwardOffsetMm', c.forwardOffsetMm], hint: 'the pivot is too far from the mount holes' };
  const { outline } = guarded(blame, 'the camera side plate', () => filletedUnion(pieces, Math.max(2, d.cutting.toolDiameterMm / 2 + 0.5)));
  const features: SourcedFeature[] = [
    screwHole(d, pivot, c.pivotBoltSize, 'camera-pivot', 'camera.pivotHeightMm'),
    cutout(arcSlot(pivot, c.tiltSlotRadiusMm, lo, sweep, slotW), 'slot', 'camera-tilt-slot', 'camera.tiltSlotRadiusMm', c.pivotBoltSize),
    screwHole(d, [mountX, zLow], c.mountBoltSize, 'camera-mount', 'camera'),
    screwHole(d, [mountX, zHigh], c.mountBoltSize, 'camera-mount', 'camera'),
  ];
  const y = c.cameraWidthMm / 2;
  return makePart({
    name: 'camera-side',
    role: 'camera-side',
    quantity: 2,
    thicknessMm: c.thicknessMm,
    ...material(d, c),
    outline,
    features,
    members: [],
    placements: [
      { rotateRad: 0, translateMm: [0, y + c.thicknessMm], mirrorY: false, zMm: 0, vertical: true },
      { rotateRad: 0, translateMm: [0, -y], mirrorY: false, zMm: 0, vertical: true },
    ],
    sourcePath: 'camera',
  });
}

