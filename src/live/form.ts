import YAML from 'yaml';

/**
 * The live page's form, generated from the design file's JSON Schema and the values the file holds:
 * one section per map (nested for sub-maps, list items and named entries), one field per value with
 * its unit, range, meaning and default. Pure; the page only renders what this returns.
 */

/** The part of a JSON Schema node this module reads (as written by `designJsonSchema`). */
export type SchemaNode = Readonly<{
  type?: string | readonly string[];
  properties?: Readonly<Record<string, SchemaNode>>;
  required?: readonly string[];
  items?: SchemaNode | boolean;
  prefixItems?: readonly SchemaNode[];
  anyOf?: readonly SchemaNode[];
  oneOf?: readonly SchemaNode[];
  additionalProperties?: SchemaNode | boolean;
  enum?: readonly unknown[];
  const?: unknown;
  default?: unknown;
  description?: string;
  minimum?: number;
  maximum?: number;
}>;

export type FieldInput = 'number' | 'select' | 'checkbox' | 'text';

export type FormField = Readonly<{
  /** Dotted path in the design file, e.g. `layout.wheelbaseMm`, `stacks.0.place`. */
  path: string;
  key: string;
  label: string;
  input: FieldInput;
  /** `mm`, `deg`, `GPa`, … or '' for a plain number or text. */
  unit: string;
  min: number | null;
  max: number | null;
  /** Whole numbers only. */
  integer: boolean;
  /** select: the choices; text fields with named choices (e.g. camera width): suggestions. */
  options: readonly string[];
  /** The schema's meaning, without the bracketed unit and range. */
  description: string;
  /** `60 to 1000 mm`, or '' when the value has no numeric range. */
  range: string;
  /** The default as text ('' when there is none). */
  defaultText: string;
  /** The value in the file as text ('' when the key is absent). */
  text: string;
  present: boolean;
  required: boolean;
}>;

export type FormSection = Readonly<{
  path: string;
  title: string;
  description: string;
  present: boolean;
  fields: readonly FormField[];
  sections: readonly FormSection[];
}>;

const UNIT_SUFFIXES: ReadonlyArray<[RegExp, string]> = [
  [/GPerCm3$/, 'g/cm³'],
  [/Gpa$/, 'GPa'],
  [/Mm2$/, 'mm²'],
  [/Mm$/, 'mm'],
  [/Deg$/, 'deg'],
  [/Hz$/, 'Hz'],
  [/G$/, 'g'],
];

/** `wheelbaseMm` → `wheelbase`, `armAngleDeg` → `arm angle`, `topPlate` → `top plate`. */
export function humanLabel(key: string): string {
  let k = key;
  for (const [re] of UNIT_SUFFIXES) {
    if (re.test(k) && k.replace(re, '').length > 0) {
      k = k.replace(re, '');
      break;
    }
  }
  return k.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/-/g, ' ').toLowerCase();
}

/** The unit and range a schema description ends with: `… [mm, 60 to 1000]`. */
function bracket(description: string | undefined): { text: string; unit: string } {
  const d = description ?? '';
  const m = /\s*\[([^,\]]*),\s*(-?[0-9.]+) to (-?[0-9.]+)\]\s*$/.exec(d);
  if (m) return { text: d.slice(0, m.index), unit: m[1].trim() };
  const n = /\s*\[(-?[0-9.]+) to (-?[0-9.]+)\]\s*$/.exec(d);
  if (n) return { text: d.slice(0, n.index), unit: '' };
  return { text: d, unit: '' };
}

const isObjectNode = (n: SchemaNode): boolean => n.type === 'object' || !!n.properties || !!n.oneOf;

/** A value as the text a person edits: numbers and words as they are, lists as YAML flow text. */
export function valueText(v: unknown): string {
  if (v === undefined || v === null) return '';
  if (typeof v === 'string') return v;
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  return YAML.stringify(v, { collectionStyle: 'flow', flowCollectionPadding: false }).trim();
}

/** The number alternative of a node (itself, or in anyOf) with its range. */
function numberPart(n: SchemaNode): SchemaNode | null {
  if (n.type === 'number' || n.type === 'integer') return n;
  return n.anyOf?.find((a) => a.type === 'number' || a.type === 'integer') ?? null;
}

function enumPart(n: SchemaNode): readonly string[] {
  if (n.enum) return n.enum.map(String);
  const e = n.anyOf?.find((a) => a.enum);
  return e?.enum ? e.enum.map(String) : [];
}

function field(path: string, key: string, n: SchemaNode, value: unknown, required: boolean): FormField {
  const num = numberPart(n);
  const options = enumPart(n);
  const plainNumber = n.type === 'number' || n.type === 'integer';
  const input: FieldInput = n.type === 'boolean' ? 'checkbox' : plainNumber ? 'number' : n.enum || (n.type === 'string' && options.length) ? 'select' : 'text';
  const desc = bracket(n.description);
  const numDesc = num && num !== n ? bracket(num.description) : desc;
  const unit = desc.unit || numDesc.unit;
  const min = num?.minimum ?? null;
  const max = num?.maximum ?? null;
  return {
    path,
    key,
    label: humanLabel(key),
    input,
    unit,
    min,
    max,
    integer: num?.type === 'integer',
    options,
    description: desc.text,
    range: min !== null && max !== null ? `${min} to ${max}${unit ? ` ${unit}` : ''}` : '',
    defaultText: n.default === undefined || (typeof n.default === 'object' && n.default !== null && !Array.isArray(n.default)) ? '' : valueText(n.default),
    text: valueText(value),
    present: value !== undefined,
    required,
  };
}

const asRecord = (v: unknown): Record<string, unknown> | undefined =>
  v !== null && typeof v === 'object' && !Array.isArray(v) ? (v as Record<string, unknown>) : undefined;

/** The key every alternative of a `oneOf` fixes to a constant: `kind` (layouts, components) or `construction` (arms). */
export function discriminatorOf(n: SchemaNode): string {
  const alts = n.oneOf ?? [];
  return Object.keys(alts[0]?.properties ?? {}).find((k) => alts.every((a) => a.properties?.[k]?.const !== undefined)) ?? 'kind';
}

/**
 * The alternative of a `oneOf` that the value names by its discriminator; when it names none, the
 * one whose discriminator is the default (arms are separate unless said), else the first.
 */
export function chooseKind(n: SchemaNode, value: unknown): SchemaNode {
  const alts = n.oneOf ?? [];
  const key = discriminatorOf(n);
  const kind = asRecord(value)?.[key];
  return alts.find((a) => a.properties?.[key]?.const === kind) ?? alts.find((a) => a.properties?.[key]?.default !== undefined) ?? alts[0] ?? n;
}

function section(path: string, title: string, n0: SchemaNode, value: unknown): FormSection {
  const n = n0.oneOf ? chooseKind(n0, value) : n0;
  const rec = asRecord(value);
  const fields: FormField[] = [];
  const sections: FormSection[] = [];
  const at = (k: string | number): string => (path ? `${path}.${k}` : String(k));
  const key = n0.oneOf ? discriminatorOf(n0) : null;
  if (n0.oneOf && key) {
    const kinds = n0.oneOf.map((a) => String(a.properties?.[key]?.const ?? ''));
    const kindNode: SchemaNode = { type: 'string', enum: kinds, description: n0.oneOf.map((a) => `${String(a.properties?.[key]?.const)}: ${a.properties?.[key]?.description ?? ''}`).join('; ') };
    fields.push(field(at(key), key, kindNode, rec?.[key], !n0.oneOf.some((a) => a.properties?.[key]?.default !== undefined)));
  }
  for (const [k, child] of Object.entries(n.properties ?? {})) {
    if (k === '$schema' || k === key) continue;
    const v = rec?.[k];
    const required = (n.required ?? []).includes(k);
    const items = typeof child.items === 'object' ? child.items : null;
    if (isObjectNode(child) && !child.anyOf) {
      if (child.additionalProperties && typeof child.additionalProperties === 'object') {
        sections.push(namedEntries(at(k), k, child, child.additionalProperties, v));
      } else {
        sections.push(section(at(k), humanLabel(k), child, v));
      }
    } else if (child.type === 'array' && items && isObjectNode(items) && !items.prefixItems) {
      sections.push(listSection(at(k), k, child, items, v));
    } else {
      fields.push(field(at(k), k, child, v, required));
    }
  }
  return { path, title, description: bracket(n0.description ?? n.description).text, present: value !== undefined, fields, sections };
}

/** A list of maps (stacks, holes, cut-outs): one section per item in the file. */
function listSection(path: string, key: string, n: SchemaNode, items: SchemaNode, value: unknown): FormSection {
  const list = Array.isArray(value) ? value : [];
  const singular = humanLabel(key).replace(/s$/, '');
  return {
    path,
    title: humanLabel(key),
    description: bracket(n.description).text,
    present: value !== undefined,
    fields: [],
    sections: list.map((v, i) => section(`${path}.${i}`, `${singular} ${i + 1}`, items, v)),
  };
}

/** A map of named entries (materials): one section per name in the file. */
function namedEntries(path: string, key: string, n: SchemaNode, entry: SchemaNode, value: unknown): FormSection {
  const rec = asRecord(value) ?? {};
  return {
    path,
    title: humanLabel(key),
    description: bracket(n.description).text,
    present: value !== undefined,
    fields: [],
    sections: Object.keys(rec).map((name) => section(`${path}.${name}`, name, entry, rec[name])),
  };
}

/**
 * The form for a design: top-level values (name, revision) first under "design", then one section
 * per top-level map in schema order. `raw` is the design as parsed from YAML (not validated), so a
 * file with errors still gets a form.
 */
export function designForm(schema: SchemaNode, raw: unknown): FormSection[] {
  const root = section('', 'design', schema, raw);
  const top: FormSection = { ...root, sections: [], title: 'design' };
  return [top, ...root.sections];
}

/**
 * The schema node that governs a dotted path, choosing `oneOf` kinds by the value at that place in
 * `raw`; null when the path names nothing the schema allows (the page may edit only real fields).
 */
export function schemaAt(schema: SchemaNode, path: readonly (string | number)[], raw: unknown): SchemaNode | null {
  let n: SchemaNode = schema;
  let v: unknown = raw;
  for (const seg of path) {
    if (n.oneOf) n = chooseKind(n, v);
    let next: SchemaNode | null = null;
    if (typeof seg === 'number') {
      if (n.prefixItems) next = n.prefixItems[seg] ?? null;
      else if (n.type === 'array' && typeof n.items === 'object') next = n.items;
    } else if (n.properties && Object.prototype.hasOwnProperty.call(n.properties, seg)) {
      next = n.properties[seg];
    } else if (n.additionalProperties && typeof n.additionalProperties === 'object' && !/^(__proto__|constructor|prototype)$/.test(seg)) {
      next = n.additionalProperties;
    }
    if (!next) return null;
    n = next;
    v = Array.isArray(v) || asRecord(v) ? (v as Record<string | number, unknown>)[seg] : undefined;
  }
  return n;
}

/** The text of a field could not be read as what the schema wants. */
export class FieldTextError extends Error {}

/**
 * A field's text as a design value, by its schema node: numbers for numeric text where a number is
 * allowed, words as they are, lists and points as YAML flow text (`[16, 19]`, `16, 19`, `[[50, 15],
 * [-50, 15]]`). An empty text means "remove the key" (undefined) so its default applies. Text that
 * is not a number where only a number is allowed is returned as text, so the schema reports it with
 * the range. Throws FieldTextError for list text that is not YAML.
 */
export function valueFromText(n: SchemaNode, text: string): unknown {
  const t = text.trim();
  if (t === '') return undefined;
  const numeric = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t);
  if (n.type === 'boolean') return t === 'true' ? true : t === 'false' ? false : t;
  if (n.type === 'number' || n.type === 'integer') return numeric ? Number(t) : t;
  if (n.type === 'string' || n.enum) return t;
  const alts = n.anyOf ?? [];
  const wantsList = n.type === 'array' || alts.some((a) => a.type === 'array');
  if (numeric && (numberPart(n) || wantsList)) return numberPart(n) ? Number(t) : [Number(t)];
  if (!wantsList && alts.some((a) => a.type === 'string')) return t;
  const source = wantsList && !/^[[{]/.test(t) && !(alts.some((a) => a.type === 'string') && /^[A-Za-z][\w.]*$/.test(t)) ? `[${t}]` : t;
  try {
    return YAML.parse(source);
  } catch {
    throw new FieldTextError(`is not a list like [16, 19] or [[50, 15], [50, -15]]`);
  }
}
