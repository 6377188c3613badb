import { spawn } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DESIGNS_DIR, REPO, demoText } from '../helpers/demo.js';
import { runCli, STACK_LINE } from '../helpers/cli.js';

/** The demo with another wheelbase (the key's text replaced in place). */
const tesselWith = (mm: number): string => demoText('tessel-5.yaml').replace(/wheelbaseMm: [\d.]+/, `wheelbaseMm: ${mm}`);

/** Standard input (`-`), several designs for `check`, JSON errors on stdout with --json, and --watch. */

const tmp = mkdtempSync(join(tmpdir(), 'fw-inputs-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

const T5 = join(DESIGNS_DIR, 'tessel-5.yaml');
const M3 = join(DESIGNS_DIR, 'mote-3.yaml');

describe('a design from standard input (-)', () => {
  it('check - reports exactly what check FILE reports', () => {
    const fromFile = runCli(['check', T5, '--json']);
    const fromStdin = runCli(['check', '-', '--json'], demoText('tessel-5.yaml'));
    expect(fromStdin.code).toBe(fromFile.code);
    expect(JSON.parse(fromStdin.stdout)).toEqual(JSON.parse(fromFile.stdout));
  });

  it('build - writes the same files as build FILE', () => {
    const a = join(tmp, 'from-file');
    const b = join(tmp, 'from-stdin');
    expect(runCli(['build', T5, '--out', a]).code).toBe(0);
    const r = runCli(['build', '-', '--out', b], demoText('tessel-5.yaml'));
    expect(r.code).toBe(0);
    for (const f of ['arm.dxf', 'bottom-plate.svg', 'overview.svg']) expect(readFileSync(join(b, f))).toEqual(readFileSync(join(a, f)));
  });

  it('bad input on standard input: exit 2, the parameter named, no stack trace', () => {
    const r = runCli(['check', '-'], tesselWith(20));
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('layout.wheelbaseMm');
    expect(r.stderr).not.toMatch(STACK_LINE);
  });

  it('- twice is refused', () => {
    const r = runCli(['check', '-', '-'], '');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/only once/);
  });
});

describe('check with several designs', () => {
  it('text: one report after the other, exit code of the worst', () => {
    const r = runCli(['check', T5, M3]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('framewright check: Tessel 5');
    expect(r.stdout).toContain('framewright check: Mote 3');
  });

  it('--json: an array of the single reports, each with its input', () => {
    const both = JSON.parse(runCli(['check', T5, M3, '--json']).stdout) as Array<Record<string, unknown>>;
    const one = JSON.parse(runCli(['check', M3, '--json']).stdout) as Record<string, unknown>;
    expect(both.map((r) => r.input)).toEqual([T5, M3]);
    const { input: _input, ...second } = both[1];
    expect(second).toEqual(one);
  });

  it('a bad input among good ones: the others are still checked, exit 2, its error in the array', () => {
    const bad = join(tmp, 'bad.yaml');
    writeFileSync(bad, demoText('mote-3.yaml').replace('  widthMm: 12\n', '  widthMm: -3\n'));
    const r = runCli(['check', T5, bad, M3, '--json']);
    expect(r.code).toBe(2);
    const out = JSON.parse(r.stdout) as Array<{ input: string; error?: { message: string; path: string }; summary?: unknown }>;
    expect(out.map((x) => x.input)).toEqual([T5, bad, M3]);
    expect(out[0].summary).toBeDefined();
    expect(out[2].summary).toBeDefined();
    expect(out[1].error?.path).toMatch(/^arms\./);
  });

  it('--annotate gives each input its own folder', () => {
    const dir = join(tmp, 'ann');
    expect(runCli(['check', T5, M3, '--annotate', dir]).code).toBe(0);
    expect(existsSync(join(dir, 'tessel-5', 'overview.check.svg'))).toBe(true);
    expect(existsSync(join(dir, 'mote-3', 'overview.check.svg'))).toBe(true);
  });
});

describe('--json failures print { "error": { "message", "path" } } on stdout', () => {
  const cases: Array<[string, string[], string | undefined, RegExp]> = [
    ['check, a value out of range', ['check', '-', '--json'], demoText('tessel-5.yaml').replace('thicknessMm: 5', 'thicknessMm: 50'), /^arms\.thicknessMm$/],
    ['build, a missing file', ['build', join(tmp, 'none.yaml'), '--json'], undefined, /none\.yaml$/],
    ['quote, a bad option', ['quote', T5, '--qty', '0', '--json'], undefined, /^--qty$/],
    ['variant, a bad prop size', ['variant', T5, '--props', 'big', '--json'], undefined, /.*/],
    ['modes, an unknown option', ['modes', T5, '--json', '--frobnicate'], undefined, /^$/],
  ];
  for (const [what, args, input, path] of cases) {
    it(what, () => {
      const r = runCli(args, input);
      expect(r.code).toBe(2);
      const j = JSON.parse(r.stdout) as { error: { message: string; path: string } };
      expect(typeof j.error.message).toBe('string');
      expect(j.error.message.length).toBeGreaterThan(5);
      expect(j.error.path).toMatch(path);
      expect(r.stdout).not.toMatch(STACK_LINE);
    });
  }
});

/** Run the CLI in the background and wait until its output matches. */
function background(args: string[]) {
  const p = spawn(process.execPath, [join(REPO, 'dist', 'cli', 'main.js'), ...args], { cwd: REPO, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  p.stdout.on('data', (c: Buffer) => (out += c.toString()));
  p.stderr.on('data', (c: Buffer) => (out += c.toString()));
  const waitFor = (re: RegExp, count = 1): Promise<void> =>
    new Promise((resolve, reject) => {
      const t = setTimeout(() => reject(new Error(`timed out waiting for ${re}:\n${out}`)), 30_000);
      const look = (): void => {
        if ((out.match(new RegExp(re.source, 'g')) ?? []).length >= count) {
          clearTimeout(t);
          resolve();
        } else setTimeout(look, 50);
      };
      look();
    });
  const exited = new Promise<number | null>((resolve) => p.once('exit', (c) => resolve(c)));
  return { p, out: () => out, waitFor, exited };
}

describe('--watch', () => {
  it('check --watch runs again when the file is saved, reports a bad save and goes on', async () => {
    const design = join(tmp, 'watched.yaml');
    copyFileSync(T5, design);
    const w = background(['check', design, '--watch']);
    await w.waitFor(/watching/);
    expect(w.out()).toContain('framewright check: Tessel 5');
    // A save by rename (as editors do) with a new wheelbase: checked again.
    writeFileSync(`${design}.new`, tesselWith(250));
    renameSync(`${design}.new`, design);
    await w.waitFor(/watching/, 2);
    expect(w.out()).toContain('changed; running again');
    // A bad save is reported, the watch continues.
    writeFileSync(design, tesselWith(5));
    await w.waitFor(/watching/, 3);
    expect(w.out()).toContain('layout.wheelbaseMm');
    expect(w.p.exitCode).toBeNull();
    w.p.kill('SIGINT');
    // The last run had bad input: exit 2.
    expect(await w.exited).toBe(2);
  });

  it('build --watch rebuilds the cut files when the design changes', async () => {
    const design = join(tmp, 'built.yaml');
    const out = join(tmp, 'built-out');
    copyFileSync(T5, design);
    const w = background(['build', design, '--out', out, '--watch']);
    await w.waitFor(/watching/);
    const before = readFileSync(join(out, 'overview.svg'), 'utf8');
    writeFileSync(design, tesselWith(240));
    await w.waitFor(/watching/, 2);
    expect(readFileSync(join(out, 'overview.svg'), 'utf8')).not.toBe(before);
    w.p.kill('SIGTERM');
    expect(await w.exited).toBe(0);
  });

  it('standard input cannot be watched', () => {
    const r = runCli(['check', '-', '--watch'], demoText('tessel-5.yaml'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/cannot be watched/);
  });
});
