import type { Material, ScrewSize } from './types.js';
import { DesignError, type DesignIssue } from './errors.js';
import { DesignSchema, SEPARATE_ONLY_ARM_KEYS, type DesignParsed } from './schema.js';
import { cuttableSlotWidthMm, edgeDistanceMm, motorBellMm, motorBoreMm, STRAP_SLOT_MIN_MM, tipPadMarginMm } from './derived.js';
import { clearanceHoleMm } from './screws.js';
import { issuesFromZod, parseYamlText } from './yamlInput.js';
import { typicalMotorMassG } from './motorTable.js';
import { parseLengthMm } from './units.js';
import { PARSE_ONCE } from './fields.js';

/** Camera widths by size class, mm (common practice, no source). */
export const CAMERA_WIDTH_MM = { nano: 14, micro: 19, mini: 21.5 } as const;

type ParsedArms = DesignParsed['arms'];
type ParsedRoot = Extract<ParsedArms, { construction: 'separate' }>['root'];
/** Separate arm plates, with their derived defaults filled in. */
export type SeparateArms = Readonly<Omit<Extract<ParsedArms, { construction: 'separate' }>, 'root' | 'tipPadMarginMm'> & { root: Readonly<ParsedRoot & { edgeMarginMm: number }>; tipPadMarginMm: number }>;
/** Arms cut in one piece with the bottom plate (its thickness, material and weave). */
export type UnibodyArms = Readonly<Omit<Extract<ParsedArms, { construction: 'unibody' }>, 'tipPadMarginMm'> & { tipPadMarginMm: number }>;
export type Arms = SeparateArms | UnibodyArms;
type ParsedTop = DesignParsed['topPlate'];

/** A validated design with every unit resolved to mm, every reference resolved and every derived default filled in. */
export type Design = Readonly<
  Omit<DesignParsed, 'props' | 'camera' | 'arms' | 'motor' | 'topPlate'> & {
    props: DesignParsed['props'] & { diameterMm: number };
    arms: Arms;
    motor: Readonly<DesignParsed['motor'] & { boreMm: number; bellDiameterMm: number }>;
    topPlate: Readonly<Omit<ParsedTop, 'strapSlots'> & { strapSlots: Readonly<ParsedTop['strapSlots'] & { slotWidthMm: number }> }>;
    camera?: NonNullable<DesignParsed['camera']> & { cameraWidthMm: number; tiltSlotWidthMm: number };
    materialFor: (name: string | undefined) => Material;
    /** motor.massG, or the typical mass for the motor's bell when the design gives none. g. */
    motorMassG: number;
    stackBoltSizes: readonly (readonly ScrewSize[])[];
  }
>;

/** Parse design text (YAML or JSON, by content) and validate it. Throws DesignError. */
export function parseDesignText(text: string, sourceName = 'design'): Design {
  return validateDesign(parseYamlText(text, sourceName));
}

/** Validate an already-parsed design object. Throws DesignError with every problem found. */
export function validateDesign(raw: unknown): Design {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
    throw new DesignError([{ path: '', value: raw, message: 'must be a mapping of design sections (name, layout, props, motor, arms, body...)' }]);
  }
  const misplaced = constructionIssues(raw as Record<string, unknown>);
  const parsed = DesignSchema.safeParse(raw, PARSE_ONCE);
  if (!parsed.success) {
    // Keys refused for the construction get their own message instead of "unknown key".
    const zodIssues = issuesFromZod(parsed.error.issues, raw).filter((i) => !(i.path === 'arms' && misplaced.length && Array.isArray(i.value) && i.value.every((k) => String(k) in SEPARATE_ONLY_ARM_KEYS)));
    throw new DesignError([...misplaced, ...zodIssues]);
  }
  if (misplaced.length) throw new DesignError(misplaced);
  return resolve(parsed.data);
}

/** Separate-arm keys given for unibody arms: refused with the reason, not ignored. */
function constructionIssues(raw: Record<string, unknown>): DesignIssue[] {
  const arms = raw.arms;
  if (arms === null || typeof arms !== 'object' || (arms as Record<string, unknown>).construction !== 'unibody') return [];
  return Object.entries(SEPARATE_ONLY_ARM_KEYS)
    .filter(([k]) => k in (arms as Record<string, unknown>))
    .map(([k, why]) => ({ path: `arms.${k}`, value: (arms as Record<string, unknown>)[k], message: `does not apply to unibody arms (${why}); remove it` }));
}

function resolve(d: DesignParsed): Design {
  const issues: DesignIssue[] = [];
  const diameterMm = parseLengthMm(d.props.diameter);
  if (diameterMm === null || diameterMm < 25 || diameterMm > 600) {
    issues.push({ path: 'props.diameter', value: d.props.diameter, message: 'must be a length from 25 to 600 mm (1 to 23.6 in)' });
  }
  const materialNames = Object.keys(d.materials);
  if (materialNames.length === 0) issues.push({ path: 'materials', value: d.materials, message: 'must name at least one material' });
  const sections: Array<[string, { material?: string } | undefined]> = [
    ['arms', d.arms.construction === 'separate' ? d.arms : undefined],
    ['body', d.body],
    ['topPlate', d.topPlate],
    ['braces', d.braces],
    ['camera', d.camera],
  ];
  for (const [path, sec] of sections) {
    if (sec?.material !== undefined && !(sec.material in d.materials)) {
      issues.push({ path: `${path}.material`, value: sec.material, message: `is not in materials (${materialNames.join(', ')})` });
    }
  }
  if (d.arms.style !== 'truss' && d.arms.widthMm === undefined) {
    issues.push({ path: 'arms.widthMm', value: undefined, message: `is required for ${d.arms.style} arms (4 to 60 mm)` });
  }
  if (d.arms.style === 'truss' && d.arms.widthMm !== undefined) {
    issues.push({ path: 'arms.widthMm', value: d.arms.widthMm, message: 'applies to straight and tapered arms; a truss arm takes its widths from arms.truss (remove arms.widthMm)' });
  }
  if (d.arms.style === 'tapered' && d.arms.tipWidthMm === undefined) {
    issues.push({ path: 'arms.tipWidthMm', value: undefined, message: 'is required for tapered arms (4 to 60 mm)' });
  }
  if (d.arms.style === 'truss' && d.arms.truss === undefined) {
    issues.push({ path: 'arms.truss', value: undefined, message: 'is required for truss arms (mainWidthMm, secondaryWidthMm, meetFraction, spreadMm)' });
  }
  if (d.motor.slotted && d.motor.boltCircleMm.length !== 2) {
    issues.push({ path: 'motor.slotted', value: true, message: 'needs two bolt circles in motor.boltCircleMm (e.g. [16, 19])' });
  }
  if (d.braces && d.arms.construction === 'unibody') {
    issues.push({ path: 'braces', value: 'present', message: 'apply to separate arms only; remove it for a unibody frame' });
  }
  if (d.layout.kind === 'h') {
    for (const key of ['frontArmStartMm', 'rearArmStartMm'] as const) {
      const p = d.layout[key];
      if (Math.abs(p[0]) > d.body.lengthMm / 2 || Math.abs(p[1]) > d.body.widthMm / 2) {
        issues.push({ path: `layout.${key}`, value: p, message: `must lie on the body (|x| ≤ ${d.body.lengthMm / 2} mm, |y| ≤ ${d.body.widthMm / 2} mm: half of body.lengthMm and body.widthMm)` });
      }
    }
  }
  if (d.camera && d.camera.uptiltMinDeg >= d.camera.uptiltMaxDeg) {
    issues.push({ path: 'camera.uptiltMaxDeg', value: d.camera.uptiltMaxDeg, message: `must be above camera.uptiltMinDeg (${d.camera.uptiltMinDeg})` });
  }
  issues.push(...assemblyIssues(d));
  const stackBoltSizes = d.stacks.map((s, i) => {
    const sizes = Array.isArray(s.boltSize) ? s.boltSize : s.patternsMm.map(() => s.boltSize as ScrewSize);
    if (sizes.length !== s.patternsMm.length) {
      issues.push({ path: `stacks.${i}.boltSize`, value: s.boltSize, message: `must give one size per pattern (${s.patternsMm.length})` });
    }
    return sizes;
  });
  if (issues.length) throw new DesignError(issues);

  const materialFor = (name: string | undefined): Material => {
    const key = name ?? materialNames[0];
    return { name: key, ...d.materials[key] };
  };
  const series = d.cutting.holeSeries;
  const tool = d.cutting.toolDiameterMm;
  const armPlateMm = d.arms.construction === 'separate' ? d.arms.thicknessMm : d.body.thicknessMm;
  const motor = {
    ...d.motor,
    boreMm: d.motor.boreMm ?? motorBoreMm(d.motor.boltCircleMm, d.motor.boltSize, series, d.checks, armPlateMm),
    bellDiameterMm: d.motor.bellDiameterMm ?? motorBellMm(d.motor.boltCircleMm, d.motor.boltSize),
  };
  const tipPad = d.arms.tipPadMarginMm ?? tipPadMarginMm(d.motor.boltSize, series, d.checks);
  const arms: Arms =
    d.arms.construction === 'separate'
      ? { ...d.arms, tipPadMarginMm: tipPad, root: { ...d.arms.root, edgeMarginMm: d.arms.root.edgeMarginMm ?? edgeDistanceMm(d.arms.root.boltSize, series, d.checks) } }
      : { ...d.arms, tipPadMarginMm: tipPad };
  const topPlate = { ...d.topPlate, strapSlots: { ...d.topPlate.strapSlots, slotWidthMm: d.topPlate.strapSlots.slotWidthMm ?? cuttableSlotWidthMm(STRAP_SLOT_MIN_MM, tool) } };
  const camera = d.camera
    ? {
        ...d.camera,
        cameraWidthMm: typeof d.camera.widthMm === 'number' ? d.camera.widthMm : CAMERA_WIDTH_MM[d.camera.widthMm],
        tiltSlotWidthMm: d.camera.tiltSlotWidthMm ?? cuttableSlotWidthMm(clearanceHoleMm(d.camera.pivotBoltSize, series), tool),
      }
    : undefined;
  const motorMassG = d.motor.massG ?? typicalMotorMassG(motor.bellDiameterMm);
  return { ...d, props: { ...d.props, diameterMm: diameterMm as number }, arms, motor, topPlate, camera, materialFor, stackBoltSizes, motorMassG };
}

/** Largest bulk density of a flight battery pack, g/cm³ (lithium-polymer packs are ≈ 1.8–2.4; common practice, no source). */
export const MAX_BATTERY_DENSITY_G_PER_CM3 = 3;

/** Cross-field rules of the motor, props and components sections (references and plausibility). */
function assemblyIssues(d: DesignParsed): DesignIssue[] {
  const issues: DesignIssue[] = [];
  const propBandLowMm = d.props.heightAboveArmMm - d.props.bandMm / 2;
  if (d.motor.heightMm !== undefined && d.motor.heightMm > propBandLowMm) {
    issues.push({ path: 'motor.heightMm', value: d.motor.heightMm, message: `reaches into the prop band, which starts ${propBandLowMm} mm above the arm (props.heightAboveArmMm − props.bandMm / 2); raise props.heightAboveArmMm or lower the motor height` });
  }
  if ((d.motor.kv === undefined) !== (d.motor.supplyVoltageV === undefined)) {
    const [given, missing] = d.motor.kv === undefined ? ['motor.supplyVoltageV', 'motor.kv'] : ['motor.kv', 'motor.supplyVoltageV'];
    issues.push({ path: missing, value: undefined, message: `is required with ${given}: the top rotation speed is kv × voltage (or give neither, and props.maxTipSpeedMps or its default sets it)` });
  }
  if (d.motor.heightMm === undefined && propBandLowMm < 3) {
    issues.push({ path: 'props.heightAboveArmMm', value: d.props.heightAboveArmMm, message: `leaves ${propBandLowMm} mm under the prop band for the motor (at least 3 mm); raise it or give motor.heightMm` });
  }
  d.components.forEach((c, i) => {
    const at = `components.${i}`;
    const stackIndex = c.kind === 'stack' || ((c.kind === 'video-transmitter' || c.kind === 'receiver') && c.on === 'stack') ? c.stack : null;
    if (stackIndex !== null && stackIndex >= d.stacks.length) {
      issues.push({ path: `${at}.stack`, value: stackIndex, message: d.stacks.length ? `names no stack mount (stacks has ${d.stacks.length}: 0 to ${d.stacks.length - 1})` : 'names a stack mount, but the design has no `stacks`' });
    }
    if (c.kind === 'stack' && c.patternMm !== undefined && stackIndex !== null && stackIndex < d.stacks.length && !d.stacks[stackIndex].patternsMm.some((p) => Math.abs(p - c.patternMm!) < 1e-9)) {
      issues.push({ path: `${at}.patternMm`, value: c.patternMm, message: `is not a pattern of stack mount ${stackIndex} (${d.stacks[stackIndex].patternsMm.join(', ')} mm)` });
    }
    if ((c.kind === 'video-transmitter' || c.kind === 'receiver') && c.on !== 'stack' && c.softMountNPerMm !== undefined) {
      issues.push({ path: `${at}.softMountNPerMm`, value: c.softMountNPerMm, message: `needs screws to ride on: soft mounts are for boards on a stack (on: stack), this one is on ${c.on}` });
    }
    if ((c.kind === 'video-transmitter' || c.kind === 'receiver') && c.on !== 'stack' && c.atMm === undefined) {
      issues.push({ path: `${at}.atMm`, value: undefined, message: `is required when on is ${c.on} (the centre in plan, mm)` });
    }
    if (c.kind === 'camera' && !d.camera) {
      issues.push({ path: `${at}.kind`, value: 'camera', message: 'needs a `camera` section (side plates, pivot and tilt range)' });
    }
    if (c.kind === 'battery') {
      const volumeCm3 = (c.sizeMm[0] * c.sizeMm[1] * c.sizeMm[2]) / 1000;
      const density = c.massG / volumeCm3;
      if (density > MAX_BATTERY_DENSITY_G_PER_CM3) {
        issues.push({ path: `${at}.massG`, value: c.massG, message: `is heavier than a battery of ${c.sizeMm.join(' × ')} mm can be: ${density.toFixed(2)} g/cm³, above ${MAX_BATTERY_DENSITY_G_PER_CM3} g/cm³ (at most ${Math.floor(volumeCm3 * MAX_BATTERY_DENSITY_G_PER_CM3)} g)` });
      }
    }
  });
  const kinds = (k: string) => d.components.filter((c) => c.kind === k).length;
  for (const k of ['battery', 'camera']) {
    if (kinds(k) > 1) issues.push({ path: 'components', value: `${kinds(k)} × ${k}`, message: `takes at most one ${k}` });
  }
  return issues;
}
