import YAML from 'yaml';
import type { z } from 'zod';
import { DesignError, type DesignIssue } from './errors.js';

/** Parse YAML or JSON text (JSON is YAML). A syntax error becomes a DesignError naming the source. */
export function parseYamlText(text: string, sourceName: string): unknown {
  try {
    return YAML.parse(text, { prettyErrors: true });
  } catch (e) {
    throw new DesignError([{ path: '', value: sourceName, message: `is not valid YAML or JSON: ${(e as Error).message.split('\n')[0]}` }]);
  }
}

/**
 * zod issues as design issues: the dotted path (after `prefix`), the value the user gave there,
 * and the schema's message (which states the allowed range).
 */
export function issuesFromZod(issues: readonly z.core.$ZodIssue[], raw: unknown, prefix: readonly string[] = [], unknownKeyHint = 'see `framewright schema` for the allowed ones'): DesignIssue[] {
  return issues.map((i) => {
    const path = [...prefix, ...i.path.map(String)].join('.');
    if (i.code === 'unrecognized_keys') {
      return { path, value: i.keys, message: `unknown key${i.keys.length > 1 ? 's' : ''}; ${unknownKeyHint}` };
    }
    const value = valueAt(raw, i.path as PropertyKey[]);
    let message = i.message;
    if (value === undefined && (i.code === 'invalid_union' || (i.code === 'invalid_type' && !/required/.test(i.message)))) {
      message = i.code === 'invalid_type' ? `is required (${String(i.expected)})` : 'is required';
    }
    return { path, value, message };
  });
}

function valueAt(raw: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = raw;
  for (const k of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[k];
  }
  return v;
}
