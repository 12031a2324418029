import { z } from 'zod';

type JsonSchema = {
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  enum?: unknown[];
  const?: unknown;
  default?: unknown;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  exclusiveMinimum?: number;
  maximum?: number;
  minItems?: number;
  format?: string;
  pattern?: string;
};

/** The JSON Schema (input side) of a zod schema, or null when zod cannot express it. */
export function jsonSchemaOf(schema: z.ZodType | undefined): JsonSchema | null {
  if (!schema) return null;
  try {
    return z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as JsonSchema;
  } catch {
    return null;
  }
}

/** Top-level field names of an object schema (empty for anything else). */
export function fieldNames(schema: z.ZodType | undefined): string[] {
  return Object.keys(jsonSchemaOf(schema)?.properties ?? {});
}

// Plausible values by field name, for strings whose rules zod keeps out of JSON Schema (e-mail, refinements).
const HINTS: Array<[RegExp, string]> = [
  [/email/i, 'fuzz-racer@tidewater.test'],
  [/password/i, 'tidal-gearbox-lantern-42'],
  [/token/i, 'a'.repeat(43)],
  [/slug|parameter/i, 'drag-brake'],
  [/id$/i, '00000000-0000-4000-8000-000000000000'],
  [/title/i, 'Harbour Flats clay, stock buggy baseline'],
  [/summary|note|reason/i, 'Checked on the Harbour Flats Indoor clay after the club night.'],
  [/name/i, 'Harbour Racer'],
];

function stringFor(key: string, s: JsonSchema): string {
  if (s.format === 'uuid') return '00000000-0000-4000-8000-000000000000';
  if (s.format === 'email') return 'fuzz-racer@tidewater.test';
  if (s.format === 'date-time') return new Date(0).toISOString();
  const hint = HINTS.find(([re]) => re.test(key))?.[1];
  let value = hint ?? 'harbour';
  if (s.pattern && !new RegExp(s.pattern).test(value)) value = /\^\[a-z0-9\]/.test(s.pattern) ? 'harbour-flats' : value;
  const min = s.minLength ?? 0;
  while (value.length < min) value += ' harbour flats';
  if (s.maxLength !== undefined && value.length > s.maxLength) value = value.slice(0, s.maxLength);
  return value;
}

function exampleOf(key: string, s: JsonSchema | undefined, depth: number): unknown {
  if (!s || depth > 8) return null;
  if (s.const !== undefined) return s.const;
  if (s.default !== undefined) return s.default;
  if (s.enum?.length) return s.enum[0];
  const alt = s.anyOf ?? s.oneOf;
  if (alt?.length) return exampleOf(key, alt.find((a) => a.type !== 'null') ?? alt[0], depth + 1);
  if (s.allOf?.length) return exampleOf(key, s.allOf[0], depth + 1);
  const type = Array.isArray(s.type) ? s.type.find((t) => t !== 'null') : s.type;
  switch (type) {
    case 'object': {
      const out: Record<string, unknown> = {};
      for (const name of s.required ?? []) out[name] = exampleOf(name, s.properties?.[name], depth + 1);
      return out;
    }
    case 'array':
      return Array.from({ length: s.minItems ?? 0 }, () => exampleOf(key, s.items, depth + 1));
    case 'string':
      return stringFor(key, s);
    case 'integer':
    case 'number': {
      const low = s.minimum ?? (s.exclusiveMinimum !== undefined ? s.exclusiveMinimum + 1 : 1);
      return s.maximum !== undefined ? Math.min(low, s.maximum) : low;
    }
    case 'boolean':
      return false;
    default:
      return 'harbour';
  }
}

/**
 * A value the schema accepts (required fields only), built from its JSON Schema and field-name hints;
 * null when no such value could be found (the fuzz test then uses random input only).
 */
export function validExample(schema: z.ZodType | undefined): unknown {
  const js = jsonSchemaOf(schema);
  if (!schema || !js) return null;
  const value = exampleOf('', js, 0);
  return schema.safeParse(value).success ? value : null;
}
