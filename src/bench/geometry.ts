import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildFrame } from '../geometry/index.js';
import { parseDesignText } from '../params/index.js';
import { buildOutputs } from '../cli/commands/build.js';
import type { BenchCase } from './types.js';

const DEMOS = ['tessel-5', 'mote-3', 'farline-7'];
const designPath = (name: string) => fileURLToPath(new URL(`../../designs/${name}.yaml`, import.meta.url));
const cliPath = fileURLToPath(new URL('../cli/framewright.cjs', import.meta.url));

export const cases: BenchCase[] = [
  ...DEMOS.map((name) => ({
    name: `build ${name}: parse, all plates, DXF + SVG bytes`,
    target: 'under 1 s per design',
    budgetMs: 1000,
    setup: () => readFileSync(designPath(name), 'utf8'),
    run: async (text: unknown) => (await buildOutputs(buildFrame(parseDesignText(text as string)), 'out', {})).files.length,
    note: (n: unknown) => `${String(n)} files`,
  })),
  {
    name: 'CLI build tessel-5: process start to files on disk',
    target: 'under 1 s',
    budgetMs: 1000,
    setup: () => mkdtempSync(join(tmpdir(), 'fw-bench-')),
    run: (dir: unknown) => spawnSync(process.execPath, [cliPath, 'build', designPath('tessel-5'), '--out', dir as string]).status,
    note: (code: unknown) => `exit ${String(code)}`,
  },
];
