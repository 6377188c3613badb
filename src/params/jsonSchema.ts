import { z } from 'zod';
import { DesignSchema } from './schema.js';

/** JSON Schema (draft 2020-12) of the design file as a user writes it, for editor completion. */
export function designJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(DesignSchema, { io: 'input', unrepresentable: 'any' }) as Record<string, unknown>;
  return { ...schema, title: 'framewright design', description: 'A parametric carbon-plate multirotor frame. Lengths in mm.' };
}
