import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { buildFrame, type Frame } from '../../src/geometry/index.js';
import { parseDesignText, type Design } from '../../src/params/index.js';

export const REPO = join(import.meta.dirname, '..', '..');
export const DESIGNS_DIR = join(REPO, 'designs');

/** Every demo design file (frame designs only; shop profiles and other YAML are left out). */
export const DEMO_FILES = readdirSync(DESIGNS_DIR)
  .filter((f) => f.endsWith('.yaml') && !f.includes('shop'))
  .sort();

export const demoText = (file: string): string => readFileSync(join(DESIGNS_DIR, file), 'utf8');
export const demoDesign = (file: string): Design => parseDesignText(demoText(file));
export const demoFrame = (file: string): Frame => buildFrame(demoDesign(file));

/** A demo design with some fields changed (deep merge of plain objects), as text is not needed. */
export function designWith(file: string, patch: Record<string, unknown>): Record<string, unknown> {
  const base = JSON.parse(JSON.stringify(parseYamlRaw(file))) as Record<string, unknown>;
  return merge(base, patch);
}

import YAML from 'yaml';
const parseYamlRaw = (file: string): unknown => YAML.parse(demoText(file));

function merge(a: Record<string, unknown>, b: Record<string, unknown>): Record<string, unknown> {
  for (const [k, v] of Object.entries(b)) {
    const cur = a[k];
    if (v && typeof v === 'object' && !Array.isArray(v) && cur && typeof cur === 'object' && !Array.isArray(cur)) {
      a[k] = merge(cur as Record<string, unknown>, v as Record<string, unknown>);
    } else if (v === undefined) {
      delete a[k];
    } else {
      a[k] = v;
    }
  }
  return a;
}
