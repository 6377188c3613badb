import { z } from 'zod';
import { DesignError, type DesignIssue } from './errors.js';
import { issuesFromZod, parseYamlText } from './yamlInput.js';
import { num, PARSE_ONCE } from './fields.js';

/**
 * The shop profile: how one CNC shop turns cut data into time and money. Every number carries its
 * unit in its name and its allowed range in the schema, so each error names path, value and range.
 */

const FeedBand = z
  .object({
    maxThicknessMm: num(0.1, 20, 'mm', 'this row applies to plates up to this thickness'),
    feedMmPerMin: num(10, 20000, 'mm/min', 'profiling feed rate'),
    depthPerPassMm: num(0.1, 20, 'mm', 'axial depth of cut per pass'),
  })
  .strict();

const Stock = z
  .object({
    thicknessMm: num(0.1, 20, 'mm', 'sheet thickness'),
    widthMm: num(20, 3000, 'mm', 'sheet width (x)'),
    heightMm: num(20, 3000, 'mm', 'sheet height (y)'),
    price: num(0, 1e6, 'currency', 'price of one sheet'),
  })
  .strict();

export const ShopSchema = z
  .object({
    name: z.string({ error: 'is required (the shop name)' }).min(1).max(80).describe('shop name, printed on the quote'),
    currency: z.string().regex(/^[A-Z]{3}$/, { error: 'must be a three-letter currency code such as EUR' }).describe('ISO 4217 currency code'),
    machineRatePerHour: num(0, 10000, 'currency/h', 'machine and operator rate'),
    jobSetupMin: num(0, 600, 'min', 'once per job: program, fixture, first-part check'),
    sheetSetupMin: num(0, 120, 'min', 'per sheet: load, clamp, zero, unload'),
    toolChangeMin: num(0, 60, 'min', 'per tool change'),
    toolLifeM: num(0.1, 10000, 'm', 'cut path (length × passes) one end mill lasts in carbon plate'),
    toolPrice: num(0, 10000, 'currency', 'price of one end mill'),
    toolDiameterMm: num(0.3, 12, 'mm', "end mill diameter; default: the design's cutting.toolDiameterMm").optional(),
    pierceS: num(0, 60, 's', 'per plunge into the plate (each contour, each pass)'),
    rapidMmPerMin: num(100, 100000, 'mm/min', 'rapid traverse rate'),
    nonCuttingFraction: num(0, 2, '', 'allowance for accelerations, lead-ins and lifts, as a fraction of cutting, plunge and rapid time'),
    partGapExtraMm: num(0, 50, 'mm', 'part spacing on the sheet beyond one tool diameter'),
    sheetMarginMm: num(0, 100, 'mm', 'clear border at every sheet edge'),
    marginFraction: num(0, 5, '', 'profit margin added to the cost (0.25 = 25 %)'),
    nestTurnsDeg: z
      .array(z.union([z.literal(0), z.literal(90), z.literal(180), z.literal(270)], { error: 'must be 0, 90, 180 or 270' }))
      .min(1)
      .max(4)
      .optional()
      .describe('turns from the weave-aligned position the nesting may give a part, degrees (default 0, 90, 180, 270; parts with an unbalanced weave never get 90 or 270)'),
    feeds: z.array(FeedBand).min(1).describe('feed and depth per pass by plate thickness; the thinnest band that covers a plate applies'),
    stock: z.array(Stock).min(1).describe('sheets the shop stocks, one entry per thickness'),
  })
  .strict();

export type ShopProfile = z.infer<typeof ShopSchema>;
export type FeedBand = z.infer<typeof FeedBand>;
export type StockSheet = z.infer<typeof Stock>;

/** Parse shop profile text (YAML or JSON) and validate it. Throws DesignError naming path, value and range. */
export function parseShopText(text: string, sourceName = 'shop profile'): ShopProfile {
  return validateShop(parseYamlText(text, sourceName));
}

/** Validate an already-parsed shop profile. Throws DesignError with every problem found. */
export function validateShop(raw: unknown): ShopProfile {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
    throw new DesignError([{ path: 'shop', value: raw, message: 'must be a mapping (name, currency, machineRatePerHour, feeds, stock...)' }]);
  }
  const parsed = ShopSchema.safeParse(raw, PARSE_ONCE);
  if (!parsed.success) {
    throw new DesignError(issuesFromZod(parsed.error.issues, raw, ['shop'], 'allowed keys are listed in the README (quote section)'));
  }
  const shop = parsed.data;
  const issues: DesignIssue[] = [];
  const seen = new Set<number>();
  shop.stock.forEach((s, i) => {
    if (seen.has(s.thicknessMm)) issues.push({ path: `shop.stock.${i}.thicknessMm`, value: s.thicknessMm, message: 'is listed twice; give one sheet per thickness' });
    seen.add(s.thicknessMm);
  });
  shop.feeds.forEach((f, i) => {
    if (f.depthPerPassMm > f.maxThicknessMm * 4) {
      issues.push({ path: `shop.feeds.${i}.depthPerPassMm`, value: f.depthPerPassMm, message: `is more than 4 × the band's maxThicknessMm (${f.maxThicknessMm} mm); is a value in the wrong column?` });
    }
  });
  if (issues.length) throw new DesignError(issues);
  return shop;
}


/** The feed band for a plate: the thinnest band whose maxThicknessMm covers it, or null. */
export function feedFor(shop: ShopProfile, thicknessMm: number): FeedBand | null {
  const bands = [...shop.feeds].sort((a, b) => a.maxThicknessMm - b.maxThicknessMm);
  return bands.find((b) => thicknessMm <= b.maxThicknessMm + 1e-9) ?? null;
}

/** The stocked sheet of this thickness, or null. */
export function stockFor(shop: ShopProfile, thicknessMm: number): StockSheet | null {
  return shop.stock.find((s) => Math.abs(s.thicknessMm - thicknessMm) < 1e-6) ?? null;
}
