import { readFileSync } from 'node:fs';
import { makeVariant, type VariantResult } from '../variant/index.js';
import type { BenchCase } from './types.js';

const demo = (name: string) => () => readFileSync(new URL(`../../designs/${name}.yaml`, import.meta.url), 'utf8');

export const cases: BenchCase[] = [
  {
    name: 'variant tessel-5 → 7in (wheelbase, body, arms, build)',
    target: 'under 1 s for one size',
    budgetMs: 1000,
    setup: demo('tessel-5'),
    run: (text) => makeVariant(text as string, { props: '7in' }),
    note: (r) => {
      const v = r as VariantResult;
      return `wheelbase ${v.wheelbase.chosenMm} mm, arm f1 ${v.arms.achieved.frequencyHz.toFixed(1)} Hz (source ${v.arms.targetHz.toFixed(1)})`;
    },
  },
  {
    name: 'variant family mote-3 → 3,4,5,6in (motor auto)',
    target: 'under 4 s for a family of four',
    budgetMs: 4000,
    setup: demo('mote-3'),
    run: (text) => ['3in', '4in', '5in', '6in'].map((props) => makeVariant(text as string, { props, motor: 'auto' })),
    note: (r) => `${(r as VariantResult[]).length} variants`,
  },
];
