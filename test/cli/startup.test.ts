import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { REPO } from '../helpers/demo.js';
import { runCli } from '../helpers/cli.js';

const DIST = join(REPO, 'dist');

/** What scripts/bundle-cli.mjs records: for each program script, its sources and how many modules each imports. */
type BundleRecord = Record<'help' | 'check' | 'full', Record<string, number>>;

const bundleRecord = (): BundleRecord => JSON.parse(readFileSync(join(DIST, 'cli', 'bundle.json'), 'utf8')) as BundleRecord;

/** The npm package a source belongs to, or null for this project's own sources. */
const packageOf = (source: string): string | null => {
  const m = /node_modules\/((?:@[^/]+\/)?[^/]+)\//.exec(source);
  return m ? m[1] : null;
};

describe('start-up loads only the command line (lazy imports, DEVELOPERS.md "How to add a command")', () => {
  it('the built CLI exists (npm test builds it first)', () => {
    expect(existsSync(join(DIST, 'cli', 'main.js'))).toBe(true);
  });

  it('the help program holds no npm package but the argument parser', () => {
    const help = Object.keys(bundleRecord().help);
    expect([...new Set(help.map(packageOf).filter((p) => p !== null))].sort()).toEqual(['commander']);
  });

  it('every source of the help program is the command line itself or a module that imports nothing', () => {
    const help = bundleRecord().help;
    const heavy = Object.entries(help)
      .filter(([s, imports]) => packageOf(s) === null && !s.startsWith('src/cli/') && imports > 0)
      .map(([s, imports]) => `${s} imports ${imports} module(s)`);
    // A failure here means a command file imports a stage at the top: move it into the action with `await import()`.
    expect(heavy).toEqual([]);
    expect(Object.keys(help).filter((s) => s.startsWith('src/cli/')).length).toBeGreaterThan(8);
  });

  it('the stages are in the full program only', () => {
    const { help, full } = bundleRecord();
    for (const stage of ['src/geometry/frame.ts', 'src/checks/report.ts', 'src/assembly/build.ts', 'src/quote/quote.ts', 'src/live/server.ts', 'src/params/schema.ts']) {
      expect(Object.keys(full), stage).toContain(stage);
      expect(Object.keys(help), stage).not.toContain(stage);
    }
  });

  it('the check program (src/cli/program.ts) holds what `check` runs and not the stages of other commands', () => {
    const check = Object.keys(bundleRecord().check);
    for (const stage of ['src/geometry/frame.ts', 'src/checks/report.ts', 'src/assembly/build.ts', 'src/import/importDxf.ts']) expect(check, stage).toContain(stage);
    // Quotes, nesting, the live page, variants and the finite-element solver belong to other commands: the full program.
    expect(check.filter((s) => /^src\/(quote|live|variant)\/|^src\/analysis\/(?!defaults\.ts)/.test(s))).toEqual([]);
    expect(check.filter((s) => packageOf(s) === '@kninnug/constrainautor' || packageOf(s) === 'delaunator')).toEqual([]);
  });

  it('--help lists every command and exits 0', () => {
    const r = runCli(['--help']);
    expect(r.code).toBe(0);
    for (const c of ['build', 'check', 'variant', 'quote', 'modes', 'schema']) expect(r.stdout).toMatch(new RegExp(`^\\s+${c}\\b`, 'm'));
  });
});
