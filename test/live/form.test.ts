import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { designJsonSchema } from '../../src/params/jsonSchema.js';
import { designForm, humanLabel, schemaAt, valueFromText, type FormField, type FormSection, type SchemaNode } from '../../src/live/form.js';
import { splitPath } from '../../src/live/session.js';
import { DEMO_FILES, demoText } from '../helpers/demo.js';

const schema = designJsonSchema() as SchemaNode;

const fieldsOf = (sections: readonly FormSection[]): FormField[] => sections.flatMap((s) => [...s.fields, ...fieldsOf(s.sections)]);

/**
 * The leaves of the JSON Schema (as zod wrote it) for a given design value, walked here without the
 * form's code: maps by `properties`, `oneOf` by the value's discriminator, lists of maps and named entries
 * item by item as the design has them; everything else is one leaf.
 */
function schemaLeaves(n: SchemaNode, value: unknown, path: string, out: string[]): void {
  const at = (k: string | number): string => (path ? `${path}.${k}` : String(k));
  if (n.oneOf) {
    // the discriminator: the key every alternative fixes (kind, or construction for arms); absent, the defaulted one
    const alts = n.oneOf;
    const key = Object.keys(alts[0].properties ?? {}).find((k) => alts.every((a) => a.properties?.[k]?.const !== undefined))!;
    const kind = (value as Record<string, unknown> | undefined)?.[key];
    const alt = alts.find((a) => a.properties?.[key]?.const === kind) ?? alts.find((a) => a.properties?.[key]?.default !== undefined) ?? alts[0];
    return schemaLeaves(alt, value, path, out);
  }
  const rec = (value ?? {}) as Record<string, unknown>;
  if (n.properties) {
    for (const [k, c] of Object.entries(n.properties)) if (k !== '$schema') schemaLeaves(c, rec[k], at(k), out);
    return;
  }
  if (n.type === 'object' && typeof n.additionalProperties === 'object') {
    for (const name of Object.keys(rec)) schemaLeaves(n.additionalProperties, rec[name], at(name), out);
    return;
  }
  const items = typeof n.items === 'object' ? n.items : null;
  if (n.type === 'array' && items && !items.prefixItems && (items.properties || items.oneOf)) {
    (Array.isArray(value) ? value : []).forEach((v, i) => schemaLeaves(items, v, at(i), out));
    return;
  }
  out.push(path);
}

describe('the form generated from the design schema', () => {
  for (const file of DEMO_FILES) {
    it(`${file}: one field for every value the schema allows, no more`, () => {
      const raw = YAML.parse(demoText(file));
      const leaves: string[] = [];
      schemaLeaves(schema, raw, '', leaves);
      const fields = fieldsOf(designForm(schema, raw)).map((f) => f.path);
      expect([...fields].sort()).toEqual([...leaves].sort());
      // Every value the file holds shows as its text.
      const byPath = new Map(fieldsOf(designForm(schema, raw)).map((f) => [f.path, f]));
      expect(byPath.get('name')?.text).toBe(raw.name);
      expect(byPath.get('body.lengthMm')?.text).toBe(String(raw.body.lengthMm));
    });
  }

  it('carries unit, range, meaning, default and whether the value is required, as the schema states them', () => {
    const raw = YAML.parse(demoText('tessel-5.yaml'));
    const f = new Map(fieldsOf(designForm(schema, raw)).map((x) => [x.path, x]));
    const wb = f.get('layout.wheelbaseMm')!;
    expect([wb.input, wb.unit, wb.min, wb.max, wb.required, wb.text]).toEqual(['number', 'mm', 60, 1000, true, String(raw.layout.wheelbaseMm)]);
    expect(wb.description).toBe('diagonal motor-to-motor distance');
    const angle = f.get('layout.armAngleDeg')!;
    expect([angle.unit, angle.defaultText, angle.required]).toEqual(['deg', '45', false]);
    const kind = f.get('layout.kind')!;
    expect([kind.input, kind.options]).toEqual(['select', ['x', 'h', 'asymmetric']]);
    const count = f.get('arms.root.boltCount')!;
    expect([count.integer, count.min, count.max]).toEqual([true, 1, 4]);
    const width = f.get('camera.widthMm')!;
    expect([width.input, width.options, width.text]).toEqual(['text', ['nano', 'micro', 'mini'], 'micro']);
    const circle = f.get('motor.boltCircleMm')!;
    expect([circle.input, circle.text]).toEqual(['text', '[16]']);
    // Lists as YAML flow text, read back by the yaml package as the same list.
    expect(YAML.parse(f.get('body.standoffs.positionsMm')!.text)).toEqual(raw.body.standoffs.positionsMm);
    expect(f.get('checks.web-width.minMm')).toMatchObject({ present: false, defaultText: '1.5', unit: 'mm' });
  });

  it('sections follow the schema, with lists item by item and named materials', () => {
    const raw = YAML.parse(demoText('tessel-5.yaml'));
    const form = designForm(schema, raw);
    // The schema's own order of its top-level maps and lists of maps (name and revision are fields of the first section).
    const sectionKeys = Object.entries(schema.properties ?? {}).filter(([, n]) => n.type === 'object' || n.oneOf || (n.type === 'array' && typeof n.items === 'object' && (n.items.properties || n.items.oneOf))).map(([k]) => k);
    expect(form.map((s) => s.path)).toEqual(['', ...sectionKeys]);
    const stacks = form.find((s) => s.path === 'stacks')!;
    expect(stacks.sections.map((s) => s.title)).toEqual(['stack 1']);
    expect(form.find((s) => s.path === 'materials')!.sections.map((s) => s.path)).toEqual(['materials.woven-cf']);
  });

  it('labels drop the unit suffix and split words', () => {
    expect(['wheelbaseMm', 'armAngleDeg', 'densityGPerCm3', 'e1Gpa', 'topPlate', 'web-width', 'massG'].map(humanLabel)).toEqual(['wheelbase', 'arm angle', 'density', 'e1', 'top plate', 'web width', 'mass']);
  });
});

describe('field text to design values, by the schema', () => {
  const node = (path: string): SchemaNode => schemaAt(schema, splitPath(path), YAML.parse(demoText('tessel-5.yaml')))!;
  const cases: Array<[string, string, unknown]> = [
    ['layout.wheelbaseMm', '230', 230],
    ['layout.wheelbaseMm', ' 230.5 ', 230.5],
    ['layout.wheelbaseMm', 'abc', 'abc'], // left as text: the schema then names the range
    ['layout.wheelbaseMm', '', undefined], // empty: remove the key
    ['props.diameter', '5.1in', '5.1in'],
    ['props.diameter', '127', 127],
    ['motor.boltCircleMm', '16, 19', [16, 19]],
    ['motor.boltCircleMm', '[16]', [16]],
    ['motor.boltCircleMm', '12', [12]],
    ['body.standoffs.positionsMm', '[[50, 15], [-50, -15]]', [[50, 15], [-50, -15]]],
    ['stacks.0.place', 'front', 'front'],
    ['stacks.0.place', '-12', -12],
    ['stacks.0.boltSize', 'M3', 'M3'],
    ['stacks.0.boltSize', '[M3, M2]', ['M3', 'M2']],
    ['camera.widthMm', 'micro', 'micro'],
    ['camera.widthMm', '19', 19],
    ['arms.construction', 'unibody', 'unibody'],
    ['checks.web-width.enabled', 'false', false],
    ['name', '42', '42'],
  ];
  for (const [path, text, value] of cases) {
    it(`${path} ← ${JSON.stringify(text)}`, () => expect(valueFromText(node(path), text)).toEqual(value));
  }

  it('list text that is not YAML is refused with an example', () => {
    expect(() => valueFromText(node('body.standoffs.positionsMm'), '[[50, 15')).toThrow(/list like/);
  });

  it('paths that are not fields of the design resolve to nothing', () => {
    const raw = YAML.parse(demoText('tessel-5.yaml'));
    for (const p of ['__proto__', 'constructor', 'layout.nonsense', 'layout.front', 'materials.__proto__', 'stacks.x', 'name.length', 'toString']) {
      expect(schemaAt(schema, splitPath(p), raw), p).toBeNull();
    }
    expect(schemaAt(schema, splitPath('materials.new-weave.e1Gpa'), raw)?.type).toBe('number');
    expect(schemaAt(schema, splitPath('stacks.3.yMm'), raw)?.type).toBe('number');
  });
});
