import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync } from 'node:fs';
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
  it('one size: writes the file, prints change table, rule, checks; exit code follows the check errors', () => {
    const dir = tmp();
    const out = join(dir, 't7.yaml');
    const text = cli('designs/tessel-5.yaml', '--props', '7in', '--out', out);
    expect(text.stderr).toBe('');
    expect(text.stdout).toMatch(/parameter\s+old\s+new\s+why/);
    expect(text.stdout).toMatch(/layout\.wheelbaseMm\s+236\s+\d+/);
    expect(text.stdout).toMatch(/Stiffness rule: keep the first bending frequency/);
    expect(text.stdout).toMatch(/Checks on the variant: \d+ errors, \d+ warnings/);
    expect(text.stdout).toMatch(/props off first/);
    expect(existsSync(out)).toBe(true);

    const json = cli('designs/tessel-5.yaml', '--props', '7in', '--out', join(dir, 'j.yaml'), '--json');
    const report = JSON.parse(json.stdout);
    expect(report.changes.some((c: { parameter: string }) => c.parameter === 'layout.wheelbaseMm')).toBe(true);
    expect(report.stiffness.achievedHz).toBeGreaterThanOrEqual(report.stiffness.targetHz);
    expect(json.status).toBe(report.checks.errors > 0 ? 1 : 0);
    expect(text.status).toBe(json.status);
    // same request, same bytes
    expect(readFileSync(join(dir, 'j.yaml'), 'utf8')).toBe(readFileSync(out, 'utf8'));
    expect(YAML.parse(readFileSync(out, 'utf8')).props.diameter).toBe('7in');
  });

  const impossible: Array<[string, string[], RegExp]> = [
    ['a 2-inch prop on a motor needing 16 mm circles', ['designs/tessel-5.yaml', '--props', '2in'], /--props: 2 in is outside what the kept motor mount \(16 mm circles, M3.*4 to 8 in/],
    ['a 2-inch prop on an explicit 22xx class', ['designs/tessel-5.yaml', '--props', '2in', '--motor', '2207'], /cannot be turned by motor class 20xx-24xx/],
    ['a wheelbase below the clearance minimum', ['designs/tessel-5.yaml', '--props', '7in', '--wheelbase', '200'], /--wheelbase: 200 is below the clearance minimum 2\d\d\.\d\d mm/],
    ['a prop size without a unit', ['designs/tessel-5.yaml', '--props', '7'], /a bare number is millimetres/],
    ['an unknown motor class', ['designs/tessel-5.yaml', '--props', '5in', '--motor', 'huge'], /--motor: huge is not a motor size class/],
    ['a bad wheelbase', ['designs/tessel-5.yaml', '--props', '5in', '--wheelbase', 'wide'], /--wheelbase: "wide" must be auto or a length in mm/],
  ];
  for (const [what, args, message] of impossible) {
    it(`refuses ${what}: exit 2, a clear message, nothing written`, () => {
      const dir = tmp();
      const r = cli(...args, '--out', join(dir, 'v.yaml'));
      expect(r.status).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(STACK_LINE);
      expect(readdirSync(dir)).toEqual([]);
    });
  }

  it('a family: yaml files, an SVG sheet at one scale, a comparison table; JSON rows', () => {
    const dir = join(tmp(), 'fam');
    const r = cli('designs/farline-7.yaml', '--props', '5in,6in,7in', '--out', dir, '--json');
    expect([0, 1]).toContain(r.status);
    expect(r.stderr).toBe(''); // no progress bar when stderr is not a terminal
    const report = JSON.parse(r.stdout);
    expect(report.rows).toHaveLength(4);
    expect(report.rows.map((x: { propsIn: number }) => x.propsIn)).toEqual([7, 5, 6, 7]);
    for (const row of report.rows) expect(['ok', 'warnings', 'errors']).toContain(row.status);
    expect(r.status).toBe(report.variants.some((v: { checks: { errors: number } }) => v.checks.errors > 0) ? 1 : 0);
    expect(outputNames(dir)).toEqual(['family.svg', 'farline-7-5in.yaml', 'farline-7-6in.yaml', 'farline-7-7in.yaml']);

    const svg = readFileSync(join(dir, 'family.svg'), 'utf8');
    // one user unit = 1 mm (CSS Values 3 / SVG 2: width in mm equal to the viewBox width)
    const m = /width="([0-9.]+)mm" height="([0-9.]+)mm" viewBox="0 0 ([0-9.]+) ([0-9.]+)"/.exec(svg)!;
    expect(m[1]).toBe(m[3]);
    expect(m[2]).toBe(m[4]);
    // one scale: every member's prop discs are drawn at radius P/2 in mm (7, 5, 6, 7 in)
    const radii = [...svg.matchAll(/<circle [^>]*r="([0-9.]+)"[^>]*stroke-dasharray/g)].map((x) => Number(x[1]));
    expect(radii).toHaveLength(16);
    expect(radii.filter((_, i) => i % 4 === 0)).toEqual([88.9, 63.5, 76.2, 88.9]);

    const text = cli('designs/farline-7.yaml', '--props', '5in,6in,7in', '--out', join(tmp(), 'f2'));
    expect(text.stdout).toMatch(/frame\s+props in\s+wheelbase mm\s+arm widths × t mm\s+mass g\s+arm f1 Hz\s+f1 rule\s+checks/);
    expect(text.stdout.split('\n').filter((l) => /^Farline 7 \(/.test(l))).toHaveLength(4);
  });

  it('the family sheet renders (rsvg-convert)', () => {
    if (!requireTool(commandAvailable('rsvg-convert'), 'rsvg-convert (librsvg2-bin)')) return;
    const dir = join(tmp(), 'fam');
    cli('designs/mote-3.yaml', '--props', '3in,4in', '--out', dir);
    const png = join(dir, 'sheet.png');
    const r = spawnSync('rsvg-convert', ['-o', png, join(dir, 'family.svg')], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(readFileSync(png).subarray(1, 4).toString()).toBe('PNG');
  });

  it('--out may be a directory for one size; a file is refused for a family', () => {
    const dir = tmp();
    const one = cli('designs/mote-3.yaml', '--props', '4in', '--out', dir);
    expect([0, 1]).toContain(one.status);
    expect(readdirSync(dir)).toEqual(['mote-3-4in.yaml']);
    const fam = cli('designs/mote-3.yaml', '--props', '3in,4in', '--out', join(dir, 'mote-3-4in.yaml'));
    expect(fam.status).toBe(2);
    expect(fam.stderr).toMatch(/--out: .* is a file; a family needs a directory/);
  });

  it('a family with an impossible member writes nothing and says which', () => {
    const base = tmp();
    const dir = join(base, 'fam');
    const r = cli('designs/tessel-5.yaml', '--props', '2in,5in', '--out', dir);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/cannot make one member of the family; nothing was written\.\n2in: --props/);
    expect(existsSync(dir)).toBe(false);
  });
});
