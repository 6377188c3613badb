import { stackCentre, type Frame } from '../geometry/frame.js';
import { transformPoint } from '../geometry/loop.js';
import type { Vec2 } from '../geometry/types.js';
import type { Design } from '../params/design.js';
import type { ScrewSize } from '../params/types.js';
import { placedHoles } from './joints.js';
import { cylinderBody, cylinderOfMass, hexPrismBody, inertiaAboutCentre, placeBody, type MassBody } from './massProps.js';
import { tapDrillMm } from './standards.js';
import type { Motor, PlacedPlate, Prop, Spin, Standoff, StackUp, Vec3 } from './types.js';

/** Standoff alloys: density g/cm³ (ASM handbook values, reference-values.md). */
export const STANDOFF_DENSITY_G_PER_CM3 = { 'aluminium-6061': 2.7, 'aluminium-7075': 2.81 } as const;

/** Heights of the plate sandwich. */
export function stackUpOf(d: Design, frame: Frame, plates: readonly PlacedPlate[]): StackUp {
  const bodyT = d.body.thicknessMm;
  const gap = d.body.standoffs.heightMm;
  const horizontal = plates.filter((p) => p.orientation === 'horizontal');
  return {
    bottomMm: Math.min(...horizontal.map((p) => p.zLowMm)),
    bottomPlateTopMm: bodyT,
    armTopMm: frame.armTopZMm,
    plateGapMm: gap,
    topPlateLowMm: bodyT + gap,
    topPlateTopMm: bodyT + gap + d.topPlate.thicknessMm,
    propPlaneMm: frame.armTopZMm + d.props.heightAboveArmMm,
  };
}

/**
 * Mass body of a spacer: a hex prism or round bar with a through bore of the tap drill size (tapped
 * standoffs are drilled through), along its own w axis from w = 0.
 */
export function spacerBody(so: Pick<Standoff, 'shape' | 'acrossFlatsMm' | 'lengthMm' | 'densityGPerCm3' | 'screw'>): MassBody {
  const rho = so.densityGPerCm3 / 1000;
  const bore = tapDrillMm(so.screw);
  return so.shape === 'hex' ? hexPrismBody(so.acrossFlatsMm, so.lengthMm, rho, bore) : cylinderBody(so.acrossFlatsMm, so.lengthMm, rho, bore);
}

/** Frame standoffs from the bottom plate's upper face to the top plate's lower face. */
export function placeStandoffs(d: Design): Standoff[] {
  const s = d.body.standoffs;
  const z0 = d.body.thicknessMm;
  const density = STANDOFF_DENSITY_G_PER_CM3[s.material];
  return s.positionsMm.map((p, i) => {
    const base = { shape: s.shape, acrossFlatsMm: s.acrossFlatsMm, lengthMm: s.heightMm, densityGPerCm3: density, screw: s.boltSize } as const;
    return {
      id: `standoff ${i + 1}`,
      planMm: p,
      zBottomMm: z0,
      zTopMm: z0 + s.heightMm,
      startMm: [p[0], p[1], z0],
      axis: [0, 0, 1],
      ...base,
      material: s.material,
      ends: s.ends,
      massG: spacerBody(base).massG,
      sourcePath: `body.standoffs.positionsMm.${i}`,
    };
  });
}

/**
 * Round spacers across the camera at the side plates' mount holes: between the plates' inner
 * faces (the camera width), the mount bolt size, the standoffs' alloy and outside size.
 */
export function placeCameraSpacers(d: Design, plates: readonly PlacedPlate[]): Standoff[] {
  const c = d.camera;
  if (!c) return [];
  const side = plates.find((p) => p.part.role === 'camera-side');
  if (!side) return [];
  const density = STANDOFF_DENSITY_G_PER_CM3[d.body.standoffs.material];
  const half = c.cameraWidthMm / 2;
  return side.part.features
    .filter((f) => f.purpose === 'camera-mount' && f.centerMm)
    .map((f, i) => {
      const x = side.placement.translateMm[0] + f.centerMm![0];
      const z = side.placement.zMm + f.centerMm![1];
      const base = { shape: 'round', acrossFlatsMm: d.body.standoffs.acrossFlatsMm, lengthMm: 2 * half, densityGPerCm3: density, screw: c.mountBoltSize } as const;
      return {
        id: `camera spacer ${i + 1}`,
        planMm: [x, 0] as Vec2,
        zBottomMm: z,
        zTopMm: z,
        startMm: [x, -half, z] as Vec3,
        axis: [0, 1, 0] as Vec3,
        ...base,
        material: d.body.standoffs.material,
        ends: 'female-female' as const,
        massG: spacerBody(base).massG,
        sourcePath: 'camera',
      };
    });
}

/** Mass body of a standoff or spacer in the frame. */
export function standoffMassBody(so: Standoff): MassBody {
  const w = so.axis;
  // Any two unit vectors completing a right-handed set with the axis (the section is symmetric).
  const u: Vec3 = Math.abs(w[2]) > 0.5 ? [1, 0, 0] : [0, 0, 1];
  const v: Vec3 = [w[1] * u[2] - w[2] * u[1], w[2] * u[0] - w[0] * u[2], w[0] * u[1] - w[1] * u[0]];
  return placeBody(spacerBody(so), so.startMm, [u, v, w]);
}

/**
 * Height of an outrunner motor's bell over its bell diameter when the design gives none: 22xx–28xx
 * motors stand 0.6–0.7 D tall from base to bell top (domain.md: a 28 mm bell ≈ 18–20 mm; common practice, no source).
 */
export const MOTOR_HEIGHT_PER_BELL = 0.6;

/**
 * Height of the motor, one rule for every stage (fit checks, mass and balance, modes): the design's,
 * else 0.6 × its bell diameter, never reaching into the prop band (the prop sits on top of the motor). mm.
 */
export const motorHeightMm = (d: Design): number => d.motor.heightMm ?? Math.min(MOTOR_HEIGHT_PER_BELL * d.motor.bellDiameterMm, d.props.heightAboveArmMm - d.props.bandMm / 2);

/** Mass body of a motor: a uniform cylinder of the bell diameter and motor height on the arm top. */
export function motorMassBody(m: Motor): MassBody {
  return placeBody(cylinderOfMass(m.bellDiameterMm, m.heightMm, m.massG), m.baseCentreMm, [[1, 0, 0], [0, 1, 0], [0, 0, 1]]);
}

/**
 * One motor per site on the top face of the plate that carries it (its arm copy, or the bottom
 * plate of a unibody), with the motor screw positions from that plate's motor holes (slots: the
 * inner end, where the smaller circle's screw sits).
 */
export function placeMotors(d: Design, frame: Frame, plates: readonly PlacedPlate[]): Motor[] {
  const h = motorHeightMm(d);
  const holes = placedHoles(plates).filter((x) => x.purpose === 'motor-bolt');
  return frame.sites.map((s) => {
    const plate = plates.find((p) => p.site === s.id) ?? plates.find((p) => p.part.role === 'bottom')!;
    const zTop = plate.zLowMm + plate.thicknessMm;
    const near = (p: Vec2) => Math.hypot(p[0] - s.motorMm[0], p[1] - s.motorMm[1]) <= d.motor.bellDiameterMm / 2;
    const bolts: Vec3[] = holes.filter((x) => x.plate === plate && near(x.atMm)).map((x) => [x.atMm[0], x.atMm[1], zTop]);
    for (const f of plate.part.features) {
      if (f.purpose !== 'motor-bolt' || f.kind !== 'slot') continue;
      const ends = f.loop.filter((seg) => seg.kind === 'arc').map((seg) => (seg.kind === 'arc' ? transformPoint(seg.center, { rotateRad: plate.placement.rotateRad, translate: plate.placement.translateMm, mirrorY: plate.placement.mirrorY }) : ([0, 0] as Vec2)));
      const inner = ends.filter(near).sort((a, b) => Math.hypot(a[0] - s.motorMm[0], a[1] - s.motorMm[1]) - Math.hypot(b[0] - s.motorMm[0], b[1] - s.motorMm[1]))[0];
      if (inner) bolts.push([inner[0], inner[1], zTop]);
    }
    const base: Vec3 = [s.motorMm[0], s.motorMm[1], zTop];
    const motor: Motor = {
      site: s.id,
      onPlate: plate.id,
      baseCentreMm: base,
      bellDiameterMm: d.motor.bellDiameterMm,
      heightMm: h,
      massG: d.motorMassG,
      cgMm: [base[0], base[1], base[2] + h / 2],
      inertiaGMm2: [0, 0, 0, 0, 0, 0, 0, 0, 0],
      boltsMm: bolts,
      threadDepthMm: d.motor.threadDepthMm,
    };
    return { ...motor, inertiaGMm2: inertiaAboutCentre(motorMassBody(motor)) };
  });
}

/**
 * Direction of rotation seen from above. Props-in: the front props' leading blades sweep towards
 * the centre line at the front of the frame, so front-right turns counter-clockwise (its front
 * point moves to +y) and front-left clockwise; diagonal motors turn the same way.
 */
export function spinOf(site: Motor['site'], mode: 'props-in' | 'props-out' | undefined): Spin | null {
  if (!mode) return null;
  const ccwIn = site === 'front-right' || site === 'rear-left';
  return ccwIn === (mode === 'props-in') ? 'ccw' : 'cw';
}

/** The prop discs: on each motor's axis in the prop plane (arm top + props.heightAboveArmMm). */
export function placeProps(d: Design, motors: readonly Motor[]): Prop[] {
  return motors.map((m) => ({
    site: m.site,
    centreMm: [m.baseCentreMm[0], m.baseCentreMm[1], m.baseCentreMm[2] + d.props.heightAboveArmMm],
    diameterMm: d.props.diameterMm,
    bandMm: d.props.bandMm,
    spin: spinOf(m.site, d.props.spin),
  }));
}

/** Corners of stack mount i's pattern of side p (frame plan), in the order the geometry drills them. */
export function stackCorners(d: Design, i: number, sideMm: number): Vec2[] {
  const c = stackCentre(d, i);
  const h = sideMm / 2;
  return ([[h, h], [-h, h], [-h, -h], [h, -h]] as Vec2[]).map((o) => [c[0] + o[0], c[1] + o[1]]);
}

/** The screw size of stack mount i's pattern of side p. */
export function stackScrew(d: Design, i: number, sideMm: number): ScrewSize {
  const k = d.stacks[i].patternsMm.findIndex((p) => Math.abs(p - sideMm) < 1e-9);
  return d.stackBoltSizes[i][Math.max(0, k)];
}
