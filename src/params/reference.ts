import { designJsonSchema } from './jsonSchema.js';

type Node = {
  type?: string | string[];
  properties?: Record<string, Node>;
  required?: string[];
  items?: Node | Node[];
  prefixItems?: Node[];
  anyOf?: Node[];
  oneOf?: Node[];
  additionalProperties?: Node | boolean;
  enum?: unknown[];
  const?: unknown;
  default?: unknown;
  description?: string;
  minimum?: number;
  maximum?: number;
};

type Row = { path: string; type: string; def: string; required: boolean; text: string };

/**
 * The design-file reference (README) generated from the same schema that validates designs, so
 * the documentation cannot drift from the code: every parameter with type, unit, range and default.
 */
export function designReferenceMarkdown(): string {
  const rows: Row[] = [];
  walk(designJsonSchema() as Node, '', true, rows);
  const lines = ['| parameter | type | default | meaning [unit, range] |', '|---|---|---|---|'];
  for (const r of rows) {
    lines.push(`| \`${r.path}\`${r.required ? ' *' : ''} | ${r.type} | ${r.def} | ${r.text.replace(/\|/g, '\\|')} |`);
  }
  return lines.join('\n');
}

function typeOf(n: Node): string {
  if (n.const !== undefined) return `\`${JSON.stringify(n.const)}\``;
  if (n.enum) return n.enum.map((e) => `\`${String(e)}\``).join(' / ');
  const alts = n.anyOf ?? n.oneOf;
  if (alts) return alts.map(typeOf).join(' or ');
  if (n.type === 'array') {
    if (n.prefixItems) return `[${n.prefixItems.map(typeOf).join(', ')}]`;
    if (n.items && !Array.isArray(n.items) && n.items.oneOf?.every((a) => a.properties?.kind?.const !== undefined)) return 'list of entries by kind';
    return `list of ${n.items && !Array.isArray(n.items) ? typeOf(n.items) : 'values'}`;
  }
  if (n.type === 'object' && !n.properties) return 'mapping';
  return Array.isArray(n.type) ? n.type.join(' / ') : (n.type ?? 'value');
}

/** The property every alternative of a union fixes to a constant (`kind`, `construction`), if any. */
function discriminator(alts: readonly Node[]): string | null {
  if (alts.length < 2) return null;
  const keys = Object.keys(alts[0].properties ?? {}).filter((k) => alts.every((a) => a.properties?.[k]?.const !== undefined));
  return keys[0] ?? null;
}

function walk(n: Node, path: string, required: boolean, rows: Row[]): void {
  if (path && path !== '$schema') {
    const isObject = n.type === 'object' && n.properties;
    rows.push({
      path,
      type: isObject ? 'section' : n.oneOf ? 'one of the kinds below' : typeOf(n),
      def: n.default === undefined || (typeof n.default === 'object' && n.default !== null) ? '' : `\`${JSON.stringify(n.default)}\``,
      required,
      text: n.description ?? '',
    });
  }
  if (n.properties) {
    for (const [k, v] of Object.entries(n.properties)) walk(v, path ? `${path}.${k}` : k, (n.required ?? []).includes(k), rows);
  }
  const disc = discriminator(n.oneOf ?? []);
  const alts = disc ? n.oneOf! : [];
  if (disc) {
    const kinds = alts.map((a) => String(a.properties![disc].const));
    const def = alts.map((a) => a.properties![disc].default).find((x) => x !== undefined);
    rows.push({
      path: `${path}.${disc}`,
      type: kinds.map((k) => `\`${k}\``).join(' / '),
      def: def === undefined ? '' : `\`${JSON.stringify(def)}\``,
      required: alts.every((a) => (a.required ?? []).includes(disc)),
      text: alts.map((a) => `${String(a.properties![disc].const)}: ${a.properties![disc].description ?? ''}`).join('; '),
    });
    // Fields shared by several kinds (same meaning, type and default) are listed once, tagged with
    // the kinds that take them; a field whose meaning differs by kind gets a row per meaning.
    const byPath = new Map<string, { row: Row; kinds: string[] }>();
    for (const alt of alts) {
      const kind = String(alt.properties![disc].const);
      const sub: Row[] = [];
      for (const [k, v] of Object.entries(alt.properties!)) if (k !== disc) walk(v, `${path}.${k}`, (alt.required ?? []).includes(k), sub);
      for (const r of sub) {
        const key = [r.path, r.type, r.def, r.required, r.text].join('\u0000');
        const seen = byPath.get(key);
        if (seen) seen.kinds.push(kind);
        else byPath.set(key, { row: r, kinds: [kind] });
      }
    }
    // A field every kind takes carries no tag.
    for (const { row, kinds: ks } of byPath.values()) rows.push(ks.length === alts.length ? row : { ...row, text: `(${ks.join(', ')}) ${row.text}` });
  }
  if (n.type === 'array' && n.items && !Array.isArray(n.items) && (n.items.properties || n.items.oneOf)) walk(n.items, `${path}[]`, false, rows);
  if (n.type === 'object' && n.additionalProperties && typeof n.additionalProperties === 'object' && n.additionalProperties.properties) {
    walk(n.additionalProperties, `${path}.<name>`, false, rows);
  }
}
