import { describe, expect, it } from 'vitest';
import { dist, transformPoint } from '../../src/geometry/index.js';
import { DesignError, formatIssue } from '../../src/params/errors.js';
import { feedFor, parseShopText, stockFor, validateShop, type ShopProfile } from '../../src/params/shop.js';
import { passesFor, quoteParts } from '../../src/quote/index.js';
import { exampleShop, plate, polygon, roundHole } from './fixtures.js';

/**
 * Feed from reference-values.md "Cutting and cost" (a cutting-tool maker's composite catalogue):
 * carbide end mill, Vc 150 m/min, 0.060 mm/rev, 3 mm tool → rpm = 1000·150/(π·3) = 15 915,
 * feed = 0.060 × 15 915 = 955 mm/min. Depth per pass ≈ 1 D = 3 mm.
 */
const rpm = (1000 * 150) / (Math.PI * 3);
const FEED = Math.round(0.06 * rpm);

const SHOP: ShopProfile = validateShop({
  name: 'Test shop',
  currency: 'EUR',
  machineRatePerHour: 90,
  jobSetupMin: 20,
  sheetSetupMin: 6,
  toolChangeMin: 3,
  toolLifeM: 60,
  toolPrice: 18,
  pierceS: 2,
  rapidMmPerMin: 8000,
  nonCuttingFraction: 0.2,
  partGapExtraMm: 2,
  sheetMarginMm: 10,
  marginFraction: 0.25,
  feeds: [{ maxThicknessMm: 6, feedMmPerMin: FEED, depthPerPassMm: 3 }],
  stock: [{ thicknessMm: 5, widthMm: 400, heightMm: 300, price: 90 }],
});

describe('time and price, hand-worked example', () => {
  // One frame of one part: a 100 × 50 mm rectangle (sharp corners) in 5 mm plate with a Ø10 hole at its
  // centre, cut with a 3 mm end mill (r = 1.5).
  const part = plate('block', polygon([[0, 0], [100, 0], [100, 50], [0, 50]]), [roundHole([50, 25], 10)], 5);
  const q = quoteParts([part], { quantity: 1, shop: SHOP, toolDiameterMm: 3 });
  const p = q.parts[0];

  it('the 5 mm part is cut at the catalogue feed, 955 mm/min (15 915 rpm × 0.060 mm/rev)', () => {
    // reference-values.md "Cutting and cost": 15,915 rpm, 955 mm/min for a 3 mm tool at Vc 150 m/min
    expect(rpm).toBeCloseTo(15915, 0);
    expect(feedFor(SHOP, part.thicknessMm)?.feedMmPerMin).toBe(955);
    expect((p.cut.toolPathMm * 2) / 955).toBeCloseTo(p.time.cutMin, 9);
  });

  it('per part: path, passes, plunges, rapids, allowance', () => {
    // outline: 2(100 + 50) + 2π·1.5 = 309.42478; hole: 2π(5 − 1.5) = 21.99115; sum 331.41593 mm
    expect(p.cut.toolPathMm).toBeCloseTo(331.41593, 5);
    // passes = ceil(5 / 3) = 2 → cut path 662.83185 mm → 662.83185 / 955 = 0.694065 min
    expect(p.time.passes).toBe(2);
    expect(p.time.cutPathMm).toBeCloseTo(662.83185, 5);
    expect(p.time.cutMin).toBeCloseTo(0.694065, 6);
    // 2 contours × 2 passes = 4 plunges × 2 s = 8 s = 0.133333 min
    expect(p.time.plunges).toBe(4);
    expect(p.time.plungeMin).toBeCloseTo(0.133333, 6);
    // rapids: outline start (0, −1.5) → hole start (53.5, 25) → back: 2·√(53.5² + 26.5²) = 119.40687 mm
    expect(p.time.rapidMm).toBeCloseTo(119.40687, 5);
    expect(p.time.rapidMin).toBeCloseTo(0.0149259, 7);
    // allowance 20 % of (0.694065 + 0.133333 + 0.014926) = 0.168465; total 1.010789 min
    expect(p.time.allowanceMin).toBeCloseTo(0.168465, 6);
    expect(p.time.totalMin).toBeCloseTo(1.010789, 6);
    // machine 1.010789 min × 90/60 = 1.516183; tool wear 662.83185 / 60 000 × 18 = 0.198850; material: the one sheet, 90
    expect(p.cost.machine).toBeCloseTo(1.516183, 6);
    expect(p.cost.tooling).toBeCloseTo(0.19885, 6);
    expect(p.cost.material).toBeCloseTo(90, 9);
  });

  it('batch: sheet travel, setup, margin', () => {
    const pl = q.nesting.sheets[0].placements[0];
    const start = transformPoint([0, -1.5], pl.transform);
    const travel = 2 * dist([0, 0], start); // machine origin → the part → origin
    const rapidMin = 0.0149259 + travel / 8000;
    const running = 0.694065 + 0.133333 + rapidMin;
    const allowance = 0.2 * running;
    expect(q.batchTime.rapidMin).toBeCloseTo(rapidMin, 6);
    expect(q.batchTime.allowanceMin).toBeCloseTo(allowance, 6);
    // setup: 20 min per job + 6 min per sheet; no tool change (663 mm ≪ 60 m tool life, no small holes)
    expect(q.batchTime.setupMin).toBe(26);
    expect(q.toolChanges).toBe(0);
    expect(q.batchTime.totalMin).toBeCloseTo(running + allowance + 26, 5);
    const machine = (running + allowance) * 1.5;
    const subtotal = 90 + machine + 26 * 1.5 + 0.19885;
    expect(q.batchCost.machine).toBeCloseTo(machine, 5);
    expect(q.batchCost.setup).toBeCloseTo(39, 9);
    expect(q.batchCost.subtotal).toBeCloseTo(subtotal, 5);
    expect(q.batchCost.margin).toBeCloseTo(0.25 * subtotal, 5);
    expect(q.batchCost.total).toBeCloseTo(1.25 * subtotal, 5);
    expect(q.perFrame.cost).toBeCloseTo(1.25 * subtotal, 5);
    expect(q.currency).toBe('EUR');
  });

  it('scales: 10 frames share one setup; material by whole sheets', () => {
    const q10 = quoteParts([part], { quantity: 10, shop: SHOP, toolDiameterMm: 3 });
    expect(q10.nesting.sheets).toHaveLength(1); // 10 × (103 × 53) mm fit a 380 × 280 mm usable area
    expect(q10.batchCost.material).toBe(90);
    expect(q10.batchTime.cutMin).toBeCloseTo(10 * 0.694065, 5);
    expect(q10.batchTime.setupMin).toBe(26);
    expect(q10.perFrame.cost).toBeLessThan(q.perFrame.cost / 3);
    // Per frame: the batch breakdown shared over 10 frames (setup 26 min × 1.5 / 10 = 3.9).
    expect(q10.perFrame.breakdown.setup).toBeCloseTo(3.9, 9);
    expect(q10.perFrame.breakdown.material).toBeCloseTo(9, 9);
    const b = q10.perFrame.breakdown;
    expect(b.material + b.machine + b.setup + b.tooling + b.margin).toBeCloseTo(q10.perFrame.cost, 9);
  });

  it('a sheet size other than the stocked one is priced pro rata by area', () => {
    // 600 × 450 is 2.25 × the stocked 400 × 300 sheet: 2.25 × 90 = 202.5 per sheet.
    const big = quoteParts([part], { quantity: 1, shop: SHOP, toolDiameterMm: 3, sheet: { widthMm: 600, heightMm: 450 } });
    expect(big.sheetCosts[0].pricePerSheet).toBeCloseTo(202.5, 9);
    expect(big.sheetCosts[0].widthMm).toBe(600);
    expect(big.batchCost.material).toBeCloseTo(202.5, 9);
  });

  it('passes: a plate exactly n depths thick takes n passes', () => {
    expect(passesFor(3, { maxThicknessMm: 6, feedMmPerMin: 955, depthPerPassMm: 3 })).toBe(1);
    expect(passesFor(3.01, { maxThicknessMm: 6, feedMmPerMin: 955, depthPerPassMm: 3 })).toBe(2);
    expect(passesFor(6, { maxThicknessMm: 6, feedMmPerMin: 955, depthPerPassMm: 1.5 })).toBe(4);
  });
});

describe('shop profile validation', () => {
  it('accepts the example profile', () => {
    const s = exampleShop();
    expect(s.name).toBe('Hollin Row Routing');
    expect(s.feeds.length).toBeGreaterThan(0);
  });

  it('picks the thinnest feed band that covers a plate, and the stocked sheet of its thickness', () => {
    const s = exampleShop(); // bands up to 2, 3 and 6 mm
    expect(feedFor(s, 2)?.maxThicknessMm).toBe(2);
    expect(feedFor(s, 2.5)?.maxThicknessMm).toBe(3);
    expect(feedFor(s, 5)?.feedMmPerMin).toBe(764);
    expect(feedFor(s, 6.5)).toBeNull();
    expect(stockFor(s, 2.5)?.price).toBe(46);
    expect(stockFor(s, 2.4)).toBeNull();
  });

  it('names path, value and range', () => {
    const bad = { ...exampleShop(), machineRatePerHour: -5, currency: 'euro' };
    try {
      validateShop(bad);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DesignError);
      const lines = (e as DesignError).issues.map(formatIssue);
      expect(lines).toContain('shop.machineRatePerHour: -5 is below the allowed range 0 to 10000 currency/h');
      expect(lines.some((l) => l.startsWith('shop.currency: "euro"'))).toBe(true);
    }
  });

  it('rejects unknown keys, bad YAML and a thickness stocked twice', () => {
    expect(() => validateShop({ ...exampleShop(), speed: 3 })).toThrow(/shop: \["speed"\] unknown key/);
    expect(() => parseShopText('name: [unclosed')).toThrow(/not valid YAML/);
    const twice = exampleShop();
    expect(() => validateShop({ ...twice, stock: [...twice.stock, twice.stock[0]] })).toThrow(/shop\.stock\.\d+\.thicknessMm: .* listed twice/);
  });

  it('a plate with no feed band or no stocked sheet is an input error naming the shop path', () => {
    const thick = plate('slab', polygon([[0, 0], [50, 0], [50, 50], [0, 50]]), [], 8);
    expect(() => quoteParts([thick], { quantity: 1, shop: SHOP })).toThrow(/shop\.feeds: 8 has no band/);
    const odd = plate('odd', polygon([[0, 0], [50, 0], [50, 50], [0, 50]]), [], 4);
    expect(() => quoteParts([odd], { quantity: 1, shop: SHOP })).toThrow(/shop\.stock: 4 has no 4 mm sheet/);
    expect(() => quoteParts([odd], { quantity: 0, shop: SHOP })).toThrow(/qty: 0 must be a whole number/);
  });
});
