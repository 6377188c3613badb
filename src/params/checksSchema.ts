import { z } from 'zod';

/**
 * The design file's `checks:` section: one entry per design rule, named by the rule id that its
 * findings carry, each limit with its unit, range, default and source. Every entry and key is
 * optional; `framewright check --limit RULE.KEY=VALUE` sets the same keys from the command line.
 */

const num = (min: number, max: number, unit: string, what: string) =>
  z
    .number({ error: `must be a number (${unit || 'ratio'}), ${min} to ${max}` })
    .min(min, { error: `is below the allowed range ${min} to ${max}${unit ? ` ${unit}` : ''}` })
    .max(max, { error: `is above the allowed range ${min} to ${max}${unit ? ` ${unit}` : ''}` })
    .describe(`${what} [${unit || 'ratio'}, ${min} to ${max}]`);

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
    minPartClearanceMm: num(0, 50, 'mm', 'smallest plan-view gap between a prop disc and a standoff or plate that reaches the prop plane').default(3),
    // Common practice, no source.
    maxVerticalGapMm: num(0, 100, 'mm', 'warn about a plate under or over a prop disc only when it is closer than this to the prop plane').default(10),
    // Common practice, no source: M3 aluminium standoffs are about 5 mm across.
    standoffDiameterMm: num(2, 15, 'mm', 'outside diameter of the standoffs').default(5),
  })
  .strict();

const cameraView = z
  .object({
    enabled,
    horizontalFovDeg: num(30, 179, 'deg', 'horizontal field of view (default: camera.horizontalFovDeg)').optional(),
    verticalFovDeg: num(20, 179, 'deg', 'vertical field of view (default: camera.verticalFovDeg)').optional(),
  })
  .strict();

export const ChecksSchema = z
  .object({
    'web-width': webWidth.prefault({}).describe('narrowest material between contours and inside one contour'),
    'hole-edge-distance': holeEdge.prefault({}).describe('bolt hole centre to free edge (e/D) and bolt pitch'),
    'bit-reach': bitReach.prefault({}).describe('inside corners, gaps and holes against the router bit'),
    'weave-direction': weave.prefault({}).describe('strut direction against the weave, Ex(θ) by laminate theory'),
    'hole-stress': holeStress.prefault({}).describe('stress concentration at bolt holes in struts (information)'),
    'prop-clearance': propClearance.prefault({}).describe('prop tip gaps and prop discs against plates and standoffs'),
    'camera-view': cameraView.prefault({}).describe('prop discs inside the camera view'),
  })
  .strict()
  .describe('design-rule limits; every key optional (see the README, "Design-rule checks")');

export type ChecksConfig = z.infer<typeof ChecksSchema>;
export type ChecksInput = z.input<typeof ChecksSchema>;

/** Rule ids, in report order. */
export const CHECK_RULES = Object.keys(ChecksSchema.shape) as (keyof ChecksConfig)[];
