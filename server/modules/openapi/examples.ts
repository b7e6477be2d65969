// Example values for a route's body or query, made from its JSON Schema and kept only when the
// zod schema itself accepts them. The document shows them; the access tests send them, so that a
// refusal they see is the access check's and not the validator's.
import type { z } from 'zod';
import { jsonSchemaOf, type Json } from './json-schema.js';
type Rng = () => number;

function rng(seed: number): Rng {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const FORMAT_SAMPLES: Record<string, string> = {
  date: '2027-03-01',
  'date-time': '2027-03-01T14:00:00.000Z',
  time: '14:00',
  email: 'grower@example.test',
  uri: 'https://example.test/',
  url: 'https://example.test/',
  uuid: '00000000-0000-4000-8000-000000000000',
};

/** Strings for a few patterns the shared schemas use (state codes, times of day, ISO dates). */
function fromPattern(pattern: string): string | undefined {
  if (pattern.includes('[A-Z]{2}')) return 'KS';
  if (/\\d\{4\}-\\d\{2\}-\\d\{2\}/.test(pattern) || pattern.includes('\\d{4}-\\d{2}-\\d{2}')) return '2027-03-01';
  if (pattern.includes(':')) return '08:00';
  return undefined;
}

interface Ctx {
  root: Json;
  rand: Rng;
  /** true: fill optional fields as well; false: required fields only. */
  full: boolean;
  depth: number;
  /** The property name, when the value is one: names hint at dates, days and keys. */
  name?: string;
}

// Field names that say what a plain string holds when the JSON Schema cannot (zod refinements).
const NAME_HINTS: [RegExp, string][] = [
  [/windowStart$/i, '04-15'],
  [/windowEnd$/i, '05-15'],
  [/weekStart$|date$|^from$|since$/i, '2027-03-01'],
  [/^to$|until$/i, '2027-05-31'],
  [/email$/i, 'grower@example.test'],
  [/key$/i, 'plains-north'],
];

function resolve(schema: Json, root: Json): Json {
  const ref = schema.$ref;
  if (typeof ref !== 'string' || !ref.startsWith('#/')) return schema;
  let node: unknown = root;
  for (const part of ref.slice(2).split('/')) node = (node as Json)?.[part];
  return (node as Json) ?? {};
}

function pick<T>(items: T[], c: Ctx): T {
  return items[Math.floor(c.rand() * items.length)];
}

function numberFor(s: Json, c: Ctx, integer: boolean): number {
  const min = typeof s.minimum === 'number' ? s.minimum : typeof s.exclusiveMinimum === 'number' ? s.exclusiveMinimum + (integer ? 1 : 0.5) : undefined;
  const max = typeof s.maximum === 'number' ? s.maximum : typeof s.exclusiveMaximum === 'number' ? s.exclusiveMaximum - (integer ? 1 : 0.5) : undefined;
  const lo = min ?? (max !== undefined ? Math.min(0, max) : 1);
  const hi = max ?? lo + 100;
  let v = c.full ? lo + c.rand() * Math.min(hi - lo, 1000) : Math.max(lo, Math.min(hi, 1));
  if (integer) v = Math.min(Math.ceil(v), Math.floor(hi));
  return Number.isFinite(v) ? v : 1;
}

function stringFor(s: Json, c: Ctx): string {
  if (typeof s.format === 'string' && FORMAT_SAMPLES[s.format]) return FORMAT_SAMPLES[s.format];
  const hint = c.name && NAME_HINTS.find(([re]) => re.test(c.name!));
  if (hint && c.rand() < 0.9) return hint[1];
  if (typeof s.pattern === 'string') {
    const p = fromPattern(s.pattern);
    if (p) return p;
  }
  const min = typeof s.minLength === 'number' ? s.minLength : 1;
  const max = typeof s.maxLength === 'number' ? s.maxLength : 40;
  const word = 'Example row unit seed meter'.slice(0, Math.max(min, Math.min(max, 12)));
  return word.padEnd(min, 'x');
}

function valueFor(schema: Json, c: Ctx): unknown {
  const s = resolve(schema, c.root);
  if ('const' in s) return s.const;
  if (Array.isArray(s.enum)) return pick(s.enum, c);
  if (s.default !== undefined && !c.full && c.rand() < 0.5) return s.default;
  for (const key of ['anyOf', 'oneOf'] as const) {
    const options = s[key];
    if (Array.isArray(options) && options.length) {
      // Prefer a non-null branch: null is rarely the interesting example.
      const nonNull = (options as Json[]).filter((o) => resolve(o, c.root).type !== 'null');
      return valueFor(pick(nonNull.length && c.rand() < 0.85 ? nonNull : (options as Json[]), c), c);
    }
  }
  if (Array.isArray(s.allOf)) {
    const merged: Json = {};
    for (const part of s.allOf as Json[]) {
      const v = valueFor(part, c);
      if (v && typeof v === 'object' && !Array.isArray(v)) Object.assign(merged, v);
    }
    return merged;
  }
  const type = Array.isArray(s.type) ? pick(s.type as string[], c) : s.type;
  switch (type) {
    case 'string':
      return stringFor(s, c);
    case 'integer':
      return numberFor(s, c, true);
    case 'number':
      return numberFor(s, c, false);
    case 'boolean':
      return c.rand() < 0.5;
    case 'null':
      return null;
    case 'array': {
      if (c.depth > 6) return [];
      const min = typeof s.minItems === 'number' ? s.minItems : 0;
      const max = typeof s.maxItems === 'number' ? s.maxItems : min + 2;
      const n = Math.min(max, Math.max(min, c.full ? 1 : min));
      if (Array.isArray(s.prefixItems)) return (s.prefixItems as Json[]).map((item) => valueFor(item, { ...c, depth: c.depth + 1, name: undefined }));
      return Array.from({ length: n }, () => valueFor((s.items as Json) ?? {}, { ...c, depth: c.depth + 1, name: undefined }));
    }
    case 'object':
    default: {
      if (type === undefined && !s.properties) return c.full ? 'example' : {};
      const out: Json = {};
      const required = new Set((s.required as string[] | undefined) ?? []);
      for (const [name, prop] of Object.entries((s.properties ?? {}) as Record<string, Json>)) {
        if (required.has(name) || c.full) out[name] = valueFor(prop, { ...c, depth: c.depth + 1, name });
      }
      return out;
    }
  }
}

/**
 * A value the zod schema accepts, or undefined when none of the tries passed (schemas with
 * cross-field rules the JSON Schema cannot express). `seed` makes it repeatable.
 */
export function exampleFor(schema: z.ZodType, seed = 1, tries = 300): unknown {
  const root = jsonSchemaOf(schema);
  const rand = rng(seed);
  for (let i = 0; i < tries; i++) {
    const candidate = valueFor(root, { root, rand, full: i % 2 === 1, depth: 0 });
    if (schema.safeParse(candidate).success) return candidate;
  }
  return undefined;
}
