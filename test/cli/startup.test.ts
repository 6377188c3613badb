import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { REPO } from '../helpers/demo.js';
import { runCli } from '../helpers/cli.js';

const DIST = join(REPO, 'dist');

/** What scripts/bundle-cli.mjs records: each output file's sources and the outputs it imports statically. */
type BundleRecord = {
  outputs: Record<string, { inputs: string[]; imports: string[] }>;
  staticImportsOfSource: Record<string, number>;
};

/** Every source `framewright` loads before a command runs: the sources of the outputs statically reachable from dist/cli/main.js. */
function startupSources(): { sources: string[]; record: BundleRecord } {
  const record = JSON.parse(readFileSync(join(DIST, 'cli', 'bundle.json'), 'utf8')) as BundleRecord;
  const seen = new Set<string>();
  const todo = ['cli/main.js'];
  while (todo.length) {
    const file = todo.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    const out = record.outputs[file];
    if (!out) throw new Error(`${file} is not in dist/cli/bundle.json`);
    todo.push(...out.imports);
  }
  return { sources: [...new Set([...seen].flatMap((f) => record.outputs[f].inputs))].sort(), record };
}

/** The npm package a source belongs to, or null for this project's own sources. */
const packageOf = (source: string): string | null => {
  const m = /node_modules\/((?:@[^/]+\/)?[^/]+)\//.exec(source);
  return m ? m[1] : null;
};

describe('start-up loads only the command line (lazy imports, DEVELOPERS.md "How to add a command")', () => {
  it('the built CLI exists (npm test builds it first)', () => {
    expect(existsSync(join(DIST, 'cli', 'main.js'))).toBe(true);
  });

  it('no npm package but the argument parser is loaded before a command runs', () => {
    const { sources } = startupSources();
    expect([...new Set(sources.map(packageOf).filter((p) => p !== null))].sort()).toEqual(['commander']);
  });

  it('every source loaded at start-up is the command line itself or a module that imports nothing', () => {
    const { sources, record } = startupSources();
    const heavy = sources
      .filter((s) => packageOf(s) === null && !s.startsWith('src/cli/') && record.staticImportsOfSource[s] > 0)
      .map((s) => `${s} imports ${record.staticImportsOfSource[s]} module(s)`);
    // A failure here means a command file imports a stage at the top: move it into the action with `await import()`.
    expect(heavy).toEqual([]);
    expect(sources.filter((s) => s.startsWith('src/cli/')).length).toBeGreaterThan(8);
  });

  it('the stages are in the bundle, in chunks loaded by the commands that run them', () => {
    const { sources, record } = startupSources();
    const all = new Set(Object.values(record.outputs).flatMap((o) => o.inputs));
    for (const stage of ['src/geometry/frame.ts', 'src/checks/report.ts', 'src/assembly/build.ts', 'src/quote/quote.ts', 'src/live/server.ts']) {
      expect(all.has(stage), stage).toBe(true);
      expect(sources, stage).not.toContain(stage);
    }
  });

  it('--help lists every command and exits 0', () => {
    const r = runCli(['--help']);
    expect(r.code).toBe(0);
    for (const c of ['build', 'check', 'variant', 'quote', 'modes', 'schema']) expect(r.stdout).toMatch(new RegExp(`^\\s+${c}\\b`, 'm'));
  });
});
