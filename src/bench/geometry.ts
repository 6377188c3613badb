import { readFileSync } from 'node:fs';
import { buildFrame } from '../geometry/index.js';
import { parseDesignText } from '../params/index.js';
import type { BenchCase } from './types.js';

const DEMOS = ['tessel-5', 'mote-3', 'farline-7'];

export const cases: BenchCase[] = DEMOS.map((name) => ({
  name: `build ${name} (parse + all plates)`,
  target: 'under 1 s per design',
  budgetMs: 1000,
  setup: () => readFileSync(new URL(`../../designs/${name}.yaml`, import.meta.url), 'utf8'),
  run: (text) => buildFrame(parseDesignText(text as string)),
}));
