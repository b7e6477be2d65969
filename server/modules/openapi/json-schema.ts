import { z } from 'zod';

export type Json = Record<string, unknown>;

/** The JSON Schema a client sends (input side: defaults optional, coercions as the wire sees them). */
export function jsonSchemaOf(schema: z.ZodType): Json {
  const out = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any', target: 'draft-2020-12' }) as Json;
  delete out.$schema;
  return out;
}
