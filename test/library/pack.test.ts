import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REPO } from '../helpers/demo.js';
import { runCli } from '../helpers/cli.js';
import { setDesignValues } from '../../src/variant/changes.js';

/**
 * The package as users get it: `npm pack`, installed into an empty project by npm itself, imported
 * by name from plain JavaScript and from type-checked TypeScript, and the README's library example
 * run there. So the entry point and its exports map cannot break silently again.
 */

const tmp = mkdtempSync(join(tmpdir(), 'fw-pack-'));
const project = join(tmp, 'consumer');
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function sh(cmd: string, args: string[], cwd: string, timeout = 240_000): { code: number; out: string } {
  const r = spawnSync(cmd, args, { cwd, encoding: 'utf8', timeout, maxBuffer: 64 * 1024 * 1024 });
  return { code: r.status ?? -1, out: `${r.stdout}\n${r.stderr}` };
}

/** The first ```js block of the README's library section. */
function readmeExample(): string {
  const readme = readFileSync(join(REPO, 'README.md'), 'utf8');
  const section = readme.slice(readme.indexOf('<!-- section:library -->'), readme.indexOf('<!-- /section:library -->'));
  const m = /```js\n([\s\S]*?)```/.exec(section);
  if (!m) throw new Error('the README library section has no js example');
  return m[1];
}

describe('the packed package', () => {
  beforeAll(() => {
    const pack = sh('npm', ['pack', '--pack-destination', tmp, '--json', '--ignore-scripts'], REPO);
    expect(pack.code, pack.out).toBe(0);
    const file = (JSON.parse(pack.out.slice(pack.out.indexOf('['), pack.out.lastIndexOf(']') + 1)) as Array<{ filename: string }>)[0].filename;
    sh('mkdir', ['-p', project], tmp);
    writeFileSync(join(project, 'package.json'), JSON.stringify({ name: 'consumer', version: '1.0.0', private: true, type: 'module' }));
    // The npm cache first (CI filled it with `npm ci`); the registry only for what it lacks.
    const install = sh('npm', ['install', '--prefer-offline', '--no-audit', '--no-fund', '--ignore-scripts', join(tmp, file)], project);
    expect(install.code, install.out).toBe(0);
  }, 300_000);

  it('imports by name and builds, checks and exports the demo design', () => {
    const script = `
      import { readFileSync, writeFileSync } from 'node:fs';
      import { fileURLToPath } from 'node:url';
      import * as fw from 'framewright';
      const text = readFileSync(fileURLToPath(import.meta.resolve('framewright/designs/tessel-5.yaml')), 'utf8');
      const frame = fw.buildFrame(fw.parseDesignText(text));
      const report = fw.checkFrame(frame);
      writeFileSync('bottom-plate.dxf', fw.partToDxf(frame.parts[0]));
      let refused = '';
      try { fw.parseDesignText('name: x'); } catch (e) { refused = e instanceof fw.DesignError ? e.issues.map((i) => i.path).join(',') : 'other'; }
      console.log(JSON.stringify({ exports: Object.keys(fw).sort(), parts: frame.parts.map((p) => p.name), summary: report.summary, refused }));
    `;
    writeFileSync(join(project, 'use.mjs'), script);
    const r = sh(process.execPath, ['use.mjs'], project);
    expect(r.code, r.out).toBe(0);
    const out = JSON.parse(r.out.trim().split('\n')[0]) as { exports: string[]; parts: string[]; summary: unknown; refused: string };
    for (const name of ['parseDesignText', 'validateDesign', 'designJsonSchema', 'buildFrame', 'buildAssembly', 'massBalance', 'hardwareList', 'assembledFrameModes', 'checkFrame', 'checkParts', 'importDxf', 'frameModes', 'makeVariant', 'quoteParts', 'quotePackage', 'woffToSfnt', 'partToDxf', 'partToSvg', 'frameOverviewSvg', 'setDesignValues', 'DesignError']) {
      expect(out.exports).toContain(name);
    }
    expect(out.parts).toEqual(['bottom-plate', 'arm', 'top-plate', 'brace', 'camera-side']);
    // The same report the CLI gives for the same design.
    expect(out.summary).toEqual((JSON.parse(runCli(['check', 'designs/tessel-5.yaml', '--json']).stdout) as { summary: unknown }).summary);
    // The same cut file `framewright build` writes.
    expect(runCli(['build', 'designs/tessel-5.yaml', '--out', join(tmp, 'cut')]).code).toBe(0);
    expect(readFileSync(join(project, 'bottom-plate.dxf'), 'utf8')).toBe(readFileSync(join(tmp, 'cut', 'bottom-plate.dxf'), 'utf8'));
    expect(out.refused).toBe('layout,props,motor,arms,body');
  });

  it('its `framewright` command runs from the installed package, with the code caches the build made', () => {
    // npm links the package's bin; the launcher finds its program scripts, their caches and the
    // shop profile from the installed folder (src/cli/packageRoot.ts), not from this repository.
    const bin = join(project, 'node_modules', '.bin', 'framewright');
    const help = sh(bin, ['--help'], project);
    expect(help.code, help.out).toBe(0);
    expect(help.out).toMatch(/^\s+check\b/m);
    const check = spawnSync(bin, ['check', 'node_modules/framewright/designs/tessel-5.yaml', '--json'], { cwd: project, encoding: 'utf8', env: { ...process.env, FRAMEWRIGHT_CODE_CACHE_STATUS: '1' } });
    expect(check.status, check.stderr).toBe(0);
    expect((JSON.parse(check.stdout) as { summary: unknown }).summary).toEqual((JSON.parse(runCli(['check', 'designs/tessel-5.yaml', '--json']).stdout) as { summary: unknown }).summary);
    // The same node that built the package runs it here, so V8 takes the cache.
    expect(check.stderr).toContain('code cache: {"check":"used"}');
    const quote = sh(bin, ['quote', 'node_modules/framewright/designs/tessel-5.yaml', '--qty', '2', '--out', join(tmp, 'quote'), '--date', '2025-01-01'], project);
    expect(quote.code, quote.out).toBe(0);
  });

  it('its types resolve through the exports map (a strict TypeScript consumer compiles, and a type error is caught)', () => {
    const tsc = join(REPO, 'node_modules', 'typescript', 'bin', 'tsc');
    const flags = ['--noEmit', '--strict', '--module', 'nodenext', '--moduleResolution', 'nodenext', '--target', 'es2022', '--skipLibCheck'];
    writeFileSync(
      join(project, 'typed.ts'),
      `import { buildFrame, checkFrame, parseDesignText, type CheckReport, type Frame } from 'framewright';
const frame: Frame = buildFrame(parseDesignText('name: x'));
const report: CheckReport = checkFrame(frame);
export const errors: number = report.summary.errors;
`,
    );
    const good = sh(process.execPath, [tsc, ...flags, 'typed.ts'], project);
    expect(good.code, good.out).toBe(0);
    writeFileSync(join(project, 'wrong.ts'), `import { buildFrame, parseDesignText } from 'framewright';\nexport const n: number = buildFrame(parseDesignText('')).name;\n`);
    const bad = sh(process.execPath, [tsc, ...flags, 'wrong.ts'], project);
    expect(bad.code).not.toBe(0);
    expect(bad.out).toMatch(/Type 'string' is not assignable to type 'number'/);
  });

  it("runs the README's library example: a wheelbase sweep printing all-up mass and the first frame mode", () => {
    writeFileSync(join(project, 'sweep.mjs'), readmeExample());
    const r = sh(process.execPath, ['sweep.mjs'], project);
    expect(r.code, r.out).toBe(0);
    const rows = [...r.out.matchAll(/^(\d+) mm: ([\d.]+) g all up, first frame mode (\d+) Hz, (.+)$/gm)].map((m) => ({ wb: Number(m[1]), massG: Number(m[2]), hz: Number(m[3]), what: m[4] }));
    expect(rows).toHaveLength(3);
    expect(rows[0].wb).toBeLessThan(rows[1].wb);
    expect(rows[1].wb).toBeLessThan(rows[2].wb);
    // Longer arms weigh more, and the frame's first mode (arms as cantilevers with their motors) falls.
    expect(rows[0].massG).toBeLessThan(rows[1].massG);
    expect(rows[1].massG).toBeLessThan(rows[2].massG);
    expect(rows[0].hz).toBeGreaterThan(rows[2].hz);
    for (const x of rows) expect(x.what).toMatch(/\(.+\)/);
    // The same wheelbase given to the CLI (the design on standard input) gives the same all-up mass.
    const text = setDesignValues(readFileSync(join(REPO, 'designs', 'tessel-5.yaml'), 'utf8'), { 'layout.wheelbaseMm': rows[1].wb });
    const build = JSON.parse(runCli(['build', '-', '--json', '--force', '--out', join(tmp, 'build')], text).stdout) as { massBalance: { massG: { allUp: number } } };
    expect(rows[1].massG).toBeCloseTo(build.massBalance.massG.allUp, 0);
  }, 180_000);
});
