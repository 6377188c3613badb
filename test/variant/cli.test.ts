import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { runCli, STACK_LINE, outputNames } from '../helpers/cli.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';

// End to end through the built CLI (npm test builds dist/ first), repo root as cwd.
const cli = (...args: string[]) => {
  const r = runCli(['variant', ...args]);
  return { status: r.code, stdout: r.stdout, stderr: r.stderr };
};
const tmp = () => mkdtempSync(join(tmpdir(), 'fw-variant-'));

describe('framewright variant (built CLI)', () => {
  it('one size: writes the file, prints the change table, the rule and the checks; exit 0 because every check passes', () => {
    const dir = tmp();
    const out = join(dir, 't7.yaml');
    const text = cli('designs/tessel-5.yaml', '--props', '7in', '--out', out);
    expect(text.stderr).toBe('');
    expect(text.status).toBe(0);
    expect(text.stdout).toMatch(/parameter\s+old\s+new\s+why/);
    expect(text.stdout).toMatch(/layout\.wheelbaseMm\s+236\s+\d+/);
    expect(text.stdout).toMatch(/Arm size rule: each arm a cantilever/);
    expect(text.stdout).toMatch(/Checks on the variant: 0 errors/);
    expect(text.stdout).toMatch(/props off first/);
    expect(existsSync(out)).toBe(true);

    const json = cli('designs/tessel-5.yaml', '--props', '7in', '--out', join(dir, 'j.yaml'), '--json');
    const report = JSON.parse(json.stdout);
    expect(report.changes.some((c: { parameter: string }) => c.parameter === 'layout.wheelbaseMm')).toBe(true);
    expect(report.armRule.achievedHz).toBeGreaterThanOrEqual(report.armRule.requiredHz);
    expect(report.armRule.rotationBandHz.low).toBeLessThan(report.armRule.rotationBandHz.high);
    expect(report.checks.errors).toBe(0);
    expect(report.motorClass).toMatchObject({ variant: '25xx-28xx', massG: 50, how: 'prop table' });
    expect(json.status).toBe(0);
    // same request, same bytes
    expect(readFileSync(join(dir, 'j.yaml'), 'utf8')).toBe(readFileSync(out, 'utf8'));
    expect(YAML.parse(readFileSync(out, 'utf8')).props.diameter).toBe('7in');
  });

  const bad: Array<[string, string[], RegExp]> = [
    ['a prop above 13 in', ['designs/tessel-5.yaml', '--props', '14in'], /--props: 14in is 355\.6 mm \(14 in\), outside 1 to 13 in \(25\.4 to 330\.2 mm\)/],
    ['a prop below 1 in', ['designs/tessel-5.yaml', '--props', '0.8in'], /--props: 0\.8in is 20\.32 mm \(0\.8 in\), outside 1 to 13 in/],
    ['a prop size without a unit', ['designs/tessel-5.yaml', '--props', '7'], /a bare number is millimetres/],
    ['a wheelbase too small for the props', ['designs/tessel-5.yaml', '--props', '7in', '--wheelbase', '200'], /--wheelbase: 200 is below the clearance minimum 2\d\d\.\d\d mm: 7in props need it for the design's 6 mm tip gap/],
    ['an unknown motor class', ['designs/tessel-5.yaml', '--props', '5in', '--motor', 'huge'], /--motor: huge is not a motor size class; use a size such as 2207, a class \(08xx-11xx, .*\), auto or keep/],
    ['a prop the kept motor cannot turn', ['designs/tessel-5.yaml', '--props', '2in', '--motor', 'keep'], /--props: 2 in is outside what the kept motor mount \(16 mm circles, M3.*4\.5 to 8 in/],
    ['a named class that cannot turn the prop', ['designs/tessel-5.yaml', '--props', '2in', '--motor', '2207'], /cannot be turned by motor class 20xx-24xx/],
    ['a bad wheelbase', ['designs/tessel-5.yaml', '--props', '5in', '--wheelbase', 'wide'], /--wheelbase: "wide" must be auto or a length in mm/],
  ];
  for (const [what, args, message] of bad) {
    it(`refuses ${what}: exit 2, a clear message, nothing written`, () => {
      const dir = tmp();
      const r = cli(...args, '--out', join(dir, 'v.yaml'));
      expect(r.status).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(STACK_LINE);
      expect(outputNames(dir)).toEqual([]);
    });
  }

  it('a variant the rules cannot make valid: exit 1, the unmet constraint and the nearest valid alternative, nothing written', () => {
    // Mote 3 is a unibody 3-inch frame: at 10 in its arms would need more than a 6 mm bottom plate
    // at twice its widths to keep its place under the rotation band and its tip deflection.
    const dir = tmp();
    const r = cli('designs/mote-3.yaml', '--props', '10in', '--out', join(dir, 'v.yaml'));
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/^framewright: cannot make a 10in variant that passes every check; nothing was written\./);
    expect(r.stderr).toMatch(/Unmet: the arm size rule \(f1 ≥ \d+\.\d Hz and tip deflection ≤ \d\.\d\d % of the free length\): the stiffest allowed arm \(6 mm, widths 2 × the source's\) reaches f1 \d+\.\d Hz/);
    expect(r.stderr).toMatch(/Nearest valid alternative: .*props of \d+(\.5)?in with this design/);
    expect(r.stderr).not.toMatch(STACK_LINE);
    expect(outputNames(dir)).toEqual([]);
  });

  it('--force writes a variant that fails its checks, saying so in the first line of the output and of the file; exit 1', () => {
    // A given wheelbase that shortens the body brings the camera plates into the 7-inch props.
    const dir = tmp();
    const out = join(dir, 'v.yaml');
    const r = cli('designs/tessel-5.yaml', '--props', '7in', '--wheelbase', '268', '--force', '--out', out);
    expect(r.status).toBe(1);
    expect(r.stdout.split('\n')[0]).toMatch(/^INVALID variant written to .*v\.yaml \(--force\): 7in fails its checks\./);
    const text = readFileSync(out, 'utf8');
    expect(text.split('\n')[0]).toMatch(/^# INVALID: this 7in variant fails its checks \(\d+ errors\)/);
    expect(YAML.parse(text).props.diameter).toBe('7in');
    const check = runCli(['check', out]);
    expect(check.code).toBe(1);
  });

  it('a size range: yaml files, a range sheet and a range chart; a comparison table; JSON rows', () => {
    const dir = join(tmp(), 'range');
    const r = cli('designs/farline-7.yaml', '--props', '5in,6in,7in', '--out', dir, '--json');
    expect(r.status).toBe(0);
    expect(r.stderr).toBe(''); // no progress bar when stderr is not a terminal
    const report = JSON.parse(r.stdout);
    expect(report.rows).toHaveLength(4);
    expect(report.rows.map((x: { propsIn: number }) => x.propsIn)).toEqual([7, 5, 6, 7]);
    for (const row of report.rows) expect(['ok', 'warnings']).toContain(row.status);
    expect(outputNames(dir).sort()).toEqual(['farline-7-5in.yaml', 'farline-7-6in.yaml', 'farline-7-7in.yaml', 'range-chart.svg', 'range-sheet.svg']);

    const svg = readFileSync(join(dir, 'range-sheet.svg'), 'utf8');
    // one user unit = 1 mm (CSS Values 3 / SVG 2: width in mm equal to the viewBox width)
    const m = /width="([0-9.]+)mm" height="([0-9.]+)mm" viewBox="[-0-9.]+ [-0-9.]+ ([0-9.]+) ([0-9.]+)"/.exec(svg)!;
    expect(m[1]).toBe(m[3]);
    expect(m[2]).toBe(m[4]);
    // one scale: every size's prop discs are drawn at radius P/2 in mm (7, 5, 6, 7 in)
    const radii = [...svg.matchAll(/<circle [^>]*r="([0-9.]+)"[^>]*stroke-dasharray/g)].map((x) => Number(x[1]));
    expect(radii).toHaveLength(16);
    expect(radii.filter((_, i) => i % 4 === 0)).toEqual([88.9, 63.5, 76.2, 88.9]);

    const text = cli('designs/farline-7.yaml', '--props', '5in,6in,7in', '--out', join(tmp(), 'f2'));
    expect(text.stdout).toMatch(/frame\s+props in\s+wheelbase mm\s+arm widths × t mm\s+motor g\s+mass g\s+arm f1 Hz\s+f1 asked Hz\s+rotation band Hz\s+checks/);
    expect(text.stdout.split('\n').filter((l) => /^Farline 7 \(/.test(l))).toHaveLength(4);
    expect(text.stdout).not.toMatch(/famil/i);
  });

  it('the range chart plots what the rows say, on axes a reader can recover from its tick labels', () => {
    const dir = join(tmp(), 'range');
    const r = cli('designs/tessel-5.yaml', '--props', '3in,5in,7in', '--out', dir, '--json');
    expect(r.status).toBe(0);
    const rows = JSON.parse(r.stdout).rows as Array<{ propsIn: number; wheelbaseMm: number; massG: number; armFrequencyHz: number; bandHighHz: number }>;
    const svg = readFileSync(join(dir, 'range-chart.svg'), 'utf8');
    const panels = svg.split('<g id="panel-').slice(1);
    expect(panels).toHaveLength(3);
    // Axis maps recovered from two grid lines each (their labelled value and position), then every point's
    // position must give back the row's value: the chart is checked against the rows, not itself.
    const axis = (panel: string, cls: 'grid-x' | 'grid-y') => {
      const at = cls === 'grid-x' ? 'x1' : 'y1';
      const lines = [...panel.matchAll(new RegExp(`class="${cls}" data-value="([-0-9.]+)"[^>]* ${at}="([-0-9.]+)"`, 'g'))].map((t) => ({ v: Number(t[1]), p: Number(t[2]) }));
      // every grid line's label is its data-value and a tick label with the same text exists
      for (const l of lines) expect(panel).toContain(`>${l.v}</text>`);
      const a = lines[0];
      const b = lines[lines.length - 1];
      return (p: number) => a.v + ((p - a.p) * (b.v - a.v)) / (b.p - a.p);
    };
    const series: Array<[number, string, keyof (typeof rows)[number]]> = [[0, 'wheelbase', 'wheelbaseMm'], [1, 'mass', 'massG'], [2, 'arm-f1', 'armFrequencyHz']];
    for (const [i, key, field] of series) {
      const toX = axis(panels[i], 'grid-x');
      const toY = axis(panels[i], 'grid-y');
      const pts = [...panels[i].matchAll(new RegExp(`data-series="${key}" data-x="[-0-9.]+" data-y="[-0-9.]+" cx="([-0-9.]+)" cy="([-0-9.]+)"`, 'g'))].map((p) => [toX(Number(p[1])), toY(Number(p[2]))]);
      expect(pts).toHaveLength(rows.length);
      const expected = [...rows].sort((a, b) => a.propsIn - b.propsIn);
      // the source (5.1 in) sorts between 5 and 7
      pts.forEach(([x, y], k) => {
        expect(x).toBeCloseTo(expected[k].propsIn, 2);
        expect(Math.abs(y - (expected[k][field] as number))).toBeLessThan(0.002 * (expected[k][field] as number) + 0.05);
      });
    }
    // the rotation band is drawn; its top at each row's prop is v / (π D) at 240 m/s (README), so the
    // band's top edge passes through (in, 240 / (π · in · 0.0254)) on the chart's own axes
    expect(panels[2]).toMatch(/<polygon class="band"/);
    const toX = axis(panels[2], 'grid-x');
    const toY = axis(panels[2], 'grid-y');
    const band = /<polygon class="band" points="([^"]+)"/.exec(panels[2])![1].split(' ').map((p) => p.split(',').map(Number));
    const top = band.slice(0, band.length / 2).map(([x, y]) => [toX(x), toY(y)]);
    for (const [inches, hz] of top) expect(hz).toBeCloseTo(240 / (Math.PI * inches * 0.0254), 0);
    for (const row of rows) expect(row.armFrequencyHz).toBeLessThan(row.bandHighHz);
  });

  it('the range sheet and chart render (rsvg-convert)', () => {
    if (!requireTool(commandAvailable('rsvg-convert'), 'rsvg-convert (librsvg2-bin)')) return;
    const dir = join(tmp(), 'range');
    expect(cli('designs/mote-3.yaml', '--props', '3in,4in', '--out', dir).status).toBe(0);
    for (const f of ['range-sheet.svg', 'range-chart.svg']) {
      const png = join(dir, `${f}.png`);
      const r = spawnSync('rsvg-convert', ['-o', png, join(dir, f)], { encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      expect(readFileSync(png).subarray(1, 4).toString()).toBe('PNG');
    }
  });

  it('--out may be a directory for one size; a file is refused for a size range', () => {
    const dir = tmp();
    const one = cli('designs/mote-3.yaml', '--props', '4in', '--out', dir);
    expect(one.status).toBe(0);
    expect(outputNames(dir)).toEqual(['mote-3-4in.yaml']);
    const range = cli('designs/mote-3.yaml', '--props', '3in,4in', '--out', join(dir, 'mote-3-4in.yaml'));
    expect(range.status).toBe(2);
    expect(range.stderr).toMatch(/--out: .* is a file; a size range needs a directory/);
  });

  it('a size range with a bad size writes nothing and says which', () => {
    const base = tmp();
    const dir = join(base, 'range');
    const r = cli('designs/tessel-5.yaml', '--props', '2in,5in', '--motor', 'keep', '--out', dir);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/cannot make one size of the range; nothing was written\.\n2in: --props/);
    expect(existsSync(dir)).toBe(false);
  });
});
