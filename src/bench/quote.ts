import { readFileSync } from 'node:fs';
import { buildFrame } from '../geometry/index.js';
import { parseDesignText } from '../params/index.js';
import { parseShopText } from '../params/shop.js';
import { nestParts, quoteParts, type NestResult, type Quote } from '../quote/index.js';
import type { BenchCase } from './types.js';

const read = (rel: string): string => readFileSync(new URL(`../../designs/${rel}`, import.meta.url), 'utf8');

/** "2 mm: 3 sheets (bound 1.47, 49 %)" per thickness, then the whole batch. */
function utilisationNote(r: NestResult): string {
  const groups = r.groups.map((g) => `${g.thicknessMm} mm ${g.sheets} sh (bound ${g.lowerBoundSheets}, ${g.boundSheets.toFixed(2)}) ${(g.utilisation * 100).toFixed(0)} %`);
  const area = r.groups.reduce((a, g) => a + g.partAreaMm2, 0);
  const sheets = r.groups.reduce((a, g) => a + g.sheets, 0);
  const sheetArea = r.sheets[0].widthMm * r.sheets[0].heightMm;
  return `${groups.join('; ')}; all: ${sheets} sheets vs area bound ${(area / sheetArea).toFixed(2)} (${((area / (sheets * sheetArea)) * 100).toFixed(1)} % used)`;
}

const nestCase = (design: string, frames: number, budgetMs: number, target: string): BenchCase => ({
  name: `nest ${frames} frames of ${design} on 400 x 300`,
  target,
  budgetMs,
  setup: () => buildFrame(parseDesignText(read(`${design}.yaml`))).parts,
  run: (parts) =>
    nestParts((parts as ReturnType<typeof buildFrame>['parts']).map((part) => ({ part, count: part.quantity * frames })), {
      sheet: { widthMm: 400, heightMm: 300 },
      spacingMm: 3.175 + 2,
      marginMm: 10,
    }),
  note: (r) => utilisationNote(r as NestResult),
});

export const cases: BenchCase[] = [
  nestCase('tessel-5', 20, 10_000, 'under 10 s (issue 6)'),
  nestCase('mote-3', 20, 10_000, 'under 10 s'),
  nestCase('farline-7', 20, 10_000, 'under 10 s'),
  {
    name: 'quote 20 frames of tessel-5 (cut data, nesting, time, price)',
    target: 'under 10 s',
    budgetMs: 10_000,
    setup: () => ({ parts: buildFrame(parseDesignText(read('tessel-5.yaml'))).parts, shop: parseShopText(read('hollin-row-shop.yaml')) }),
    run: (s) => {
      const { parts, shop } = s as { parts: ReturnType<typeof buildFrame>['parts']; shop: ReturnType<typeof parseShopText> };
      return quoteParts(parts, { quantity: 20, shop, toolDiameterMm: 3.175 });
    },
    note: (q) => `${(q as Quote).currency} ${(q as Quote).batchCost.total.toFixed(2)}, ${(q as Quote).perFrame.cost.toFixed(2)} per frame`,
  },
];
