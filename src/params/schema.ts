import { z } from 'zod';
import { ChecksSchema } from './checksSchema.js';
import { SCREW_SIZES } from './screws.js';
import { EIGHTH_INCH_MM } from './units.js';
import { int, num } from './fields.js';
import { AssemblySchema, ComponentsSchema } from './assemblySchema.js';

/**
 * The design file. Every number carries its unit in its name (Mm, Deg, Gpa...) and its allowed range
 * in the schema, so the JSON Schema printed by `framewright schema` documents itself and every
 * error can name the range.
 */

const screw = z.enum(SCREW_SIZES, { error: `must be one of ${SCREW_SIZES.join(', ')}` }).describe('ISO metric screw size');

const point = z.tuple([num(-500, 500, 'mm', 'x'), num(-500, 500, 'mm', 'y')]).describe('[x, y] in mm: x forward, y left, origin at the frame centre');

const CORNER_RELIEFS = ['none', 'dogbone', 'tbone'] as const;
const cornerRelief = z.enum(CORNER_RELIEFS, { error: `must be one of ${CORNER_RELIEFS.join(', ')}` });

const partCommon = {
  material: z.string().min(1).optional().describe('name of an entry in `materials` (default: the first one)'),
  weaveDeg: num(-90, 90, 'deg', "angle of the sheet's 0° fibre direction in the part's own frame").default(0),
  cornerRelief: cornerRelief.optional().describe("reliefs at the sharp inside corners of this part's slots and cut-outs, so a square tab seats fully (default: cutting.cornerRelief)"),
};

export const MaterialSchema = z
  .object({
    e1Gpa: num(1, 400, 'GPa', 'in-plane modulus along the warp'),
    e2Gpa: num(1, 400, 'GPa', 'in-plane modulus along the weft'),
    g12Gpa: num(0.1, 200, 'GPa', 'in-plane shear modulus'),
    nu12: num(0, 0.49, '', 'major Poisson ratio'),
    densityGPerCm3: num(0.5, 3, 'g/cm³', 'density'),
  })
  .strict();

const squareFrame = z
  .object({
    kind: z.literal('x').describe('motors on a rectangle, each arm running straight from the centre to its motor'),
    wheelbaseMm: num(60, 1000, 'mm', 'diagonal motor-to-motor distance'),
    armAngleDeg: num(20, 70, 'deg', "angle of the front motors' diagonal from the forward axis: 45 square, below 45 stretched (longer front to rear), above squashed").default(45),
  })
  .strict();

const hFrame = z
  .object({
    kind: z.literal('h').describe('motors on a rectangle; each arm runs from its start on a long body to its motor (fore and aft when the start is level with the motor), so the body width is free of the motor spacing'),
    wheelbaseMm: num(60, 1000, 'mm', 'diagonal motor-to-motor distance'),
    armAngleDeg: num(20, 70, 'deg', "angle of the front motors' diagonal from the forward axis: 45 square, below 45 stretched (longer front to rear), above squashed").default(45),
    frontArmStartMm: point.describe('[x, y] where the left front arm starts, on the body (the right one mirrors it in y); its root bolts are measured from here'),
    rearArmStartMm: point.describe('[x, y] where the left rear arm starts, on the body (the right one mirrors it in y)'),
  })
  .strict();

const armPlace = z
  .object({
    reachMm: num(30, 500, 'mm', 'frame centre to motor centre'),
    angleDeg: num(10, 80, 'deg', 'angle of the arm from the forward (front arms) or rearward (rear arms) axis'),
  })
  .strict();

const asymmetricFrame = z
  .object({
    kind: z.literal('asymmetric').describe('front and rear arms of different reach and angle'),
    front: armPlace,
    rear: armPlace,
  })
  .strict();

export const LayoutSchema = z.discriminatedUnion('kind', [squareFrame, hFrame, asymmetricFrame], {
  error: 'layout.kind must be one of x, h, asymmetric',
});

const PROP_DIAMETER_ERROR = 'must be a length: mm as a number (25 to 600), or a string with a unit such as "5.1in" or "130mm"';
const propDiameter = z
  .union(
    [
      z.number().min(25, { error: PROP_DIAMETER_ERROR }).max(600, { error: PROP_DIAMETER_ERROR }),
      z.string().regex(/^\s*[0-9]*\.?[0-9]+\s*(in|inch|inches|"|mm|cm)?\s*$/i, { error: PROP_DIAMETER_ERROR }),
    ],
    { error: PROP_DIAMETER_ERROR },
  )
  .describe('prop diameter: mm as a number, or a string with a unit ("5.1in", "130mm")');

/** Fields every arm construction takes: the arm's shape and the motor pad. */
const armShapeFields = {
  style: z.enum(['straight', 'tapered', 'truss']).default('straight').describe('straight bar, tapered bar (widthMm to tipWidthMm), or truss (main and secondary strut with windows)'),
  widthMm: num(4, 60, 'mm', 'arm width (at the root for tapered arms); straight and tapered arms only').optional(),
  tipWidthMm: num(4, 60, 'mm', 'arm width at the motor for tapered arms').optional(),
  truss: z
    .object({
      mainWidthMm: num(3, 40, 'mm', 'main strut width'),
      secondaryWidthMm: num(3, 40, 'mm', 'secondary strut width'),
      meetFraction: num(0.2, 0.9, '', 'where the secondary strut meets the main strut, as a fraction of the arm length'),
      spreadMm: num(4, 80, 'mm', 'width of the arm at the root, spanning both struts'),
    })
    .strict()
    .optional()
    .describe('truss arms: a main strut to the motor and a secondary strut meeting it part-way'),
  tipPadMarginMm: num(1, 20, 'mm', 'material outside the motor bolt holes; default: what gives the hole-edge rule\'s warning e/D (checks.hole-edge-distance.warnEdgeRatio) round the motor holes, rounded up to 0.5 mm').optional(),
  tipGuardMm: num(0, 15, 'mm', 'extra plate beyond the motor bell radius to guard it; 0 for none').default(0),
  rootFilletMm: num(0, 20, 'mm', 'fillet radius where arms meet the body or each other').default(4),
};

const separateArms = z
  .object({
    construction: z.literal('separate').default('separate').describe('separate arm plates clamped between the bottom plate and the braces'),
    ...armShapeFields,
    thicknessMm: num(0.5, 8, 'mm', 'arm plate thickness'),
    ...partCommon,
    root: z
      .object({
        boltCount: int(1, 4, 'root bolts per arm, along the arm'),
        boltSpacingMm: num(4, 60, 'mm', 'distance between root bolts'),
        boltSize: screw.default('M3'),
        reachMm: num(5, 300, 'mm', 'arm line start (the frame centre; for h layouts the arm start on the body) to the innermost root bolt'),
        edgeMarginMm: num(1, 20, 'mm', "material from a root bolt centre to the arm end; default: the hole-edge rule's warning e/D × the bolt's clearance hole, rounded up to 0.5 mm").optional(),
      })
      .strict(),
  })
  .strict();

const unibodyArms = z
  .object({
    construction: z.literal('unibody').describe('arms cut in one piece with the bottom plate (its thickness, material and weave)'),
    ...armShapeFields,
  })
  .strict();

/**
 * Arms, discriminated by construction: separate arm plates have their own thickness, material and
 * root bolts; unibody arms are part of the bottom plate and take none of these.
 */
export const ArmsSchema = z.discriminatedUnion('construction', [separateArms, unibodyArms], {
  error: 'arms.construction must be separate or unibody',
});

/** Keys only separate arms take, with why a unibody frame has no use for them. */
export const SEPARATE_ONLY_ARM_KEYS: Readonly<Record<string, string>> = {
  thicknessMm: 'unibody arms are cut from the bottom plate: set body.thicknessMm',
  root: 'unibody arms have no root bolts: they are one piece with the bottom plate',
  material: 'unibody arms are cut from the bottom plate: set body.material',
  weaveDeg: 'unibody arms are cut from the bottom plate: set body.weaveDeg',
};

export const DesignSchema = z
  .object({
    $schema: z.string().optional(),
    name: z.string({ error: 'is required (the frame name)' }).min(1).max(80).describe('frame name, used in file names and drawings'),
    revision: z.string().max(20).default('A').describe('revision letter or number for drawings'),
    layout: LayoutSchema,
    props: z
      .object({
        diameter: propDiameter,
        minTipGapMm: num(0, 100, 'mm', 'smallest allowed gap between adjacent prop tips').default(6),
        heightAboveArmMm: num(0, 80, 'mm', 'prop plane above the top face of the arm').default(14),
        // common practice, no source: a prop's hub and pitched blades sweep a band a few mm thick.
        bandMm: num(1, 40, 'mm', 'thickness of the band the blades sweep, centred on the prop plane').default(6),
        spin: z.enum(['props-in', 'props-out'], { error: 'must be props-in or props-out' }).optional().describe('direction of rotation: props-in (front props turn towards the centre line at the front) or props-out'),
        // common practice, no source: 240 m/s puts a 5-inch prop near 590 Hz and a 7-inch near 430 Hz at full throttle.
        maxTipSpeedMps: num(50, 340, 'm/s', 'blade tip speed at full throttle, for the motors’ rotation band when the motor gives no kv and voltage (default 240)').optional(),
      })
      .strict(),
    motor: z
      .object({
        boltCircleMm: z
          .array(num(5, 60, 'mm', 'bolt circle diameter'))
          .min(1)
          .max(2, { error: 'takes one circle, or two (e.g. [16, 19]) for an n×m pattern' })
          .describe('one circle ([16]) or the two diameters of an n×m pattern ([16, 19])'),
        boltSize: screw.default('M3'),
        boltCount: z.union([z.literal(3), z.literal(4)], { error: 'must be 3 or 4' }).default(4).describe('motor bolts used: 4, or 3 (the root-side hole left out)'),
        slotted: z.boolean().default(false).describe('slots spanning both circles instead of round holes (needs two circles)'),
        boreMm: num(0, 30, 'mm', "centre bore for the shaft clip; 0 for none; default: the motor table's bore for this bolt pattern, kept clear of the bolt holes by the web rule's warning web").optional(),
        bellDiameterMm: num(8, 80, 'mm', "motor bell diameter, for the tip pad and guard; default: the motor table's bell for this bolt pattern").optional(),
        massG: num(1, 1000, 'g', 'mass of one motor, for stiffness and resonance; default: the typical mass of the motor class whose bell is nearest').optional(),
        heightMm: num(3, 80, 'mm', 'motor height from its base to the top of the bell (default: 0.6 × the bell diameter, at most up to the prop band)').optional(),
        kv: num(50, 20000, 'rpm/V', 'motor speed constant; with supplyVoltageV it sets the top of the motors’ rotation band (kv × V × 0.8 under load / 60)').optional(),
        supplyVoltageV: num(1, 100, 'V', 'battery voltage under load, e.g. 22.2 for a 6S pack (needs kv)').optional(),
        // domain.md: 3–5 mm of thread in the motor base (common practice).
        threadDepthMm: num(1, 15, 'mm', 'depth of the threaded holes in the motor base; a longer screw reaches the windings').default(3.5),
      })
      .strict(),
    arms: ArmsSchema,
    body: z
      .object({
        lengthMm: num(20, 400, 'mm', 'bottom plate length (x)'),
        widthMm: num(15, 300, 'mm', 'bottom plate width (y)'),
        cornerRadiusMm: num(0, 50, 'mm', 'outline corner radius').default(5),
        thicknessMm: num(0.5, 8, 'mm', 'bottom plate thickness').default(2.5),
        ...partCommon,
        standoffs: z
          .object({
            boltSize: screw.default('M3'),
            heightMm: num(5, 80, 'mm', 'standoff length (plate gap)').default(25),
            // domain.md: aluminium, M3, 5 mm across flats hex or round (common practice).
            shape: z.enum(['hex', 'round'], { error: 'must be hex or round' }).default('hex').describe('hex or round'),
            acrossFlatsMm: num(2, 15, 'mm', 'across flats (hex) or outside diameter (round)').default(5),
            material: z.enum(['aluminium-6061', 'aluminium-7075'], { error: 'must be aluminium-6061 or aluminium-7075' }).default('aluminium-7075').describe('standoff alloy (density from ASM handbook values)'),
            ends: z.enum(['female-female', 'male-female'], { error: 'must be female-female or male-female' }).default('female-female').describe('threads: female both ends (a screw from each plate) or male at the bottom through the bottom plate into a nut'),
            positionsMm: z.array(point).min(3).max(16).describe('standoff centres'),
          })
          .strict(),
      })
      .strict(),
    stacks: z
      .array(
        z
          .object({
            place: z.union([z.enum(['front', 'middle', 'rear']), num(-300, 300, 'mm', 'x offset of the stack centre')]).default('middle').describe('front (x = +length/4), middle (x = 0), rear (x = −length/4), or an x offset in mm'),
            yMm: num(-150, 150, 'mm', 'sideways offset').default(0),
            patternsMm: z.array(num(10, 60, 'mm', 'bolt square side')).min(1).max(4).describe('concentric square patterns, e.g. [30.5, 20]'),
            boltSize: z
              .union([screw, z.array(screw)], { error: `must be a screw size (${SCREW_SIZES.join(', ')}) or a list of them, one per pattern` })
              .default('M3')
              .describe('one size for all patterns, or one per pattern'),
            countersunk: z.boolean().default(false).describe('countersink the holes from the bottom face for flush heads (e.g. screws under the arms)'),
          })
          .strict(),
      )
      .max(6)
      .default([])
      .describe('flight-controller / video-transmitter stack mounts on the bottom plate'),
    topPlate: z
      .object({
        thicknessMm: num(0.5, 8, 'mm', 'top plate thickness').default(2),
        lengthMm: num(20, 400, 'mm', 'top plate length; default: body length').optional(),
        widthMm: num(15, 300, 'mm', 'top plate width; default: body width').optional(),
        cornerRadiusMm: num(0, 50, 'mm', 'outline corner radius').default(5),
        ...partCommon,
        strapSlots: z
          .object({
            strapWidthMm: num(5, 40, 'mm', 'battery strap width (slot is 1 mm longer)').default(20),
            slotWidthMm: num(1.5, 8, 'mm', 'slot width across the strap; default: 3 mm, or the router bit plus 0.2 mm when that is wider (rounded up to 0.1 mm)').optional(),
            xPositionsMm: z.array(num(-200, 200, 'mm', 'slot centre x')).max(6).default([]).describe('x of each strap slot centre; one slot per entry'),
          })
          .strict()
          .default({ strapWidthMm: 20, xPositionsMm: [] }),
        leadOpening: z
          .object({
            xMm: num(-200, 200, 'mm', 'centre x'),
            lengthMm: num(3, 60, 'mm', 'size along x'),
            widthMm: num(3, 60, 'mm', 'size along y'),
          })
          .strict()
          .optional()
          .describe('rounded opening that keeps the battery lead short and clear of the props'),
        accessoryHoles: z
          .array(z.object({ atMm: point, boltSize: screw.default('M3') }).strict())
          .max(24)
          .default([])
          .describe('clearance holes for accessory mounts (e.g. an action-camera mount)'),
        lightening: z
          .array(
            z
              .object({
                atMm: point,
                lengthMm: num(3, 200, 'mm', 'size along x'),
                widthMm: num(3, 200, 'mm', 'size along y'),
                cornerRadiusMm: num(0, 50, 'mm', 'corner radius').default(2),
              })
              .strict(),
          )
          .max(24)
          .default([])
          .describe('rounded-rectangle lightening cut-outs'),
      })
      .strict()
      .default({ thicknessMm: 2, cornerRadiusMm: 5, weaveDeg: 0, strapSlots: { strapWidthMm: 20, xPositionsMm: [] }, accessoryHoles: [], lightening: [] }),
    braces: z
      .object({
        thicknessMm: num(0.5, 6, 'mm', 'brace plate thickness').default(1.5),
        marginMm: num(2, 20, 'mm', 'material around the arm-root bolts').default(4),
        ...partCommon,
      })
      .strict()
      .optional()
      .describe('clamp plates under the arm roots (separate arms only)'),
    camera: z
      .object({
        widthMm: z
          .union([z.enum(['nano', 'micro', 'mini']), num(10, 40, 'mm', 'camera body width')], { error: 'must be nano (14), micro (19), mini (21.5) or a width in mm, 10 to 40' })
          .default('micro')
          .describe('nano 14, micro 19, mini 21.5 mm, or a width in mm'),
        thicknessMm: num(0.5, 6, 'mm', 'side plate thickness').default(2),
        ...partCommon,
        forwardOffsetMm: num(-30, 80, 'mm', 'camera pivot ahead of the front standoffs'),
        pivotHeightMm: num(3, 80, 'mm', 'camera pivot above the bottom plate'),
        pivotBoltSize: screw.default('M2'),
        tiltSlotRadiusMm: num(3, 30, 'mm', 'radius of the uptilt arc slot about the pivot').default(8),
        tiltSlotWidthMm: num(1.5, 8, 'mm', "width of the uptilt arc slot; default: the pivot bolt's clearance hole, or the router bit plus 0.2 mm when that is wider (rounded up to 0.1 mm)").optional(),
        uptiltMinDeg: num(-10, 80, 'deg', 'least uptilt the slot allows').default(0),
        uptiltMaxDeg: num(0, 90, 'deg', 'most uptilt the slot allows').default(50),
        uptiltDeg: num(-10, 90, 'deg', 'uptilt set for the checks').default(25),
        horizontalFovDeg: num(30, 179, 'deg', 'horizontal field of view').default(120),
        verticalFovDeg: num(20, 179, 'deg', 'vertical field of view').default(90),
        plateMarginMm: num(2, 20, 'mm', 'material around pivot, slot and mount holes').default(4),
        mountBoltSize: screw.default('M3'),
      })
      .strict()
      .optional(),
    materials: z
      .record(z.string(), MaterialSchema)
      .default({ 'woven-cf': { e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 } })
      .describe('named woven 0/90 laminates; parts use the first unless they name one'),
    cutting: z
      .object({
        toolDiameterMm: num(0.3, 12, 'mm', 'end mill diameter').default(EIGHTH_INCH_MM),
        holeSeries: z.enum(['fine', 'medium', 'coarse']).default('medium').describe('ISO 273 clearance hole series'),
        cornerRelief: cornerRelief
          .default('none')
          .describe('reliefs sized to the tool at sharp inside corners of slots and cut-outs: none; dogbone (a disc on the corner bisector); tbone (a disc on the shorter side, running along the longer)'),
      })
      .strict()
      .default({ toolDiameterMm: EIGHTH_INCH_MM, holeSeries: 'medium', cornerRelief: 'none' }),
    assembly: AssemblySchema.prefault({}).describe('how the plates stack and what fastens them'),
    components: ComponentsSchema,
    checks: ChecksSchema.prefault({}),
  })
  .strict();

export type DesignInput = z.input<typeof DesignSchema>;
export type DesignParsed = z.infer<typeof DesignSchema>;
