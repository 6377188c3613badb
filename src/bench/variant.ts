import { readFileSync } from 'node:fs';
import { makeVariant, type VariantResult } from '../variant/index.js';
import type { BenchCase } from './types.js';

const demo = (name: string) => () => readFileSync(new URL(`../../designs/${name}.yaml`, import.meta.url), 'utf8');

export const cases: BenchCase[] = [
  {
    name: 'variant tessel-5 → 7in (motor, wheelbase, body, arm rule, build, every check)',
    target: 'under 1 s for one size',
    budgetMs: 1000,
    setup: demo('tessel-5'),
    run: (text) => makeVariant(text as string, { props: '7in' }),
    note: (r) => {
      const v = r as VariantResult;
      return `wheelbase ${v.wheelbase.chosenMm} mm, arm f1 ${v.arms.measure.frequencyHz.toFixed(1)} Hz (asked ${v.arms.rule.requiredHz.toFixed(1)}), ${v.report.summary.errors} check errors`;
    },
  },
  {
    name: 'size range tessel-5 → 3,4,5,6,7in with every check',
    target: 'under 2 s for the range of five',
    budgetMs: 2000,
    setup: demo('tessel-5'),
    run: (text) => ['3in', '4in', '5in', '6in', '7in'].map((props) => makeVariant(text as string, { props })),
    note: (r) => `${(r as VariantResult[]).length} sizes, ${(r as VariantResult[]).reduce((s, v) => s + v.report.summary.errors, 0)} check errors, masses ${(r as VariantResult[]).map((v) => v.massG.toFixed(0)).join('/')} g`,
  },
];
