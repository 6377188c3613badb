/**
 * The assembled frame: the model contract every stage after geometry reads (checks, modes, variants,
 * quotes, pictures). Plain readonly data, millimetres, radians, grams; frame axes x forward, y left,
 * z up; origin in plan at the frame centre, z = 0 at the lower face of the bottom plate (the datum
 * `Placement.zMm` already uses, so arms and braces stacked under the body have negative z).
 *
 * Stability: other stages code against these names. Extend (add optional fields, add union members),
 * do not rename.
 */
import type { MotorSite, SiteId } from '../geometry/layout.js';
import type { Part, Placement } from '../geometry/part.js';
import type { Loop, Vec2 } from '../geometry/types.js';
import type { ScrewSize } from '../params/types.js';
import type { MassBody } from './massProps.js';

export type Vec3 = readonly [number, number, number];

/** Row-major 3×3 matrix (inertia tensors). */
export type Mat3 = readonly [number, number, number, number, number, number, number, number, number];

/** Axis-aligned box in frame coordinates. mm. */
export type Box3 = Readonly<{ minMm: Vec3; maxMm: Vec3 }>;

/**
 * Where a plate's own coordinates go in the frame. A point (u, v) of the part's drawing at depth w
 * through the thickness (w = 0 on the lower face, w = thickness on the upper face) lands at
 * `originMm + u·uAxis + v·vAxis + w·normal`. Horizontal plates: normal = +z and uAxis/vAxis in plan
 * (a mirrored copy has uAxis × vAxis = −normal). Vertical camera side plates: uAxis = +x,
 * vAxis = +z (the part's y is height), normal = −y (the plate's thickness runs towards −y from
 * originMm's y).
 */
export type Pose = Readonly<{
  originMm: Vec3;
  uAxis: Vec3;
  vAxis: Vec3;
  normal: Vec3;
  /** True when the part's drawing is mirrored in this copy (left and right arms of one part). */
  mirrored: boolean;
}>;

/** Stable ids of everything placed, used by findings (`parts: [a, b]`) and by joints. */
export type SolidId = string;

/**
 * One copy of a plate as placed: its outline extruded over its thickness. `id` is the part name,
 * with the copy's site or number when the part has several copies ("arm front-left", "brace 2",
 * "camera-side left").
 */
export type PlacedPlate = Readonly<{
  id: SolidId;
  part: Part;
  /** Index of the part in `Frame.parts`, and of this copy in `part.placements`. */
  partIndex: number;
  copy: number;
  placement: Placement;
  pose: Pose;
  orientation: 'horizontal' | 'vertical';
  /** z of the lower face (horizontal plates); lowest z of the outline (vertical plates). mm. */
  zLowMm: number;
  thicknessMm: number;
  /** Horizontal plates: the outline in plan, frame coordinates, counter-clockwise. Vertical: null. */
  planOutline: Loop | null;
  /** The motor site this copy serves (arms), else null. */
  site: SiteId | null;
  bounds: Box3;
  massG: number;
  /** Centre of mass of this copy (uniform plate: area centroid at mid-thickness). mm. */
  cgMm: Vec3;
}>;

export type StandoffShape = 'hex' | 'round';
/** Thread ends: female both ends (a screw from above and below) or male at the bottom, female on top. */
export type StandoffEnds = 'female-female' | 'male-female';

/**
 * A spacer. Frame standoffs stand vertical between the bottom and top plate (`axis` +z, from
 * `zBottomMm` to `zTopMm` at `planMm`). Camera spacers (in `Assembly.cameraSpacers`) run along +y
 * between the camera side plates: `startMm` is the centre of their right-hand end face, `planMm`
 * their centre in plan and `zBottomMm` = `zTopMm` the height of their axis.
 */
export type Standoff = Readonly<{
  id: SolidId;
  planMm: Vec2;
  zBottomMm: number;
  zTopMm: number;
  startMm: Vec3;
  axis: Vec3;
  lengthMm: number;
  shape: StandoffShape;
  /** Across flats (hex) or outside diameter (round). mm. */
  acrossFlatsMm: number;
  material: string;
  densityGPerCm3: number;
  ends: StandoffEnds;
  screw: ScrewSize;
  massG: number;
  /** Design path that sets it, for findings. */
  sourcePath: string;
}>;

/** Screw heads of the standards framewright buys to. */
export type ScrewStandard = 'ISO 4762' | 'ISO 7380-1' | 'ISO 10642' | 'ISO 14581';
export type NutStandard = 'ISO 4032' | 'ISO 4035' | 'ISO 7040';
export type WasherStandard = 'ISO 7089';

/** What a bolted joint does, for hardware list "use" and for the modes model's connector kind. */
export type JointKind =
  | 'arm-root'
  | 'standoff-bottom'
  | 'standoff-top'
  | 'stack'
  | 'motor'
  | 'camera-mount'
  | 'camera-pivot'
  | 'accessory';

/**
 * One screw and what it holds. `clamps` lists plate copies in order from the head to the tip;
 * `standoffEnds` the standoff ends the screw threads into (standoff joints) — the modes model ties
 * those nodes together. `headAtMm` is where the screw's axis meets the underside of the head;
 * `axis` points from the head towards the tip (±z for plates, ±y for camera screws).
 */
export type BoltedJoint = Readonly<{
  id: string;
  kind: JointKind;
  screw: ScrewSize;
  /** Position in plan (frame x, y); for ±y screws the x and z of the axis are in `headAtMm`. */
  planMm: Vec2;
  headAtMm: Vec3;
  axis: Vec3;
  headStandard: ScrewStandard;
  headDiameterMm: number;
  headHeightMm: number;
  /** Half the head's bearing diameter: the radius of the clamped ring. mm. */
  headRadiusMm: number;
  clamps: readonly SolidId[];
  standoffEnds: readonly Readonly<{ standoff: SolidId; end: 'bottom' | 'top' }>[];
  /** Total thickness clamped between head and nut (or standoff end). mm. */
  gripMm: number;
  /** Screw length from the hardware list (ISO 4762 preferred series). mm. */
  screwLengthMm: number;
  nut: Readonly<{ standard: NutStandard; heightMm: number; acrossFlatsMm: number }> | null;
  /** Where the nut's bearing face meets the axis (after the plates and any washer, or on top of a stack). */
  nutAtMm?: Vec3;
  /** A plain washer under the nut (`assembly.washers`), between the last plate and the nut. */
  washer?: Readonly<{ standard: WasherStandard; innerMm: number; outerMm: number; thicknessMm: number }>;
  /** Where the screw ends: a nut, a standoff thread, the motor's threaded base, a press nut. */
  endsIn: 'nut' | 'standoff' | 'motor-thread' | 'press-nut' | 'camera-thread';
  /** Set when the "screw" is a male–female standoff's own stud (no screw to buy; screwLengthMm 0). */
  stud?: SolidId;
  /**
   * What the joint's fastener weighs: screw (none for a stud), nut and washer from their dimensions
   * and `assembly.screwDensityGPerCm3` (`jointHardwareBody`), as moments about the frame origin.
   * Mass and balance sum it; the modes model hangs it on the joint.
   */
  hardwareMass: MassBody;
}>;

/** A joint as laid out, before its fastener is weighed (`weighJoint`). */
export type JointLayout = Omit<BoltedJoint, 'hardwareMass'>;

/** A motor on its arm. Cylinder of the bell diameter from the arm's top face. */
export type Motor = Readonly<{
  site: SiteId;
  /** The arm plate copy (or bottom plate of a unibody) it sits on. */
  onPlate: SolidId;
  /** Centre of the motor's base on the arm's top face. mm. */
  baseCentreMm: Vec3;
  bellDiameterMm: number;
  heightMm: number;
  massG: number;
  cgMm: Vec3;
  /** About the motor's own centre of mass, frame axes. g·mm². */
  inertiaGMm2: Mat3;
  /** Motor screw centres on the arm top face (from the arm's motor holes). mm. */
  boltsMm: readonly Vec3[];
  /** Depth of the threaded holes in the motor base; a longer screw reaches the windings. mm. */
  threadDepthMm: number;
}>;

export type Spin = 'cw' | 'ccw';

/** A prop's swept disc: a flat cylinder of the prop diameter, `bandMm` thick, centred on `centreMm`. */
export type Prop = Readonly<{
  site: SiteId;
  centreMm: Vec3;
  diameterMm: number;
  bandMm: number;
  /** Direction of rotation seen from above, when the design gives one. */
  spin: Spin | null;
}>;

export type ComponentKind = 'stack' | 'video-transmitter' | 'receiver' | 'battery' | 'camera' | 'antenna';

/**
 * A box-shaped component. `box` is the box at rest; `pose` turns it: centre plus three unit axes
 * (length along axes[0], width along axes[1], height along axes[2]). The camera's box is given at the
 * set uptilt; `sweep` holds its boxes over the whole tilt range for fit checks.
 */
export type OrientedBox = Readonly<{ centreMm: Vec3; halfSizeMm: Vec3; axes: readonly [Vec3, Vec3, Vec3] }>;

export type Component = Readonly<{
  id: SolidId;
  kind: ComponentKind;
  /** Design path (`components.2`) for findings and errors. */
  sourcePath: string;
  /** The boxes that make it up (a camera: body and lens; others: one box). */
  boxes: readonly OrientedBox[];
  massG: number;
  cgMm: Vec3;
  /** What carries it: plate copies, standoff ids, or a stack mount ("stack 1"). */
  mountedOn: readonly SolidId[];
  /** Where it is fixed (stack screws, pivot ends, strap slots). mm. */
  mountPointsMm: readonly Vec3[];
  /** Camera only: the body and lens boxes at each sampled uptilt, min to max. */
  sweep?: readonly (readonly OrientedBox[])[];
  /** Camera only: pivot axis point and the uptilt range, radians. */
  pivot?: Readonly<{ atMm: Vec3; minRad: number; maxRad: number; setRad: number }>;
  /** Battery only: straps through the top-plate slots (or round the bottom plate). */
  straps?: Readonly<{ slotsXMm: readonly number[]; strapLengthMm: number; strapWidthMm: number; side: 'top' | 'bottom' }>;
  /** Soft-mounted boards: the stiffness of each grommet, N/mm (the modes model puts a spring at each mount screw). */
  softMountNPerMm?: number;
  /** Stack only: the stack mount index and pattern it sits on; board plan size. */
  stack?: Readonly<{ mount: number; patternMm: number; boardMm: Vec2; heightMm: number }>;
}>;

/** Where the separate arms sit: the domain's order from the bottom up is braces, arms, bottom plate. */
export type ArmStacking = 'under-body' | 'over-body';

/**
 * The whole assembled frame. Heights are documented on `stackUp` for pictures and drawings; the
 * arrays are in a stable order (parts as in the frame, copies as placed; sites front-right,
 * front-left, rear-left, rear-right).
 */
export type Assembly = Readonly<{
  plates: readonly PlacedPlate[];
  standoffs: readonly Standoff[];
  /** Spacers across the camera between its side plates (holding the side plates' mount holes). */
  cameraSpacers: readonly Standoff[];
  joints: readonly BoltedJoint[];
  motors: readonly Motor[];
  props: readonly Prop[];
  components: readonly Component[];
  sites: readonly MotorSite[];
  armStacking: ArmStacking;
  stackUp: StackUp;
}>;

/** The heights a designer dimensions on a side view. mm, frame z. */
export type StackUp = Readonly<{
  /** Lowest face of the plate sandwich (braces or arms under the body, else the bottom plate). */
  bottomMm: number;
  bottomPlateTopMm: number;
  /** Top face of the arms (where motors sit). */
  armTopMm: number;
  /** Gap between bottom plate upper face and top plate lower face (standoff length). */
  plateGapMm: number;
  topPlateLowMm: number;
  topPlateTopMm: number;
  propPlaneMm: number;
}>;

/** One line of the hardware list: identical items for one use, counted per frame and per batch. */
export type HardwareItem = Readonly<{
  item: string;
  /** Product standard ("ISO 4762"), or "none" for parts no standard covers (standoffs, press nuts). */
  standard: string;
  size: string;
  /** Nominal length (screws, standoffs, spacers); null for nuts. mm. */
  lengthMm: number | null;
  count: number;
  countPerBatch: number;
  use: string;
}>;

export type HardwareList = Readonly<{ batchSize: number; items: readonly HardwareItem[] }>;

/** Mass and balance of the assembled frame. g, mm, g·mm². */
export type MassBalance = Readonly<{
  massG: Readonly<{ frame: number; hardware: number; motors: number; components: number; battery: number; allUp: number }>;
  /** Centre of gravity, all up. mm. */
  cgMm: Vec3;
  /** Centre of gravity without the battery. mm. */
  cgDryMm: Vec3;
  /** Centroid of the motor axes in plan: where the thrust acts when all motors pull alike. mm. */
  thrustCentreMm: Vec2;
  /** Plan distance from the thrust centre to the centre of gravity. mm. */
  cgOffsetMm: number;
  /** That offset over the mean motor distance from the thrust centre. */
  cgOffsetShare: number;
  /** Inertia tensor about the centre of gravity, frame axes, all up. g·mm². */
  inertiaGMm2: Mat3;
}>;
