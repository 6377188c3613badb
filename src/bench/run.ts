import { performance } from 'node:perf_hooks';
import type { BenchCase, BenchFigure, FigureResult } from './types.js';
import { median } from './measure.js';
import { cases as geometryCases } from './geometry.js';
import { cases as analysisCases, figures as analysisFigures } from './analysis.js';
import { cases as importCases } from './import.js';
import { cases as checksCases, figures as checksFigures } from './checks.js';
import { cases as variantCases } from './variant.js';
import { cases as quoteCases, figures as quoteFigures } from './quote.js';
import { figures as startupFigures } from './startup.js';
import { cases as assemblyCases } from './assembly.js';
import { cases as liveCases } from './live.js';

/** Every area's benchmark cases; add one import per area. */
const ALL: BenchCase[] = [...geometryCases, ...importCases, ...checksCases, ...assemblyCases, ...variantCases, ...quoteCases, ...analysisCases, ...liveCases];

/** The promised figures, each beside its peer (one table, `order` sorts rows from several files); add one import per file. */
const FIGURES: BenchFigure[] = [...startupFigures, ...checksFigures, ...quoteFigures, ...analysisFigures].sort((a, b) => a.order - b.order);

function table(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (r: readonly string[]) => r.map((c, i) => c.padEnd(widths[i])).join(' | ');
  return [line(header), widths.map((w) => '-'.repeat(w)).join('-|-'), ...rows.map(line)].join('\n');
}

async function figureRows(filter: string | undefined): Promise<string[][]> {
  const rows: string[][] = [];
  for (const f of FIGURES.filter((f) => !filter || f.figure.includes(filter) || (filter === 'startup' && startupFigures.includes(f)))) {
    let r: FigureResult;
    try {
      r = await f.measure();
    } catch (e) {
      r = { value: 'failed', peer: '-', met: false, note: (e as Error).message.split('\n')[0] };
    }
    rows.push([f.figure, r.value, r.peer, r.ratio ?? '', f.goal, r.met ? 'met' : 'MISSED', r.note ?? '']);
  }
  return rows;
}

async function caseRows(filter: string | undefined): Promise<string[][]> {
  const rows: string[][] = [];
  for (const c of ALL.filter((c) => !filter || c.name.includes(filter))) {
    const state = c.setup ? await c.setup() : undefined;
    const times: number[] = [];
    let result: unknown;
    for (let i = 0; i < 5; i++) {
      const t0 = performance.now();
      result = await c.run(state);
      times.push(performance.now() - t0);
    }
    const med = median(times);
    rows.push([c.name, med.toFixed(1), Math.min(...times).toFixed(1), c.target, med <= c.budgetMs ? 'met' : 'MISSED', c.note ? c.note(result) : '']);
  }
  return rows;
}

/**
 * `npm run bench [filter]`: first the figures table (each figure beside its peer, measured in this
 * run), then the per-stage cases. A filter keeps the rows whose name contains it; `startup` keeps
 * the rows of startup.ts.
 */
async function main(): Promise<void> {
  const filter = process.argv[2];
  const figures = await figureRows(filter);
  if (figures.length) {
    console.log(table(['figure', 'this run', 'peer, same run', 'ratio', 'goal', 'status', 'note'], figures));
    console.log('');
  }
  const cases = await caseRows(filter);
  if (cases.length) console.log(table(['case', 'median ms', 'best ms', 'target', 'status', 'note'], cases));
}

await main();
