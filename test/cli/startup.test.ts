import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { REPO } from '../helpers/demo.js';
import { runCli } from '../helpers/cli.js';

const DIST = join(REPO, 'dist');

/** Static import and re-export specifiers of a compiled module (type-only imports are gone after tsc). */
function staticImports(file: string): string[] {
  const src = readFileSync(file, 'utf8');
  const out: string[] = [];
  for (const m of src.matchAll(/^\s*(?:import|export)\s+(?:[^'"`;]*?\s+from\s+)?['"]([^'"]+)['"]/gm)) out.push(m[1]);
  return out;
}

/** Every module `framewright` loads before a command runs: the static import graph of dist/cli/main.js. */
function startupGraph(): { modules: Map<string, string[]>; packages: Set<string> } {
  const modules = new Map<string, string[]>();
  const packages = new Set<string>();
  const todo = [join(DIST, 'cli', 'main.js')];
  while (todo.length) {
    const file = todo.pop()!;
    if (modules.has(file)) continue;
    const specs = staticImports(file);
    modules.set(file, specs);
    for (const s of specs) {
      if (s.startsWith('.')) todo.push(resolve(dirname(file), s));
      else if (!s.startsWith('node:')) packages.add(s.startsWith('@') ? s.split('/').slice(0, 2).join('/') : s.split('/')[0]);
    }
  }
  return { modules, packages };
}

describe('start-up loads only the command line (lazy imports, DEVELOPERS.md "How to add a command")', () => {
  it('the built CLI exists (npm test builds it first)', () => {
    expect(existsSync(join(DIST, 'cli', 'main.js'))).toBe(true);
  });

  it('no npm package but the argument parser is loaded before a command runs', () => {
    const { packages } = startupGraph();
    expect([...packages].sort()).toEqual(['commander']);
  });

  it('every module loaded at start-up is the command line itself or a module that imports nothing', () => {
    const { modules } = startupGraph();
    const heavy = [...modules]
      .filter(([file, specs]) => !file.startsWith(join(DIST, 'cli') + '/') && specs.length > 0)
      .map(([file, specs]) => `${relative(DIST, file)} imports ${specs.join(', ')}`);
    // A failure here means a command file imports a stage at the top: move it into the action with `await import()`.
    expect(heavy).toEqual([]);
    expect(modules.size).toBeGreaterThan(8);
  });

  it('--help lists every command and exits 0', () => {
    const r = runCli(['--help']);
    expect(r.code).toBe(0);
    for (const c of ['build', 'check', 'variant', 'quote', 'modes', 'schema']) expect(r.stdout).toMatch(new RegExp(`^\\s+${c}\\b`, 'm'));
  });
});
