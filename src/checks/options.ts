import type { Design } from '../params/design.js';
import { DesignError } from '../params/errors.js';
import { ChecksSchema, type ChecksConfig, type ChecksInput } from '../params/checksSchema.js';
import { EIGHTH_INCH_MM } from '../params/units.js';
import { PARSE_ONCE } from '../params/fields.js';

/** Everything the rules need besides the geometry. */
export type CheckOptions = Readonly<{
  /** Router bit diameter for the bit-reach rule. mm. */
  toolDiameterMm: number;
  /** Every rule's limits (the design's `checks` section with defaults filled in). */
  limits: ChecksConfig;
  /** Smallest adjacent prop tip gap (frame checks). mm. */
  minTipGapMm: number;
}>;

/** Default tip gap when no design gives one. mm. Common practice, no source (domain notes: keep ≥ 5–10 mm). */
export const DEFAULT_MIN_TIP_GAP_MM = 6;

/**
 * Options from loose input, validated by the design schema's `checks` section.
 * Throws DesignError naming `checks.RULE.KEY`, the value and the allowed range on bad limits.
 * @example checkOptions({ toolDiameterMm: 2, limits: { 'web-width': { minMm: 2 } } })
 */
export function checkOptions(input: { toolDiameterMm?: number; limits?: ChecksInput | unknown; minTipGapMm?: number } = {}): CheckOptions {
  const limits = parseLimits(input.limits ?? {});
  const toolDiameterMm = limits['bit-reach'].toolDiameterMm ?? input.toolDiameterMm ?? EIGHTH_INCH_MM;
  const minTipGapMm = limits['prop-clearance'].minTipGapMm ?? input.minTipGapMm ?? DEFAULT_MIN_TIP_GAP_MM;
  return { toolDiameterMm, limits, minTipGapMm };
}

/** Options for a validated design: its `checks` section, cutting tool and prop tip gap, then overrides. */
export function optionsForDesign(d: Design, overrides: Partial<CheckOptions> = {}): CheckOptions {
  // A design object assembled by hand (not through the schema) may lack the section: defaults then.
  const limits = overrides.limits ?? (d.checks as ChecksConfig | undefined) ?? parseLimits({});
  return {
    toolDiameterMm: overrides.toolDiameterMm ?? limits['bit-reach'].toolDiameterMm ?? d.cutting.toolDiameterMm,
    limits,
    minTipGapMm: overrides.minTipGapMm ?? limits['prop-clearance'].minTipGapMm ?? d.props.minTipGapMm,
  };
}

/** Validate a `checks` section. Throws DesignError (paths start with `checks.`). */
export function parseLimits(raw: unknown): ChecksConfig {
  const r = ChecksSchema.safeParse(raw, PARSE_ONCE);
  if (r.success) return r.data;
  throw new DesignError(
    r.error.issues.map((i) => {
      const path = ['checks', ...i.path.map(String)].join('.');
      if (i.code === 'unrecognized_keys') {
        const where = i.path.length === 0 ? `rule${i.keys.length > 1 ? 's' : ''}; known rules: ${Object.keys(ChecksSchema.shape).join(', ')}` : 'limit; see the README, "Design-rule checks"';
        return { path, value: i.keys, message: `unknown ${where}` };
      }
      let v: unknown = raw;
      for (const k of i.path) v = v !== null && typeof v === 'object' ? (v as Record<PropertyKey, unknown>)[k as PropertyKey] : undefined;
      return { path, value: v, message: i.message };
    }),
  );
}
