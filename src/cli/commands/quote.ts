import type { Command } from 'commander';
import { join } from 'node:path';
import { drawingFonts } from '../fonts.js';
import { defaultShopPath } from '../packageRoot.js';
import { readDesign, readText, UsageError, writeAllAtomically, type OutputFile } from '../io.js';
import { textTable } from '../table.js';
import { slug } from './build.js';

export type QuoteCliOptions = { qty: string; sheet?: string; shop?: string; out?: string; json?: boolean; date?: string; tolerance?: string; r2000?: boolean; timeLimit?: string };

function parseQty(s: string): number {
  if (!/^\d+$/.test(s.trim()) || Number(s) < 1 || Number(s) > 10000) throw new UsageError(`--qty: ${JSON.stringify(s)} must be a whole number of frames from 1 to 10000`);
  return Number(s);
}

function parseSheet(s: string): { widthMm: number; heightMm: number } {
  const m = /^\s*(\d+(?:\.\d+)?)\s*[xX×]\s*(\d+(?:\.\d+)?)\s*$/.exec(s);
  const w = m ? Number(m[1]) : NaN;
  const h = m ? Number(m[2]) : NaN;
  if (!m || w < 50 || h < 50 || w > 3000 || h > 3000) throw new UsageError(`--sheet: ${JSON.stringify(s)} must be WIDTHxHEIGHT in mm, each 50 to 3000 (e.g. 400x300)`);
  return { widthMm: w, heightMm: h };
}

function parseTimeLimit(s: string): number {
  const v = Number(s);
  if (!/^\s*\d+(\.\d+)?\s*$/.test(s) || !(v >= 1) || v > 3600) throw new UsageError(`--time-limit: ${JSON.stringify(s)} must be a number of seconds from 1 to 3600`);
  return v;
}

function parseDate(s: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(s);
  const d = m ? new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))) : null;
  if (!m || !d || d.getUTCMonth() !== Number(m[2]) - 1 || d.getUTCDate() !== Number(m[3])) throw new UsageError(`--date: ${JSON.stringify(s)} must be a calendar date YYYY-MM-DD`);
  return s;
}

/** A one-line progress bar on stderr, only on a terminal. */
function progressBar(): { tick: (done: number, total: number) => void; clear: () => void } | null {
  if (!process.stderr.isTTY) return null;
  let last = -1;
  return {
    tick: (done, total) => {
      const pct = Math.floor((done / total) * 100);
      if (pct === last) return;
      last = pct;
      const n = Math.round(pct / 4);
      process.stderr.write(`\rnesting [${'#'.repeat(n)}${'.'.repeat(25 - n)}] ${String(pct).padStart(3)} %`);
    },
    clear: () => process.stderr.write(`\r${' '.repeat(50)}\r`),
  };
}

export function registerQuote(program: Command): void {
  program
    .command('quote')
    .description('cut data, sheet nesting, time and price for a batch of frames, with a drawing a shop can quote from')
    .argument('<design>', 'design file (YAML or JSON)')
    .requiredOption('--qty <n>', 'number of complete frames')
    .option('--sheet <WxH>', "one sheet size for every thickness, mm (default: the shop's stocked sheet per thickness)")
    .option('--shop <file>', 'shop profile (YAML); default: the example designs/hollin-row-shop.yaml')
    .option('--out <dir>', 'output folder (default: out/<design name>-quote)')
    .option('--date <YYYY-MM-DD>', 'date for the title block (nothing reads the clock)')
    .option('--tolerance <text>', 'general tolerance note on the drawing', 'ISO 2768-m unless stated')
    .option('--r2000', 'write the sheet DXFs as R2000 (LWPOLYLINE) instead of R12')
    .option('--time-limit <seconds>', 'stop searching for a better nesting after this long (the layout is then complete but may vary between runs)')
    .option('--json', 'print every number as JSON instead of the summary table')
    .action(async (designPath: string, opts: QuoteCliOptions) => {
      const quantity = parseQty(opts.qty);
      const sheet = opts.sheet ? parseSheet(opts.sheet) : undefined;
      const date = opts.date ? parseDate(opts.date) : null;
      const timeLimitS = opts.timeLimit !== undefined ? parseTimeLimit(opts.timeLimit) : undefined;
      const design = await readDesign(designPath);
      const shopPath = opts.shop ?? defaultShopPath();
      const shopText = readText(shopPath, 'a shop profile (YAML)');
      const [{ parseShopText }, { buildFrame }, { checkFrame }, { quoteParts }, { DEFAULT_GENERAL_TOLERANCE, quotePackage }, { buildAssembly, hardwareList }] = await Promise.all([
        import('../../params/shop.js'),
        import('../../geometry/index.js'),
        import('../../checks/index.js'),
        import('../../quote/index.js'),
        import('../../export/quotePackage.js'),
        import('../../assembly/index.js'),
      ]);
      const shop = parseShopText(shopText, shopPath);
      const frame = buildFrame(design);
      const outDir = opts.out ?? join('out', `${slug(design.name)}-quote`);
      if (outDir.trim() === '') throw new UsageError('--out must name a folder');
      const total = frame.parts.reduce((a, p) => a + p.quantity * quantity, 0);
      const bar = total >= 100 ? progressBar() : null;
      const quote = quoteParts(frame.parts, {
        quantity,
        shop,
        toolDiameterMm: shop.toolDiameterMm ?? design.cutting.toolDiameterMm,
        ...(sheet ? { sheet } : {}),
        ...(bar ? { onProgress: bar.tick } : {}),
        ...(timeLimitS !== undefined ? { timeLimitMs: timeLimitS * 1000, now: () => performance.now() } : {}),
      });
      bar?.clear();
      // The drawing carries the design-rule summary for the tool this quote uses.
      const assembly = buildAssembly(design, frame);
      const checks = checkFrame(frame, { toolDiameterMm: quote.toolDiameterMm }, assembly).summary;
      const { report, files: pkg } = await quotePackage(frame.parts, quote, {
        design: design.name,
        revision: design.revision,
        date,
        checks,
        hardware: hardwareList(assembly, design),
        generalTolerance: opts.tolerance ?? DEFAULT_GENERAL_TOLERANCE,
        ...(opts.r2000 ? { r2000: true } : {}),
        fonts: drawingFonts(),
      });
      const files: OutputFile[] = pkg.map((f) => ({ path: join(outDir, ...f.name.split('/')), data: f.data }));
      writeAllAtomically(files, outDir);
      if (opts.json) {
        process.stdout.write(`${JSON.stringify({ ...report, outDir, files: files.map((f) => f.path) }, null, 2)}\n`);
        return;
      }
      const cur = quote.currency;
      const rows = quote.parts.map((p) => [p.cut.name, String(p.cut.quantity * quantity), p.cut.thicknessMm.toFixed(1), p.cut.toolPathMm.toFixed(0), String(p.time.passes), String(p.cut.pierces), p.time.totalMin.toFixed(1), p.cost.total.toFixed(2)]);
      process.stdout.write(`${design.name} rev ${design.revision}: ${quantity} frame${quantity === 1 ? '' : 's'}, quoted for ${shop.name}\n\n`);
      process.stdout.write(`${textTable(['part', 'copies', 'mm', 'path mm', 'passes', 'pierces', 'min each', `direct ${cur} each`], rows)}\n\n`);
      const srows = quote.nesting.groups.map((g) => [g.thicknessMm.toFixed(1), g.material, String(g.sheets), String(g.lowerBoundSheets), `${(g.utilisation * 100).toFixed(1)} %`, g.minGapMm === null ? '' : g.minGapMm.toFixed(3)]);
      process.stdout.write(`${textTable(['mm', 'material', 'sheets', 'fewest possible', 'utilisation', 'closest parts mm'], srows)}\n\n`);
      const t = quote.batchTime;
      const c = quote.batchCost;
      process.stdout.write(
        `time ${t.totalMin.toFixed(1)} min (cutting ${t.cutMin.toFixed(1)}, plunges ${t.plungeMin.toFixed(1)}, rapids ${t.rapidMin.toFixed(1)}, allowance ${t.allowanceMin.toFixed(1)}, setup ${t.setupMin.toFixed(1)}, tool changes ${t.toolChangeMin.toFixed(1)})\n` +
          `cost ${cur} ${c.total.toFixed(2)} = material ${c.material.toFixed(2)} + machine ${c.machine.toFixed(2)} + setup ${c.setup.toFixed(2)} + tool wear ${c.tooling.toFixed(2)} + margin ${c.margin.toFixed(2)}\n` +
          `per frame ${cur} ${quote.perFrame.cost.toFixed(2)}, ${quote.perFrame.timeMin.toFixed(1)} min\n`,
      );
      for (const w of quote.warnings) process.stdout.write(`note: ${w}\n`);
      process.stdout.write(`design-rule checks: ${checks.errors} error(s), ${checks.warnings} warning(s)${checks.errors ? ' - see `framewright check` before cutting' : ''}\nfiles in ${outDir}\n`);
    });
}
