import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli, STACK_LINE } from '../helpers/cli.js';
import { commandAvailable, pythonModuleAvailable, requireTool, SYSTEM_PYTHON } from '../helpers/reference.js';
import { demoFrame } from './fixtures.js';

const root = mkdtempSync(join(tmpdir(), 'fw-quote-cli-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

type Report = {
  units: { currency: string };
  frames: number;
  checks: { errors: number; warnings: number } | null;
  parts: Array<{ name: string; total: number; toolPathMm: number; pierces: number }>;
  nesting: { groups: Array<{ thicknessMm: number; sheets: number; utilisation: number; lowerBoundSheets: number; boundSheets: number; minGapMm: number | null }>; sheets: Array<{ index: number; thicknessMm: number; parts: number; sizeMm: [number, number] }> };
  batch: { cost: { total: number; material: number }; timeMin: { totalMin: number } };
  perFrame: { cost: number };
  files: string[];
};

describe('framewright quote (the built CLI)', () => {
  const out = join(root, 'tessel');
  const r = runCli(['quote', 'designs/tessel-5.yaml', '--qty', '2', '--out', out, '--date', '2026-11-30', '--json']);
  const report = JSON.parse(r.stdout || '{}') as Report;
  const frame = demoFrame('tessel-5.yaml'.replace('.yaml', ''));

  it('writes the JSON report, the drawing (PDF + one SVG per sheet) and every sheet as DXF and SVG', () => {
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const files = readdirSync(out).sort();
    expect(files).toContain('quote.json');
    expect(files).toContain('drawing.pdf');
    // One sheet per part and the summary (with the hardware list); long tables add continuation sheets.
    expect(files.filter((f) => /^drawing-\d\d\.svg$/.test(f)).length).toBeGreaterThanOrEqual(frame.parts.length + 1);
    const sheets = readdirSync(join(out, 'sheets'));
    expect(sheets.filter((f) => f.endsWith('.dxf'))).toHaveLength(report.nesting.sheets.length);
    expect(sheets.filter((f) => f.endsWith('.svg'))).toHaveLength(report.nesting.sheets.length);
    expect(JSON.parse(readFileSync(join(out, 'quote.json'), 'utf8')).batch).toEqual((report as unknown as { batch: unknown }).batch);
  });

  it('reports every part, the checks summary, sheets per thickness and the totals', () => {
    expect(report.frames).toBe(2);
    expect(report.units.currency).toBe('EUR');
    expect(report.checks).not.toBeNull();
    expect(report.parts.map((p) => p.name)).toEqual(frame.parts.map((p) => p.name));
    for (const p of report.parts) expect(p.total).toBe(frame.parts.find((x) => x.name === p.name)!.quantity * 2);
    expect(new Set(report.nesting.groups.map((g) => g.thicknessMm))).toEqual(new Set(frame.parts.map((p) => p.thicknessMm)));
    for (const g of report.nesting.groups) {
      expect(g.sheets).toBeGreaterThanOrEqual(g.lowerBoundSheets);
      expect(g.lowerBoundSheets).toBe(Math.max(1, Math.ceil(g.boundSheets - 1e-9)));
      expect(g.minGapMm!).toBeGreaterThanOrEqual(3.175 + 2);
    }
    expect(report.batch.cost.total).toBeGreaterThan(report.batch.cost.material);
    expect(report.perFrame.cost).toBeCloseTo(report.batch.cost.total / 2, 3);
  });

  it.skipIf(!requireTool(pythonModuleAvailable('ezdxf'), 'python3-ezdxf'))('sheet DXFs: ezdxf reads them clean, one closed contour per outline and inner contour, all on the sheet', () => {
    const dxfs = readdirSync(join(out, 'sheets')).filter((f) => f.endsWith('.dxf')).sort().map((f) => join(out, 'sheets', f));
    const res = spawnSync(SYSTEM_PYTHON, ['test/quote/ezdxf_sheet.py', ...dxfs], { encoding: 'utf8' });
    expect(res.status, res.stderr).toBe(0);
    const read = JSON.parse(res.stdout) as Array<{ version: string; auditErrors: number; closedContours: number; extents: number[] }>;
    const contoursOf = new Map(frame.parts.map((p) => [p.name, 1 + p.features.length]));
    read.forEach((d, i) => {
      const sheet = report.nesting.sheets[i];
      const placements = (JSON.parse(readFileSync(join(out, 'quote.json'), 'utf8')) as { nesting: { sheets: Array<{ placements: Array<{ part: string }> }> } }).nesting.sheets[i].placements;
      expect(d.version).toBe('AC1009'); // R12 (DXF reference: $ACADVER AC1009)
      expect(d.auditErrors).toBe(0);
      expect(d.closedContours).toBe(placements.reduce((a, p) => a + contoursOf.get(p.part)!, 0));
      const [x0, y0, x1, y1] = d.extents;
      // The sheet margin is 10 mm in the example shop profile.
      expect(x0).toBeGreaterThanOrEqual(10 - 1e-6);
      expect(y0).toBeGreaterThanOrEqual(10 - 1e-6);
      expect(x1).toBeLessThanOrEqual(sheet.sizeMm[0] - 10 + 1e-6);
      expect(y1).toBeLessThanOrEqual(sheet.sizeMm[1] - 10 + 1e-6);
    });
  });

  it('is deterministic: byte-identical files on a second run', () => {
    const again = join(root, 'again');
    expect(runCli(['quote', 'designs/tessel-5.yaml', '--qty', '2', '--out', again, '--date', '2026-11-30']).code).toBe(0);
    const list = (d: string): string[] => readdirSync(d, { recursive: true }).map(String).filter((f) => f.includes('.')).sort();
    expect(list(again)).toEqual(list(out));
    for (const f of list(out)) expect(readFileSync(join(again, f)).equals(readFileSync(join(out, f))), f).toBe(true);
  });

  it('prints a summary table by default', () => {
    const t = runCli(['quote', 'designs/mote-3.yaml', '--qty', '1', '--out', join(root, 'mote')]);
    expect(t.code, t.stderr).toBe(0);
    expect(t.stdout).toMatch(/part\s+copies\s+mm\s+path mm\s+passes\s+pierces/);
    expect(t.stdout).toMatch(/cost EUR \d+\.\d\d = material/);
    expect(t.stdout).toMatch(/utilisation/);
    expect(t.stderr).toBe(''); // no progress bar when stderr is not a terminal
  });
});

describe('framewright quote on a terminal', () => {
  // `script` (util-linux) runs the CLI on a pseudo-terminal, where the progress bar appears.
  it.skipIf(!commandAvailable('script'))('shows a progress bar on stderr while nesting a large batch', () => {
    const out = join(root, 'tty');
    const cmd = `${JSON.stringify(process.execPath)} dist/cli/main.js quote designs/tessel-5.yaml --qty 12 --out ${JSON.stringify(out)}`;
    const r = spawnSync('script', ['-qec', cmd, '/dev/null'], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/\rnesting \[#*\.*\]\s+\d+ %/);
    expect(r.stdout).toContain('100 %');
    expect(r.stdout).toMatch(/per frame EUR/);
  });
});

describe('framewright quote: bad input is exit code 2, a clear message, no files', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['quantity', ['--qty', '0'], /--qty: "0" must be a whole number of frames from 1 to 10000/],
    ['sheet text', ['--qty', '1', '--sheet', 'big'], /--sheet: "big" must be WIDTHxHEIGHT in mm/],
    ['sheet too small', ['--qty', '1', '--sheet', '100x80'], /sheet: "100x80" is too small for part [a-z-]+ \(with 10 mm margins/],
    ['date', ['--qty', '1', '--date', '2026-02-30'], /--date: "2026-02-30" must be a calendar date/],
    ['time limit', ['--qty', '1', '--time-limit', '0.5'], /--time-limit: "0\.5" must be a number of seconds from 1 to 3600/],
  ];
  for (const [name, args, message] of cases) {
    it(name, () => {
      const out = join(root, `bad-${name.replace(/\W/g, '')}`);
      const r = runCli(['quote', 'designs/tessel-5.yaml', ...args, '--out', out]);
      expect(r.code, r.stderr).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(STACK_LINE);
      expect(existsSync(out)).toBe(false);
    });
  }

  it('a shop profile with turns the nesting cannot use names the key', () => {
    const shop = join(root, 'bad-turns.yaml');
    writeFileSync(shop, `${readFileSync('designs/hollin-row-shop.yaml', 'utf8')}nestTurnsDeg: [45]\n`);
    const out = join(root, 'bad-turns-out');
    const r = runCli(['quote', 'designs/tessel-5.yaml', '--qty', '1', '--shop', shop, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/shop\.nestTurnsDeg\.0: 45 must be 0, 90, 180 or 270/);
    expect(r.stderr).not.toMatch(STACK_LINE);
    expect(existsSync(out)).toBe(false);
  });

  it('a shop that allows only half turns gets a layout with 0° and 180° only', () => {
    const shop = join(root, 'half-turns.yaml');
    writeFileSync(shop, `${readFileSync('designs/hollin-row-shop.yaml', 'utf8')}nestTurnsDeg: [0, 180]\n`);
    const r = runCli(['quote', 'designs/tessel-5.yaml', '--qty', '2', '--shop', shop, '--out', join(root, 'half-turns-out'), '--json']);
    expect(r.code).toBe(0);
    const report = JSON.parse(r.stdout) as { nesting: { sheets: Array<{ placements: Array<{ rotationDeg: number }> }> } };
    for (const sh of report.nesting.sheets) for (const p of sh.placements) expect([0, 180]).toContain(p.rotationDeg);
  });

  it('a bad shop profile names the shop path, value and range', () => {
    const shop = join(root, 'bad-shop.yaml');
    const text = readFileSync('designs/hollin-row-shop.yaml', 'utf8').replace('machineRatePerHour: 90', 'machineRatePerHour: -90');
    writeFileSync(shop, text);
    const out = join(root, 'bad-shop-out');
    const r = runCli(['quote', 'designs/tessel-5.yaml', '--qty', '1', '--shop', shop, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/shop\.machineRatePerHour: -90 is below the allowed range 0 to 10000 currency\/h/);
    expect(r.stderr).not.toMatch(STACK_LINE);
    expect(existsSync(out)).toBe(false);
  });
});
