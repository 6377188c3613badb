import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import YAML from 'yaml';
import { describe, expect, it } from 'vitest';
import { DEMO_FILES, DESIGNS_DIR, demoFrame, designWith } from '../helpers/demo.js';
import { partBBox } from '../../src/geometry/index.js';
import { outputNames, runCli, STACK_LINE } from '../helpers/cli.js';
import { viewBoxOf } from '../helpers/render.js';

const tmp = () => mkdtempSync(join(tmpdir(), 'fw-build-'));

describe('framewright build (the built CLI)', () => {
  for (const file of DEMO_FILES) {
    it(`${file}: writes every part as DXF and SVG plus the overview`, () => {
      const out = join(tmp(), 'o');
      const r = runCli(['build', join(DESIGNS_DIR, file), '--out', out]);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      const names = demoFrame(file).parts.map((p) => p.name);
      const written = outputNames(out);
      const assembly = ['assembly.json', 'front.svg', 'hardware.csv', 'hardware.json', 'side.svg'];
      expect(written).toEqual([...names.flatMap((n) => [`${n}.dxf`, `${n}.svg`]), 'overview.svg', ...assembly].sort());
      expect(r.stdout).toMatch(/part\s+qty\s+thick mm\s+size mm\s+area mm²\s+mass g\s+cut mm/);
      for (const n of names) expect(r.stdout).toContain(n);
    });
  }

  it('is deterministic: the same design gives byte-identical files', () => {
    const a = join(tmp(), 'a');
    const b = join(tmp(), 'b');
    expect(runCli(['build', 'designs/tessel-5.yaml', '--out', a]).code).toBe(0);
    expect(runCli(['build', 'designs/tessel-5.yaml', '--out', b]).code).toBe(0);
    for (const f of readdirSync(a)) expect(readFileSync(join(b, f)).equals(readFileSync(join(a, f))), f).toBe(true);
  });

  it('--json gives the summary with areas and masses', () => {
    const r = runCli(['build', 'designs/mote-3.yaml', '--out', join(tmp(), 'j'), '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout) as { units: string; parts: Array<{ name: string; areaMm2: number; massG: number; thicknessMm: number }> };
    expect(j.units).toBe('mm');
    for (const p of j.parts) {
      // mass = area × thickness × density (1.57 g/cm³ = 0.00157 g/mm³ in the demo material)
      expect(p.massG).toBeCloseTo((p.areaMm2 * p.thicknessMm * 1.57) / 1000, 1);
    }
  });

  const badCases: Array<[string, Record<string, unknown> | ((raw: Record<string, unknown>) => void), RegExp]> = [
    ['a missing field', (raw) => delete (raw.layout as Record<string, unknown>).wheelbaseMm, /layout\.wheelbaseMm: \(missing\) is required/],
    ['a negative width', { arms: { widthMm: -3 } }, /arms\.widthMm: -3 is below the allowed range 4 to 60 mm/],
    ['a stack pattern that does not fit the body', { stacks: [{ place: 'front', patternsMm: [50], boltSize: 'M3' }], components: undefined }, /stacks\.0\.patternsMm: "bottom-plate" puts a stack bolt hole Ø3\.40 .* outside the bottom-plate outline/],
    ['an unknown key', { arms: { wdith: 3 } }, /arms: \["wdith"\] unknown key/],
  ];
  for (const [what, patch, message] of badCases) {
    it(`refuses ${what}: exit 2, the parameter named, no stack trace, nothing written`, () => {
      const dir = tmp();
      const raw = typeof patch === 'function' ? designWith('tessel-5.yaml', {}) : designWith('tessel-5.yaml', patch);
      if (typeof patch === 'function') patch(raw);
      const path = join(dir, 'bad.yaml');
      writeFileSync(path, YAML.stringify(raw));
      const out = join(dir, 'out');
      const r = runCli(['build', path, '--out', out]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).toContain('nothing was written');
      expect(r.stderr).not.toMatch(STACK_LINE);
      expect(existsSync(out)).toBe(false);
    });
  }

  it('a file that is not there, or not YAML: exit 2 with a message', () => {
    const r = runCli(['build', 'designs/no-such-frame.yaml']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/cannot read designs\/no-such-frame\.yaml: ENOENT/);
    const dir = tmp();
    writeFileSync(join(dir, 'x.yaml'), 'name: [unclosed');
    const r2 = runCli(['build', join(dir, 'x.yaml')]);
    expect(r2.code).toBe(2);
    expect(r2.stderr).not.toMatch(STACK_LINE);
  });

  it('schema prints a JSON Schema that names every section', () => {
    const r = runCli(['schema']);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout) as { properties: Record<string, unknown>; required: string[] };
    for (const k of ['layout', 'props', 'motor', 'arms', 'body', 'stacks', 'topPlate', 'braces', 'camera', 'materials', 'cutting']) expect(s.properties).toHaveProperty(k);
    expect(s.required).toEqual(expect.arrayContaining(['name', 'layout', 'props', 'motor', 'arms', 'body']));
  });

  it('--help works on every command', () => {
    for (const c of [[], ['build'], ['schema']]) {
      const r = runCli([...c, '--help']);
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/Usage: framewright/);
    }
  });
});

describe('README design reference', () => {
  it('is exactly the table generated from the schema', async () => {
    const { readFileSync } = await import('node:fs');
    const readme = readFileSync(join(DESIGNS_DIR, '..', 'README.md'), 'utf8');
    const r = runCli(['schema', '--markdown']);
    expect(r.code).toBe(0);
    expect(readme).toContain(r.stdout.trimEnd());
  });
});

describe('build runs the checks first', () => {
  // Square X at 180 mm with 5.1-inch props: adjacent tip gap 180/√2 − 129.5 = −2.3 mm, props overlap
  const crowded = () => {
    const dir = tmp();
    const path = join(dir, 'crowded.yaml');
    writeFileSync(path, YAML.stringify(designWith('tessel-5.yaml', { layout: { kind: 'x', wheelbaseMm: 180, armAngleDeg: 45 } })));
    return { dir, path };
  };
  it('refuses to write cut files when the checks find errors: exit 1, nothing written', () => {
    const { dir, path } = crowded();
    const out = join(dir, 'out');
    const r = runCli(['build', path, '--out', out]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/no cut files were written \(see `framewright check`, or use --force\)/);
    expect(existsSync(out)).toBe(false);
  });
  it('--force writes them, and every file says it was forced', () => {
    const { dir, path } = crowded();
    const out = join(dir, 'out');
    const r = runCli(['build', path, '--out', out, '--force']);
    expect(r.code).toBe(1);
    // The cut files (DXF and part SVG); the views, hardware list and assembly are not cut.
    const notCut = ['overview.svg', 'side.svg', 'front.svg', 'hardware.csv', 'hardware.json', 'assembly.json'];
    for (const f of outputNames(out).filter((x) => !notCut.includes(x))) {
      expect(readFileSync(join(out, f), 'utf8')).toMatch(/written with --force although the design-rule checks found \d+ errors/);
    }
  });
});

describe('output folders that cannot be written', () => {
  it('exit 2 with the path named, no stack trace, for a folder under a file and for /proc', () => {
    for (const out of ['/dev/null/x', '/proc/framewright-test/x']) {
      for (const cmd of [['build', 'designs/tessel-5.yaml', '--out', out], ['schema', '--out', `${out}/s.json`]]) {
        const r = runCli(cmd);
        expect(r.code, `${cmd.join(' ')}`).toBe(2);
        expect(r.stderr).toMatch(/cannot (write into|create) /);
        expect(r.stderr).not.toMatch(STACK_LINE);
      }
    }
  });
  it('a DXF given to build is pointed to check and modes', () => {
    const r = runCli(['build', 'test/fixtures/dxf/annotation.dxf']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/is a DXF drawing; this command takes a design file/);
    expect(r.stderr.length).toBeLessThan(400);
  });
  it('rewriting an existing output folder replaces every file', () => {
    const out = join(tmp(), 'again');
    expect(runCli(['build', 'designs/mote-3.yaml', '--out', out]).code).toBe(0);
    writeFileSync(join(out, 'top-plate.svg'), 'stale');
    expect(runCli(['build', 'designs/mote-3.yaml', '--out', out]).code).toBe(0);
    expect(readFileSync(join(out, 'top-plate.svg'), 'utf8')).toMatch(/^<\?xml/);
    expect(readdirSync(out).filter((f) => f.includes('.tmp'))).toEqual([]);
  });
});

describe('the SVG files build writes', () => {
  it('hold the whole part front up (+x up) at 1 mm per unit, in a viewBox of the width and height given in mm', () => {
    const out = join(tmp(), 'svg');
    expect(runCli(['build', 'designs/tessel-5.yaml', '--out', out]).code).toBe(0);
    for (const p of demoFrame('tessel-5.yaml').parts) {
      const svg = readFileSync(join(out, `${p.name}.svg`), 'utf8');
      const b = partBBox(p);
      const vb = viewBoxOf(svg);
      expect(Number(/width="([0-9.]+)mm"/.exec(svg)![1])).toBeCloseTo(vb.w, 3);
      expect(Number(/height="([0-9.]+)mm"/.exec(svg)![1])).toBeCloseTo(vb.h, 3);
      // The part's extent turned front up (screen x = −y, y = −x) lies inside the viewBox.
      expect(vb.x).toBeLessThan(-b[3]);
      expect(vb.x + vb.w).toBeGreaterThan(-b[1]);
      expect(vb.y).toBeLessThan(-b[2]);
      expect(vb.y + vb.h).toBeGreaterThan(-b[0]);
    }
  });
});
