import { performance } from 'node:perf_hooks';
import type { BenchCase } from './types.js';
import { cases as geometryCases } from './geometry.js';
import { cases as analysisCases } from './analysis.js';
import { cases as importCases } from './import.js';
import { cases as checksCases } from './checks.js';
import { cases as variantCases } from './variant.js';
import { cases as quoteCases } from './quote.js';
import { cases as assemblyCases } from './assembly.js';

/** Every area's benchmark cases; add one import per area. */
const ALL: BenchCase[] = [...geometryCases, ...importCases, ...checksCases, ...assemblyCases, ...variantCases, ...quoteCases, ...analysisCases];

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

async function main(): Promise<void> {
  const filter = process.argv[2];
  const rows: string[][] = [];
  for (const c of ALL.filter((c) => !filter || c.name.includes(filter))) {
    const state = c.setup ? await c.setup() : undefined;
    const times: number[] = [];
    let result: unknown;
    const reps = 5;
    for (let i = 0; i < reps; i++) {
      const t0 = performance.now();
      result = await c.run(state);
      times.push(performance.now() - t0);
    }
    const med = median(times);
    rows.push([c.name, med.toFixed(1), Math.min(...times).toFixed(1), c.target, med <= c.budgetMs ? 'met' : 'MISSED', c.note ? c.note(result) : '']);
  }
  const header = ['case', 'median ms', 'best ms', 'target', 'status', 'note'];
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (r: string[]) => r.map((c, i) => c.padEnd(widths[i])).join(' | ');
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('-|-'));
  for (const r of rows) console.log(line(r));
}

await main();
