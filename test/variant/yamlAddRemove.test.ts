import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { editDesignText, setDesignValues } from '../../src/variant/changes.js';
import { DEMO_FILES, demoText } from '../helpers/demo.js';
import { yamlComments as comments } from '../helpers/yaml.js';

/**
 * Keys added and removed in place (the live page's edits): the `yaml` package's own parser must read
 * the result as the source object with exactly that key added or removed, and every comment and
 * every line not involved must stay as it was.
 */


/** The expected object: the source parsed, then changed with plain JavaScript. */
function changed(text: string, path: readonly (string | number)[], value: unknown): unknown {
  const obj = YAML.parse(text) as Record<string | number, unknown>;
  let at: Record<string | number, unknown> = obj;
  for (const k of path.slice(0, -1)) {
    at[k] ??= {};
    at = at[k] as Record<string | number, unknown>;
  }
  const last = path[path.length - 1];
  if (value === undefined) {
    if (Array.isArray(at)) at.splice(last as number, 1);
    else delete at[last];
  } else at[last] = value;
  return obj;
}

const SAMPLE = `# top comment
a: 1 # c1
b:
  c: 2   # c2
  d: [1, 2]
stacks:
  - place: middle # pl
    patternsMm: [30.5, 20]
  - { place: front, patternsMm: [20] }
m: { x: 1, y: 2, z: 3 }
e: 5 # last
`;

const CASES: Array<[string, readonly (string | number)[], unknown]> = [
  ['remove a top-level key', ['a'], undefined],
  ['remove a nested block key', ['b', 'c'], undefined],
  ['remove the first key of a list item', ['stacks', 0, 'place'], undefined],
  ['remove the first key of a flow map', ['stacks', 1, 'place'], undefined],
  ['remove the middle key of a flow map', ['m', 'y'], undefined],
  ['remove the last key of a flow map', ['m', 'z'], undefined],
  ['remove a block list item', ['stacks', 0], undefined],
  ['remove a flow list item', ['b', 'd', 0], undefined],
  ['add a key to a block map', ['b', 'q'], 7],
  ['add a key to a flow map', ['m', 'w'], 'hi'],
  ['add a key to a list item map', ['stacks', 0, 'yMm'], 3],
  ['add a key under a missing parent', ['n', 'o', 'p'], 1],
  ['append a list item', ['stacks', 2], { place: 'rear', patternsMm: [20] }],
  ['add a list at the end of the file', ['f'], [1, 2]],
];

describe('keys added and removed in place', () => {
  for (const [what, path, value] of CASES) {
    it(what, () => {
      const out = editDesignText(SAMPLE, [{ path, old: null, new: value, why: 'test' }]);
      expect(YAML.parse(out)).toEqual(changed(SAMPLE, path, value));
      // Comments survive, except one that sat on a removed line.
      const lost = comments(SAMPLE).filter((c) => !comments(out).includes(c));
      expect(lost.length).toBeLessThanOrEqual(value === undefined ? 1 : 0);
      // Lines that held no part of the edit are unchanged: the text differs in at most the edited lines.
      const before = SAMPLE.split('\n');
      const after = out.split('\n');
      const kept = before.filter((l) => after.includes(l)).length;
      expect(before.length - kept).toBeLessThanOrEqual(2);
    });
  }

  for (const file of DEMO_FILES) {
    it(`${file}: every optional key removed and set again gives back the file byte for byte`, () => {
      const src = demoText(file);
      for (const path of [['props', 'minTipGapMm'], ['cutting', 'holeSeries'], ['body', 'cornerRadiusMm']] as const) {
        const value = (YAML.parse(src) as Record<string, Record<string, unknown>>)[path[0]]?.[path[1]];
        if (value === undefined) continue;
        const without = editDesignText(src, [{ path, old: value, new: undefined, why: 'default' }]);
        expect(YAML.parse(without)).toEqual(changed(src, path, undefined));
        expect(comments(without)).toEqual(comments(src));
        const back = editDesignText(without, [{ path, old: undefined, new: value, why: 'again' }]);
        expect(YAML.parse(back)).toEqual(YAML.parse(src));
        // Appended at the end of its section, so the bytes match when it was the section's last key.
        if (src.split('\n').find((l) => l.trim().startsWith(`${path[1]}:`))) expect(comments(back)).toEqual(comments(src));
      }
    });
  }

  it('setDesignValues takes dotted paths, numbers as list indices, undefined to remove', () => {
    const out = setDesignValues(SAMPLE, { 'b.c': 9, 'stacks.1.place': 'rear', e: undefined });
    expect(YAML.parse(out)).toEqual({ ...YAML.parse(SAMPLE), b: { c: 9, d: [1, 2] }, stacks: [{ place: 'middle', patternsMm: [30.5, 20] }, { place: 'rear', patternsMm: [20] }], e: undefined });
    expect(out).toContain('  c: 9   # c2');
  });

  it('a JSON design stays JSON', () => {
    const json = JSON.stringify({ name: 'x', props: { diameter: '5in' } }, null, 2);
    const out = setDesignValues(json, { 'props.minTipGapMm': 8, name: undefined });
    expect(JSON.parse(out)).toEqual({ props: { diameter: '5in', minTipGapMm: 8 } });
  });
});
