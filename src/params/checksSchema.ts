import { z } from 'zod';
import { rangedNumber } from './fields.js';

/**
 * The design file's `checks:` section: one entry per design rule, named by the rule id that its
 * findings carry, each limit with its unit, range, default and source. Every entry and key is
 * optional; `framewright check --limit RULE.KEY=VALUE` sets the same keys from the command line.
 */

const num = (min: number, max: number, unit: string, what: string) =>
  rangedNumber(min, max, {
    typeError: `must be a number (${unit || 'ratio'}), ${min} to ${max}`,
    below: `is below the allowed range ${min} to ${max}${unit ? ` ${unit}` : ''}`,
    above: `is above the allowed range ${min} to ${max}${unit ? ` ${unit}` : ''}`,
    description: `${what} [${unit || 'ratio'}, ${min} to ${max}]`,
  });

const enabled = z.boolean({ error: 'must be true or false' }).default(true).describe('run this rule');

const webWidth = z
  .object({
    enabled,
    // Common practice, no source: small-multirotor plates routinely leave 1.5–2.5 mm round M2/M3
    // holes (reference-values.md, "Hole edge distance").
    minMm: num(0.1, 20, 'mm', 'absolute minimum web (error below the larger of this and perThickness × t)').default(1.5),
    // Common practice, no source: thicker plates delaminate over a wider zone when routed.
    perThickness: num(0, 5, '', 'minimum web as a multiple of the plate thickness').default(0.4),
    // Common practice, no source.
    warnFactor: num(1, 3, '', 'warn below this multiple of the error limit').default(1.25),
  })
  .strict();

const holeEdge = z
  .object({
    enabled,
    // Polymers 2024, 16(6), 847: single-bolt CFRP joints change from shear-out to bearing failure at e/D 2.0.
    warnEdgeRatio: num(0.5, 10, '', 'warn when e/D (hole centre to free edge over diameter) is below this').default(2.0),
    // Common practice (reference-values.md suggested default): small plates leave e/D ≈ 1.2–2.
    errorEdgeRatio: num(0.5, 10, '', 'error when e/D is below this').default(1.5),
    // FAA AC 43.13-1B ch. 4: pitch ≥ 3D.
    warnPitchRatio: num(1, 10, '', 'warn when centre distance over diameter between neighbouring bolt holes is below this').default(3.0),
  })
  .strict()
  .refine((v) => v.errorEdgeRatio <= v.warnEdgeRatio, {
    path: ['errorEdgeRatio'],
    error: 'must not exceed warnEdgeRatio',
  });

const bitReach = z
  .object({
    enabled,
    toolDiameterMm: num(0.3, 12, 'mm', 'router bit diameter (default: cutting.toolDiameterMm)').optional(),
  })
  .strict();

const weave = z
  .object({
    enabled,
    // Common practice, no source (issue 3 default).
    minModulusFraction: num(0.05, 1, '', 'warn when a member’s axial modulus Ex(θ) falls below this fraction of the on-axis value').default(0.7),
  })
  .strict();

const holeStress = z.object({ enabled }).strict();

const propClearance = z
  .object({
    enabled,
    minTipGapMm: num(0, 100, 'mm', 'smallest gap between adjacent prop tips (default: props.minTipGapMm)').optional(),
    // Common practice, no source.
    minPartClearanceMm: num(0, 50, 'mm', 'smallest plan-view gap between a prop disc (its swept band) and any solid the band reaches: plates, standoffs, screws, motors, components, antennas').default(3),
    // Common practice, no source.
    maxVerticalGapMm: num(0, 100, 'mm', 'warn about a plate under or over a prop disc only when it is closer than this to the prop plane').default(10),
  })
  .strict();

const cameraView = z
  .object({
    enabled,
    horizontalFovDeg: num(30, 179, 'deg', 'horizontal field of view (default: camera.horizontalFovDeg)').optional(),
    verticalFovDeg: num(20, 179, 'deg', 'vertical field of view (default: camera.verticalFovDeg)').optional(),
  })
  .strict();

const interference = z.object({ enabled }).strict();

const stackFit = z
  .object({
    enabled,
    // domain.md: ≥ 1–2 mm between the stack's top and the top plate (common practice).
    topClearanceMm: num(0, 20, 'mm', 'least gap between the top of a stack (nuts included) and the top plate').default(1.5),
    // Common practice, no source: boards are not pressed against standoffs or screw heads.
    sideClearanceMm: num(0, 20, 'mm', 'least plan gap between a board and a standoff, spacer or screw').default(0.5),
  })
  .strict();

const cameraFit = z
  .object({
    enabled,
    // Common practice, no source: side plates spring a few tenths of a millimetre to grip the body.
    fitToleranceMm: num(0, 3, 'mm', 'a camera body up to this much wider than the side-plate spacing still fits (the plates spring)').default(0.3),
    // Common practice, no source: a gap beyond this needs washers to clamp the camera.
    looseMm: num(0, 10, 'mm', 'warn when the body is narrower than the spacing by more than this').default(1),
    clearanceMm: num(0, 10, 'mm', 'least gap between the camera, swept through its tilt range, and plates, spacers, standoffs and screws').default(0.5),
  })
  .strict();

const batteryFit = z
  .object({
    enabled,
    // Common practice, no source: hook-and-loop straps need about this much overlap to hold.
    strapOverlapMm: num(0, 200, 'mm', 'hook-and-loop overlap a strap needs beyond the loop round battery and plate').default(40),
  })
  .strict();

const motorScrew = z.object({ enabled }).strict();

export const ChecksSchema = z
  .object({
    'web-width': webWidth.prefault({}).describe('narrowest material between contours and inside one contour'),
    'hole-edge-distance': holeEdge.prefault({}).describe('bolt hole centre to free edge (e/D) and bolt pitch'),
    'bit-reach': bitReach.prefault({}).describe('inside corners, gaps and holes against the router bit'),
    'weave-direction': weave.prefault({}).describe('strut direction against the weave, Ex(θ) by laminate theory'),
    'hole-stress': holeStress.prefault({}).describe('stress concentration at bolt holes in struts (information)'),
    'prop-clearance': propClearance.prefault({}).describe('prop tip gaps and prop discs against plates and standoffs'),
    'camera-view': cameraView.prefault({}).describe('prop discs inside the camera view'),
    interference: interference.prefault({}).describe('solids of the assembled frame that intersect beyond their contact faces'),
    'stack-fit': stackFit.prefault({}).describe('stack boards inside the body, clear of standoffs and screws, and under the top plate'),
    'camera-fit': cameraFit.prefault({}).describe('camera body between its side plates and clear of everything through its tilt range'),
    'battery-fit': batteryFit.prefault({}).describe('battery between its strap slots and straps long enough'),
    'motor-screw': motorScrew.prefault({}).describe('motor screws from the hardware list against the motor thread depth'),
  })
  .strict()
  .describe('design-rule limits; every key optional (see the README, "Design-rule checks")');

export type ChecksConfig = z.infer<typeof ChecksSchema>;
export type ChecksInput = z.input<typeof ChecksSchema>;

/** Rule ids, in report order. */
export const CHECK_RULES = Object.keys(ChecksSchema.shape) as (keyof ChecksConfig)[];
