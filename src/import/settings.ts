import { z } from 'zod';
import type { Material } from '../geometry/part.js';
import { DesignError, formatIssue, type DesignIssue } from '../params/errors.js';
import { parseYamlText } from '../params/yamlInput.js';
import { MaterialSchema } from '../params/schema.js';
import { DxfReadError } from './errors.js';
import { DRAWING_UNITS, parseDrawingUnit, type DrawingUnit } from './units.js';
import { PARSE_ONCE } from '../params/fields.js';

/**
 * Woven 0/90 carbon/epoxy, the editable default of the design files (E 65 GPa, G12 4 GPa,
 * ν12 0.07, ρ 1.57 g/cm³; reference-values.md "Woven carbon/epoxy plate, typical").
 */
export const DEFAULT_IMPORT_MATERIAL: Material = { name: 'woven-cf', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 };

/** Allowed ranges, shared by flags and sidecar so both give the same message. */
const RANGES = {
  thicknessMm: [0.1, 20, 'mm', 'plate thickness'],
  toolDiameterMm: [0.3, 12, 'mm', 'end mill diameter'],
  gapToleranceMm: [0.00001, 1, 'mm', 'largest gap between entity ends that still joins them'],
  weaveDeg: [-90, 90, 'deg', "angle of the sheet's 0° fibre direction"],
} as const;

const ranged = (key: keyof typeof RANGES) => {
  const [min, max, unit, what] = RANGES[key];
  return z
    .number({ error: `must be a number (${unit}), ${min} to ${max}` })
    .min(min, { error: `is below the allowed range ${min} to ${max} ${unit}` })
    .max(max, { error: `is above the allowed range ${min} to ${max} ${unit}` })
    .describe(`${what} [${unit}, ${min} to ${max}]`);
};

/**
 * The sidecar file beside a DXF (`part.dxf` → `part.dxf.yaml`): what the drawing cannot say.
 * Every key is optional; command-line flags win over it.
 */
export const SidecarSchema = z
  .object({
    thicknessMm: ranged('thicknessMm').optional(),
    material: z.string().min(1).optional().describe('material name: woven-cf or an entry of materials'),
    materials: z.record(z.string(), MaterialSchema).optional().describe('named woven 0/90 laminates, as in design files'),
    weaveDeg: ranged('weaveDeg').optional(),
    toolDiameterMm: ranged('toolDiameterMm').optional(),
    units: z.enum(DRAWING_UNITS, { error: `must be one of ${DRAWING_UNITS.join(', ')}` }).optional().describe('drawing units, overriding $INSUNITS'),
    layers: z.array(z.string().min(1)).min(1).optional().describe('the layers that hold cut geometry'),
    gapToleranceMm: ranged('gapToleranceMm').optional(),
  })
  .strict();

export type Sidecar = z.infer<typeof SidecarSchema>;

/** Parse and validate sidecar YAML; throws DxfReadError listing every problem with its path, value and range. */
export function parseSidecarText(text: string, sourceName: string): Sidecar {
  let raw: unknown;
  try {
    raw = parseYamlText(text, sourceName);
  } catch (e) {
    if (!(e instanceof DesignError)) throw e;
    throw new DxfReadError(e.issues.map((i) => (i.path ? formatIssue(i) : `${sourceName} ${i.message}`)).join('\n'));
  }
  if (raw === null || raw === undefined) return {};
  const r = SidecarSchema.safeParse(raw, PARSE_ONCE);
  if (r.success) return r.data;
  const issues: DesignIssue[] = r.error.issues.map((i) => {
    const path = i.path.map(String).join('.');
    let v: unknown = raw;
    for (const k of i.path) v = v !== null && typeof v === 'object' ? (v as Record<PropertyKey, unknown>)[k as PropertyKey] : undefined;
    if (i.code === 'unrecognized_keys') return { path, value: i.keys, message: `unknown key${i.keys.length > 1 ? 's' : ''}; allowed: ${Object.keys(SidecarSchema.shape).join(', ')}` };
    return { path, value: v, message: i.message };
  });
  throw new DxfReadError(`${sourceName} has ${issues.length === 1 ? 'a problem' : `${issues.length} problems`}:\n${issues.map(formatIssue).join('\n')}`);
}

/** Command-line values as typed (strings), before validation. */
export type ImportFlags = Readonly<{ thickness?: string; material?: string; tool?: string; units?: string; layers?: string }>;

/** Settings for one import, after flags and sidecar are merged (flags win). */
export type ImportSettings = Readonly<{
  thicknessMm?: number;
  material: Material;
  weaveRad: number;
  toolDiameterMm?: number;
  units?: DrawingUnit;
  layers?: readonly string[];
  gapTolMm?: number;
}>;

/**
 * Merge flags over the sidecar and validate both. Throws DxfReadError naming the flag or key, the
 * value and the allowed range.
 */
export function resolveImportSettings(flags: ImportFlags, sidecar: Sidecar = {}): ImportSettings {
  const problems: string[] = [];
  const number = (flag: string, key: keyof typeof RANGES, text: string | undefined): number | undefined => {
    if (text === undefined) return undefined;
    const v = Number(text);
    const [min, max, unit] = RANGES[key];
    if (text.trim() === '' || !Number.isFinite(v)) problems.push(`${flag}: ${JSON.stringify(text)} must be a number (${unit}), ${min} to ${max}`);
    else if (v < min || v > max) problems.push(`${flag}: ${v} is outside the allowed range ${min} to ${max} ${unit}`);
    else return v;
    return undefined;
  };
  const thicknessMm = number('--thickness', 'thicknessMm', flags.thickness) ?? sidecar.thicknessMm;
  const toolDiameterMm = number('--tool', 'toolDiameterMm', flags.tool) ?? sidecar.toolDiameterMm;
  let units: DrawingUnit | undefined = sidecar.units;
  if (flags.units !== undefined) {
    const u = parseDrawingUnit(flags.units);
    if (u) units = u;
    else problems.push(`--units: ${JSON.stringify(flags.units)} must be one of ${DRAWING_UNITS.join(', ')}`);
  }
  let layers = sidecar.layers;
  if (flags.layers !== undefined) {
    const l = flags.layers.split(',').map((s) => s.trim()).filter(Boolean);
    if (l.length) layers = l;
    else problems.push(`--layers: ${JSON.stringify(flags.layers)} must name at least one layer (comma-separated)`);
  }
  const materialName = flags.material ?? sidecar.material;
  const known: Record<string, Omit<Material, 'name'>> = { [DEFAULT_IMPORT_MATERIAL.name]: DEFAULT_IMPORT_MATERIAL, ...(sidecar.materials ?? {}) };
  let material = DEFAULT_IMPORT_MATERIAL;
  if (materialName !== undefined) {
    const m = known[materialName];
    if (m) material = { ...m, name: materialName };
    else problems.push(`${flags.material !== undefined ? '--material' : 'material'}: ${JSON.stringify(materialName)} is not defined (known: ${Object.keys(known).join(', ')}); define it under materials in the sidecar file`);
  } else if (sidecar.materials && Object.keys(sidecar.materials).length) {
    const [name, m] = Object.entries(sidecar.materials)[0];
    material = { ...m, name };
  }
  if (problems.length) throw new DxfReadError(problems.join('\n'));
  return {
    ...(thicknessMm !== undefined ? { thicknessMm } : {}),
    material,
    weaveRad: ((sidecar.weaveDeg ?? 0) * Math.PI) / 180,
    ...(toolDiameterMm !== undefined ? { toolDiameterMm } : {}),
    ...(units !== undefined ? { units } : {}),
    ...(layers !== undefined ? { layers } : {}),
    ...(sidecar.gapToleranceMm !== undefined ? { gapTolMm: sidecar.gapToleranceMm } : {}),
  };
}
