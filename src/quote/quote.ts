import { dist, transformPoint, type Part, type Vec2 } from '../geometry/index.js';
import { DesignError, type DesignIssue } from '../params/errors.js';
import { feedFor, stockFor, type ShopProfile } from '../params/shop.js';
import { partCutData, type PartCutData } from './cutData.js';
import { nestParts, type NestResult, type SheetSize } from './nest.js';
import { partTime, type PartTime } from './time.js';

export type QuoteOptions = Readonly<{
  /** Number of complete frames. */
  quantity: number;
  shop: ShopProfile;
  /** One sheet size for every thickness; default: each thickness's stocked sheet. */
  sheet?: SheetSize;
  /** End mill diameter. mm. Default: the shop's, else 3.175. */
  toolDiameterMm?: number;
  /** Stop the nesting search after this many milliseconds (needs `now`); the layout is complete either way. */
  timeLimitMs?: number;
  /** Clock for the time limit, ms (only the CLI reads the clock). */
  now?: () => number;
  onProgress?: (placed: number, total: number) => void;
}>;

export type Money = Readonly<{ machine: number; material: number; tooling: number; total: number }>;

export type PartQuote = Readonly<{
  cut: PartCutData;
  time: PartTime;
  /** Direct cost of one copy: its machine time, its area's share of its sheets, tool wear. */
  cost: Money;
}>;

export type BatchTime = Readonly<{
  cutMin: number;
  plungeMin: number;
  rapidMin: number;
  allowanceMin: number;
  setupMin: number;
  toolChangeMin: number;
  totalMin: number;
}>;

export type BatchCost = Readonly<{
  material: number;
  machine: number;
  setup: number;
  tooling: number;
  subtotal: number;
  margin: number;
  total: number;
}>;

export type SheetCost = Readonly<{ thicknessMm: number; material: string; widthMm: number; heightMm: number; sheets: number; pricePerSheet: number; cost: number }>;

export type Quote = Readonly<{
  frames: number;
  currency: string;
  shopName: string;
  toolDiameterMm: number;
  parts: readonly PartQuote[];
  nesting: NestResult;
  sheetCosts: readonly SheetCost[];
  toolChanges: number;
  batchTime: BatchTime;
  batchCost: BatchCost;
  /** Batch total divided by the number of frames (setup shared). */
  perFrame: Readonly<{ timeMin: number; cost: number; massG: number; breakdown: BatchCost }>;
  warnings: readonly string[];
}>;

/**
 * Price a batch of frames: cut data per part, nesting onto sheets, machine time and money from the
 * shop profile. Pure; the progress callback is the only side channel.
 * Material is charged by whole sheets (a shop does not sell the offcut back), shared among parts
 * by area; setup and tool changes are batch costs; the margin applies to the subtotal.
 * @throws DesignError naming the shop-profile path (or `sheet`) when a plate has no feed band or no
 * stocked sheet, or a part does not fit the sheet.
 */
export function quoteParts(parts: readonly Part[], options: QuoteOptions): Quote {
  const { shop, quantity } = options;
  if (!Number.isInteger(quantity) || quantity < 1 || quantity > 10000) {
    throw new DesignError([{ path: 'qty', value: quantity, message: 'must be a whole number of frames from 1 to 10000' }]);
  }
  const toolDiameterMm = options.toolDiameterMm ?? shop.toolDiameterMm ?? 3.175;
  const issues: DesignIssue[] = [];
  const bands = parts.map((p) => {
    const band = feedFor(shop, p.thicknessMm);
    if (!band) issues.push({ path: 'shop.feeds', value: p.thicknessMm, message: `has no band for the ${p.thicknessMm} mm ${p.name} (largest maxThicknessMm: ${Math.max(...shop.feeds.map((f) => f.maxThicknessMm))} mm)` });
    return band;
  });
  const stocks = parts.map((p) => {
    const s = stockFor(shop, p.thicknessMm);
    if (!s) issues.push({ path: 'shop.stock', value: p.thicknessMm, message: `has no ${p.thicknessMm} mm sheet for ${p.name} (stocked: ${shop.stock.map((x) => x.thicknessMm).join(', ')} mm)` });
    return s;
  });
  if (issues.length) throw new DesignError(dedupeIssues(issues));
  const warnings: string[] = [];
  const partQuotes0 = parts.map((p, i) => {
    const cut = partCutData(p, toolDiameterMm);
    if (cut.tooNarrow > 0) warnings.push(`${p.name}: ${cut.tooNarrow} contour(s) narrower than the ${toolDiameterMm} mm tool cannot be cut and are not priced`);
    const polygon = cut.contours.filter((c) => c.kind === 'profile' && c.method === 'polygon').length;
    if (polygon > 0) warnings.push(`${p.name}: ${polygon} tool path(s) overlap themselves; their length comes from a polygon offset (within 0.002 mm)`);
    return { cut, time: partTime(cut, bands[i]!, shop) };
  });
  // Each thickness is nested on its own stocked sheet, unless one sheet size is given for all.
  const thicknesses = [...new Set(parts.map((p) => p.thicknessMm))].sort((a, b) => a - b);
  const total = parts.reduce((a, p) => a + p.quantity * quantity, 0);
  let before = 0;
  const count = (ms: ReadonlyArray<{ p: Part }>) => ms.reduce((a, x) => a + x.p.quantity * quantity, 0);
  const deadline = options.timeLimitMs !== undefined && options.now ? options.now() + options.timeLimitMs : null;
  const runs = thicknesses.map((t) => {
    const members = parts.map((p, i) => ({ p, i })).filter((x) => x.p.thicknessMm === t);
    const stock = stocks[members[0].i]!;
    const sheet: SheetSize = options.sheet ?? { widthMm: stock.widthMm, heightMm: stock.heightMm };
    const offset = before;
    const result = nestWithShopPaths(members.map((x) => ({ part: x.p, count: x.p.quantity * quantity })), {
      sheet,
      spacingMm: toolDiameterMm + shop.partGapExtraMm,
      marginMm: shop.sheetMarginMm,
      ...(shop.nestTurnsDeg ? { turnsDeg: shop.nestTurnsDeg } : {}),
      // One deadline for the whole quote: each thickness gets what the earlier ones left.
      ...(deadline !== null && options.now ? { timeLimitMs: Math.max(0, deadline - options.now()), now: options.now } : {}),
      ...(options.onProgress ? { onProgress: (done: number, all: number) => options.onProgress!(offset + Math.round((done / all) * count(members)), total) } : {}),
    });
    before += count(members);
    const sheets = result.sheets.map((sh) => ({ ...sh, placements: sh.placements.map((pl) => ({ ...pl, item: members[pl.item].i })) }));
    // Material: whole sheets; a sheet of another size than stocked is priced pro rata by area.
    const pricePerSheet = (stock.price * sheet.widthMm * sheet.heightMm) / (stock.widthMm * stock.heightMm);
    const costs: SheetCost[] = result.groups.map((g) => ({ thicknessMm: g.thicknessMm, material: g.material, widthMm: sheet.widthMm, heightMm: sheet.heightMm, sheets: g.sheets, pricePerSheet, cost: pricePerSheet * g.sheets }));
    return { result: { ...result, sheets }, costs };
  });
  const nesting: NestResult = {
    sheets: runs.flatMap((r) => r.result.sheets),
    groups: runs.flatMap((r) => r.result.groups),
    spacingMm: toolDiameterMm + shop.partGapExtraMm,
    marginMm: shop.sheetMarginMm,
    timedOut: runs.some((r) => r.result.timedOut),
  };
  if (nesting.timedOut) warnings.push('nesting stopped at the time limit: the layout is complete but may use more sheets than a full search, and may differ between runs');
  const sheetCosts: SheetCost[] = runs.flatMap((r) => r.costs);
  const groupArea = new Map<number, number>();
  for (const g of nesting.groups) groupArea.set(g.thicknessMm, (groupArea.get(g.thicknessMm) ?? 0) + g.partAreaMm2);
  const groupCost = new Map<number, number>();
  for (const c of sheetCosts) groupCost.set(c.thicknessMm, (groupCost.get(c.thicknessMm) ?? 0) + c.cost);
  const rateMin = shop.machineRatePerHour / 60;
  const toolCostPerMm = shop.toolPrice / (shop.toolLifeM * 1000);
  const partQuotes: PartQuote[] = partQuotes0.map(({ cut, time }) => {
    const material = ((groupCost.get(cut.thicknessMm) ?? 0) * cut.areaMm2) / (groupArea.get(cut.thicknessMm) ?? 1);
    const machine = time.totalMin * rateMin;
    const tooling = time.cutPathMm * toolCostPerMm;
    return { cut, time, cost: { machine, material, tooling, total: machine + material + tooling } };
  });

  // Batch time: every copy's own time, travel between parts on each sheet, setups and tool changes.
  let cutMin = 0;
  let plungeMin = 0;
  let rapidMin = 0;
  let cutPathMm = 0;
  for (const q of partQuotes) {
    const copies = q.cut.quantity * quantity;
    cutMin += q.time.cutMin * copies;
    plungeMin += q.time.plungeMin * copies;
    rapidMin += q.time.rapidMin * copies;
    cutPathMm += q.time.cutPathMm * copies;
  }
  let drillChanges = 0;
  for (const sh of nesting.sheets) {
    const starts: Vec2[] = sh.placements.map((pl) => transformPoint(partQuotes[pl.item].cut.contours[partQuotes[pl.item].cut.contours.length - 1].startMm, pl.transform));
    let travel = 0;
    let at: Vec2 = [0, 0];
    for (const p of starts) {
      travel += dist(at, p);
      at = p;
    }
    travel += dist(at, [0, 0]);
    rapidMin += travel / shop.rapidMmPerMin;
    const drills = new Set<string>();
    for (const pl of sh.placements) {
      for (const c of partQuotes[pl.item].cut.contours) if (c.kind === 'drill' && Math.abs(c.diameterMm - toolDiameterMm) > 1e-9) drills.add(c.diameterMm.toFixed(3));
    }
    // To each drill size and back to the end mill, on every sheet that has small holes.
    if (drills.size) drillChanges += drills.size + 1;
  }
  const wearChanges = Math.max(0, Math.ceil(cutPathMm / (shop.toolLifeM * 1000)) - 1);
  const toolChanges = wearChanges + drillChanges;
  const allowanceMin = (cutMin + plungeMin + rapidMin) * shop.nonCuttingFraction;
  const setupMin = shop.jobSetupMin + nesting.sheets.length * shop.sheetSetupMin;
  const toolChangeMin = toolChanges * shop.toolChangeMin;
  const totalMin = cutMin + plungeMin + rapidMin + allowanceMin + setupMin + toolChangeMin;
  const batchTime: BatchTime = { cutMin, plungeMin, rapidMin, allowanceMin, setupMin, toolChangeMin, totalMin };

  const material = sheetCosts.reduce((a, c) => a + c.cost, 0);
  const machine = (cutMin + plungeMin + rapidMin + allowanceMin) * rateMin;
  const setup = (setupMin + toolChangeMin) * rateMin;
  const tooling = cutPathMm * toolCostPerMm;
  const subtotal = material + machine + setup + tooling;
  const margin = subtotal * shop.marginFraction;
  const batchCost: BatchCost = { material, machine, setup, tooling, subtotal, margin, total: subtotal + margin };
  const massG = partQuotes.reduce((a, q) => a + q.cut.massG * q.cut.quantity, 0);
  return {
    frames: quantity,
    currency: shop.currency,
    shopName: shop.name,
    toolDiameterMm,
    parts: partQuotes,
    nesting,
    sheetCosts,
    toolChanges,
    batchTime,
    batchCost,
    perFrame: {
      timeMin: totalMin / quantity,
      cost: batchCost.total / quantity,
      massG,
      breakdown: Object.fromEntries(Object.entries(batchCost).map(([k, v]) => [k, v / quantity])) as BatchCost,
    },
    warnings,
  };
}

/** nestParts with its `turnsDeg` errors named after the shop profile key they come from. */
function nestWithShopPaths(...args: Parameters<typeof nestParts>): NestResult {
  try {
    return nestParts(...args);
  } catch (e) {
    if (e instanceof DesignError) throw new DesignError(e.issues.map((i) => (i.path === 'turnsDeg' ? { ...i, path: 'shop.nestTurnsDeg' } : i)));
    throw e;
  }
}

function dedupeIssues(issues: DesignIssue[]): DesignIssue[] {
  const seen = new Set<string>();
  return issues.filter((i) => {
    const k = `${i.path}|${String(i.value)}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
