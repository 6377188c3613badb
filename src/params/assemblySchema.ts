import { z } from 'zod';
import { int, num } from './fields.js';

/**
 * The design file's `assembly:` and `components:` sections: how the plates stack and what the frame
 * carries. Both optional; a design without them is assembled with the defaults and no components.
 */

const FASTENER_NUTS = ['hex', 'thin', 'locking'] as const;

export const AssemblySchema = z
  .object({
    armStacking: z
      .enum(['under-body', 'over-body'], { error: 'must be under-body or over-body' })
      .default('under-body')
      .describe('separate arms: under-body (from the bottom up: braces, arms, bottom plate) or over-body (bottom plate, arms, braces on top)'),
    nut: z
      .enum(FASTENER_NUTS, { error: `must be one of ${FASTENER_NUTS.join(', ')}` })
      .default('locking')
      .describe('nuts on through-bolts: hex (ISO 4032), thin (ISO 4035) or locking (ISO 7040 prevailing torque)'),
    washers: z.boolean({ error: 'must be true or false' }).default(false).describe('a plain washer (ISO 7089) under every nut'),
    // Steel screws 7.85 g/cm³, stainless A2 7.9 (reference-values.md, densities).
    screwDensityGPerCm3: num(1, 20, 'g/cm³', 'density of the screws and nuts (stainless steel 7.9; titanium 4.5)').default(7.9),
    // domain.md: ≥ 1 × d of thread in a standoff (common practice).
    standoffEngagementD: num(0.5, 3, '× d', 'least thread engagement of a screw in a standoff, as a multiple of the screw diameter').default(1),
    batchSize: int(1, 10000, 'frames per batch, for the hardware counts per batch').default(1),
  })
  .strict();

const point = z.tuple([num(-500, 500, 'mm', 'x'), num(-500, 500, 'mm', 'y')]).describe('[x, y] in mm: x forward, y left, origin at the frame centre');
const size3 = z
  .tuple([num(1, 400, 'mm', 'length (x)'), num(1, 400, 'mm', 'width (y)'), num(0.5, 200, 'mm', 'height (z)')])
  .describe('[length, width, height] in mm');
const name = z.string().min(1).max(40).optional().describe('label for findings and drawings (default: the kind and its number)');
// A silicone grommet of the usual size (3 mm tall, 6 mm across, Shore 40A) works out at roughly
// 10–20 N/mm (E·A/h); the design states its own figure (common practice, no source).
const softMount = num(0.1, 100000, 'N/mm', 'soft mounts: the stiffness of each grommet, the same along every axis; the boards then ride on springs at their screws, which lowers the board modes and isolates them above √2 × their own frequency (omit for a hard mount)').optional();
const mass = (max: number) => num(0.1, max, 'g', 'mass');

/** Where a box-shaped board sits: on a stack mount's stack, or on a plate face at a plan position. */
const mounted = {
  on: z
    .enum(['stack', 'bottom-plate', 'top-plate', 'under-top-plate'], { error: 'must be stack, bottom-plate, top-plate or under-top-plate' })
    .default('stack')
    .describe('stack (on top of the boards of stack mount `stack`), bottom-plate (its upper face), top-plate (its upper face) or under-top-plate (hanging under it)'),
  stack: int(0, 5, 'index of the stack mount in `stacks` (on: stack)').default(0),
  atMm: point.optional().describe('centre in plan (on a plate; default the stack centre)'),
};

const stackComponent = z
  .object({
    kind: z.literal('stack').describe('flight-controller / ESC boards on a stack mount'),
    name,
    stack: int(0, 5, 'index of the stack mount in `stacks`').default(0),
    patternMm: num(10, 60, 'mm', 'the bolt square it uses (default: the mount’s first pattern)').optional(),
    boardMm: z.tuple([num(5, 200, 'mm', 'board length (x)'), num(5, 200, 'mm', 'board width (y)')]).describe('board size [length, width] in mm'),
    heightMm: num(1, 100, 'mm', 'stack height from the bottom plate, soft mounts and connectors included'),
    massG: mass(500),
    softMountNPerMm: softMount,
  })
  .strict();

const boxComponent = (kind: 'video-transmitter' | 'receiver', what: string) =>
  z
    .object({
      kind: z.literal(kind).describe(what),
      name,
      ...mounted,
      sizeMm: size3,
      massG: mass(300),
      softMountNPerMm: softMount,
    })
    .strict();

const batteryComponent = z
  .object({
    kind: z.literal('battery').describe('flight battery, strapped on the top plate or under the bottom plate'),
    name,
    side: z.enum(['top', 'bottom'], { error: 'must be top or bottom' }).default('top').describe('on the top plate, or under the bottom plate'),
    xMm: num(-200, 200, 'mm', 'centre x (forward)').default(0),
    sizeMm: size3,
    massG: mass(3000),
    // common practice, no source: 20 × 200–250 mm hook-and-loop straps.
    strapLengthMm: num(50, 600, 'mm', 'usable strap length').default(200),
  })
  .strict();

const cameraComponent = z
  .object({
    kind: z.literal('camera').describe('the camera body between the camera side plates (needs a `camera` section)'),
    name,
    widthMm: num(8, 40, 'mm', 'body width across the side plates (default: camera.widthMm)').optional(),
    heightMm: num(8, 40, 'mm', 'body height (default: its width)').optional(),
    depthMm: num(5, 60, 'mm', 'body depth, front face to back'),
    lensLengthMm: num(0, 40, 'mm', 'lens length ahead of the front face').default(8),
    lensDiameterMm: num(3, 30, 'mm', 'lens barrel diameter').default(12),
    pivotBehindFaceMm: num(1, 50, 'mm', 'pivot axis behind the front face (default: half the depth)').optional(),
    massG: mass(200),
  })
  .strict();

const antennaComponent = z
  .object({
    kind: z.literal('antenna').describe('an antenna or its mount tube leaving the frame'),
    name,
    atMm: point.describe('where it leaves the frame, in plan'),
    zMm: num(-50, 150, 'mm', 'height of that point above the bottom plate’s lower face'),
    lengthMm: num(5, 300, 'mm', 'length'),
    diameterMm: num(1, 30, 'mm', 'diameter').default(6),
    directionDeg: num(-180, 180, 'deg', 'direction in plan from +x (180: straight back)').default(180),
    elevationDeg: num(-90, 90, 'deg', 'angle above the horizontal').default(30),
    massG: mass(100),
  })
  .strict();

export const COMPONENT_KINDS = ['stack', 'video-transmitter', 'receiver', 'battery', 'camera', 'antenna'] as const;

export const ComponentSchema = z.discriminatedUnion(
  'kind',
  [
    stackComponent,
    boxComponent('video-transmitter', 'video transmitter board'),
    boxComponent('receiver', 'radio receiver'),
    batteryComponent,
    cameraComponent,
    antennaComponent,
  ],
  { error: `must be one of ${COMPONENT_KINDS.join(', ')}` },
);

export const ComponentsSchema = z.array(ComponentSchema).max(24).default([]).describe('what the frame carries: stacks, video transmitter, receiver, battery, camera, antennas');

export type ComponentSpec = z.infer<typeof ComponentSchema>;
