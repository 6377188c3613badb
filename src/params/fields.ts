import { z } from 'zod';

/**
 * A number field with its unit and range in the description (so the JSON Schema and the README
 * table document themselves) and in every error message.
 */
export const num = (min: number, max: number, unit: string, what: string) =>
  z
    .number({ error: (iss) => (iss.input === undefined ? `is required (${what}, ${min} to ${max} ${unit})` : `must be a number (${unit}), ${min} to ${max}`) })
    .min(min, { error: `is below the allowed range ${min} to ${max} ${unit}` })
    .max(max, { error: `is above the allowed range ${min} to ${max} ${unit}` })
    .describe(`${what} [${unit}, ${min} to ${max}]`);

/** A whole-number field with its range. */
export const int = (min: number, max: number, what: string) =>
  z
    .number({ error: `must be a whole number from ${min} to ${max}` })
    .int({ error: `must be a whole number from ${min} to ${max}` })
    .min(min, { error: `is below the allowed range ${min} to ${max}` })
    .max(max, { error: `is above the allowed range ${min} to ${max}` })
    .describe(`${what} [${min} to ${max}]`);

/**
 * Parse options for a schema that parses a file once per run: zod's generated fast path (a
 * function compiled with `new Function` per object schema, the first time it parses) costs more
 * to build than it saves on one small document. Results and messages are the same either way.
 */
export const PARSE_ONCE = { jitless: true } as const;
