import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { importDxf, type ImportOptions, type ImportResult } from '../../src/import/index.js';
import { REPO } from '../helpers/demo.js';

export const FIXTURES = join(REPO, 'test', 'fixtures', 'dxf');
export const fixturePath = (name: string): string => join(FIXTURES, name);
export const fixtureText = (name: string): string => readFileSync(fixturePath(name), 'latin1');

/** Import a committed fixture (written by python3-ezdxf, see make_fixtures.py). */
export function importFixture(name: string, options: Partial<ImportOptions> = {}): ImportResult {
  return importDxf(fixtureText(name), { name: name.replace(/\.dxf$/, ''), thicknessMm: 2, ...options });
}

export const rules = (r: ImportResult): string[] => r.findings.map((f) => f.rule);
