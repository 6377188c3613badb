import { z } from 'zod';

/**
 * A number schema with a range and its own messages, built with its checks in one step and
 * registered in place: `.min().max().describe()` would build four zod schemas for one, and a
 * design schema has a few hundred fields, each built again at every start.
 */
export const rangedNumber = (
  min: number,
  max: number,
  o: Readonly<{ typeError: string | ((iss: { input?: unknown }) => string); below: string; above: string; description: string }>,
) =>
  z
    .number({ error: o.typeError })
    .check(z.gte(min, { error: o.below }), z.lte(max, { error: o.above }))
    .register(z.globalRegistry, { description: o.description });

/**
 * A number field with its unit and range in the description (so the JSON Schema and the README
 * table document themselves) and in every error message.
 */
export const num = (min: number, max: number, unit: string, what: string) =>
  rangedNumber(min, max, {
    typeError: (iss) => (iss.input === undefined ? `is required (${what}, ${min} to ${max} ${unit})` : `must be a number (${unit}), ${min} to ${max}`),
    below: `is below the allowed range ${min} to ${max} ${unit}`,
    above: `is above the allowed range ${min} to ${max} ${unit}`,
    description: `${what} [${unit}, ${min} to ${max}]`,
  });

/** A whole-number field with its range. */
export const int = (min: number, max: number, what: string) =>
  z
    .number({ error: `must be a whole number from ${min} to ${max}` })
    .check(z.int({ error: `must be a whole number from ${min} to ${max}` }), z.gte(min, { error: `is below the allowed range ${min} to ${max}` }), z.lte(max, { error: `is above the allowed range ${min} to ${max}` }))
    .register(z.globalRegistry, { description: `${what} [${min} to ${max}]` });

/**
 * Parse options for a schema that parses a file once per run: zod's generated fast path (a
 * function compiled with `new Function` per object schema, the first time it parses) costs more
 * to build than it saves on one small document. Results and messages are the same either way.
 */
export const PARSE_ONCE = { jitless: true } as const;
