import type { Frame } from '../geometry/frame.js';
import type { Design } from '../params/design.js';
import { cameraPivotMm, placeComponents } from './components.js';
import { weighJoint } from './hardwareMass.js';
import { COAXIAL_MM, beyondNutMm, engagementMm, makeJoint, placedHoles, plateJoints, washerFor } from './joints.js';
import { placeCameraSpacers, placeMotors, placeProps, placeStandoffs, stackCorners, stackScrew, stackUpOf } from './parts.js';
import { placePlates } from './plates.js';
import { nut as nutOf, screwHead, shortestPreferredLength } from './standards.js';
import type { Assembly, BoltedJoint, Component, JointLayout, Motor, PlacedPlate, Standoff, Vec3 } from './types.js';

/**
 * The frame in three dimensions: every plate copy, standoff, screw, motor, prop and component,
 * placed in frame coordinates (x forward, y left, z up; z = 0 on the bottom plate's lower face).
 * Pure. Throws DesignError (naming `components.N...`) when a component has nowhere to go.
 * @example const a = buildAssembly(design, buildFrame(design)); a.stackUp.propPlaneMm
 */
export function buildAssembly(design: Design, frame: Frame): Assembly {
  const plates = placePlates(frame);
  const standoffs = placeStandoffs(design);
  const cameraSpacers = placeCameraSpacers(design, plates);
  const stackUp = stackUpOf(design, frame, plates);
  const motors = placeMotors(design, frame, plates);
  const props = placeProps(design, motors);
  const components = placeComponents(design, plates, stackUp);
  const laidOut = [...plateJoints(design, plates, standoffs), ...motorJoints(design, plates, motors), ...stackJoints(design, plates, components), ...cameraJoints(design, plates, cameraSpacers)];
  const joints = laidOut.map((j) => weighJoint(j, design.assembly.screwDensityGPerCm3));
  return {
    plates,
    standoffs,
    cameraSpacers,
    joints,
    motors,
    props,
    components,
    sites: frame.sites,
    armStacking: design.arms.construction === 'unibody' ? 'under-body' : design.assembly.armStacking,
    stackUp,
  };
}

/** Motor screws: from under the plate the motor sits on, up into the motor's threaded base. */
function motorJoints(d: Design, plates: readonly PlacedPlate[], motors: readonly Motor[]): JointLayout[] {
  return motors.flatMap((m) => {
    const plate = plates.find((p) => p.id === m.onPlate)!;
    return m.boltsMm.map((b, k) =>
      makeJoint({ id: `motor ${m.site} ${k + 1}`, kind: 'motor', screw: d.motor.boltSize, planMm: [b[0], b[1]], clamps: [plate], up: 1, style: 'socket', endsIn: 'motor-thread', beyondGripMm: engagementMm(d, d.motor.boltSize), nut: null }),
    );
  });
}

/**
 * Stack screws: one per corner of the pattern each stack component uses, from under the plates
 * with a hole there (countersunk where the hole is), up through the boards piled on that mount and
 * into a nut on top.
 */
function stackJoints(d: Design, plates: readonly PlacedPlate[], components: readonly Component[]): JointLayout[] {
  const out: JointLayout[] = [];
  const holes = placedHoles(plates).filter((h) => h.purpose === 'stack-bolt');
  const used = new Map<string, { mount: number; pattern: number; top: number }>();
  for (const c of components) {
    const mount = c.stack?.mount ?? (c.mountedOn[1]?.startsWith('stack mount ') ? Number(c.mountedOn[1].slice(12)) : null);
    if (mount === null) continue;
    const pattern = c.stack?.patternMm ?? d.stacks[mount].patternsMm[0];
    const key = `${mount}/${pattern}`;
    const top = Math.max(...c.boxes.map((b) => b.centreMm[2] + b.halfSizeMm[2]));
    used.set(key, { mount, pattern, top: Math.max(top, used.get(key)?.top ?? -Infinity) });
  }
  for (const { mount, pattern, top } of used.values()) {
    const screw = stackScrew(d, mount, pattern);
    stackCorners(d, mount, pattern).forEach((p, k) => {
      const clamps = holes.filter((h) => h.screw === screw && Math.hypot(h.atMm[0] - p[0], h.atMm[1] - p[1]) <= COAXIAL_MM).map((h) => h.plate).sort((a, b) => a.zLowMm - b.zLowMm);
      if (!clamps.length) return;
      const countersunk = clamps.some((pl) => pl.part.features.some((f) => f.purpose === 'stack-bolt' && f.countersink));
      const n = nutOf(screw, d.assembly.nut);
      const plateTop = clamps[clamps.length - 1].zLowMm + clamps[clamps.length - 1].thicknessMm;
      const j = makeJoint({ id: `stack ${mount + 1} ${pattern} ${k + 1}`, kind: 'stack', screw, planMm: p, clamps, up: 1, style: countersunk ? 'countersunk' : 'socket', endsIn: 'nut', beyondGripMm: top - plateTop + beyondNutMm(screw, n.heightMm), nut: n, nutOffsetMm: top - plateTop, washer: washerFor(d, screw) });
      out.push(j);
    });
  }
  return out;
}

/**
 * Camera screws, along ±y from outside each side plate: the pivot screw into the camera body's
 * thread, and one screw into each end of every camera spacer.
 */
function cameraJoints(d: Design, plates: readonly PlacedPlate[], spacers: readonly Standoff[]): JointLayout[] {
  const c = d.camera;
  if (!c) return [];
  const out: JointLayout[] = [];
  for (const side of plates.filter((p) => p.part.role === 'camera-side')) {
    const left = side.placement.translateMm[1] > 0;
    const outerY = left ? side.bounds.maxMm[1] : side.bounds.minMm[1];
    const axis: Vec3 = [0, left ? -1 : 1, 0];
    const sideName = left ? 'left' : 'right';
    const pivot = cameraPivotMm(d);
    out.push(sideScrew(d, `camera pivot ${sideName}`, 'camera-pivot', c.pivotBoltSize, [pivot[0], outerY, pivot[2]], axis, side, 'camera-thread', []));
    spacers.forEach((s) => {
      out.push(sideScrew(d, `${s.id} ${sideName}`, 'camera-mount', s.screw, [s.planMm[0], outerY, s.zBottomMm], axis, side, 'standoff', [{ standoff: s.id, end: left ? 'top' : 'bottom' }]));
    });
  }
  return out;
}

function sideScrew(d: Design, id: string, kind: BoltedJoint['kind'], screw: BoltedJoint['screw'], headAt: Vec3, axis: Vec3, side: PlacedPlate, endsIn: BoltedJoint['endsIn'], ends: BoltedJoint['standoffEnds']): JointLayout {
  const head = screwHead(screw, 'button');
  const need = side.thicknessMm + engagementMm(d, screw);
  return {
    id,
    kind,
    screw,
    planMm: [headAt[0], headAt[1]],
    headAtMm: headAt,
    axis,
    headStandard: head.standard,
    headDiameterMm: head.diameterMm,
    headHeightMm: head.heightMm,
    headRadiusMm: head.diameterMm / 2,
    clamps: [side.id],
    standoffEnds: ends,
    gripMm: side.thicknessMm,
    screwLengthMm: shortestPreferredLength(need) ?? Math.ceil(need),
    nut: null,
    endsIn,
  };
}
