import type { z } from 'zod';

/** How serious a calculator warning is: `danger` can damage equipment or hurt someone. */
export type CalcWarningLevel = 'info' | 'caution' | 'danger';

/** A note attached to a result; `field` names the input it is about, when there is one. */
export type CalcWarning = {
  level: CalcWarningLevel;
  code: string;
  message: string;
  field?: string;
};

/** What every calculator returns: its numbers plus any cautions that go with them. */
export type CalcOutput<R> = { results: R; warnings: CalcWarning[] };

/** One input problem, addressed by field key (`''` when it concerns the whole input). */
export type CalcIssue = { path: string; message: string };

/** A choice for a select field: the stored value and what the reader sees. */
export type CalcFieldOption = { value: string; label: string };

/** Form metadata for one input, derived from the schema so the form and validation cannot drift. */
export type CalcField<K extends string = string> = {
  key: K;
  label: string;
  unit: string;
  help?: string;
  kind: 'number' | 'select';
  options?: CalcFieldOption[];
  /** Bounds and step for number fields (the schema enforces the same bounds). */
  min?: number;
  max?: number;
  step?: number;
  /** True when the field may be left empty. */
  optional: boolean;
};

/** A calculator: its identity, validated input, a worked default, form fields and the computation. */
export type Calculator<S extends z.ZodType = z.ZodType, R = unknown, N extends string = string> = {
  name: N;
  title: string;
  description: string;
  input: S;
  /** A sensible example input, valid against `input`. */
  defaults: z.input<S>;
  fields: CalcField<Extract<keyof z.output<S>, string>>[];
  /** Pure: the same valid input always gives the same output, and it never throws on valid input. */
  compute(input: z.output<S>): CalcOutput<R>;
};

/** Any calculator, for code that handles them generically (registry, forms). */
export type AnyCalculator = Omit<Calculator<z.ZodType, unknown, string>, 'fields' | 'compute'> & {
  fields: CalcField[];
  // Method syntax keeps parameters bivariant, so each calculator's own input type is assignable here.
  compute(input: never): CalcOutput<unknown>;
};

type FieldMeta = Omit<CalcField, 'key'>;

/** Reads the form metadata that the input builders in ./inputs attach to each field schema (an `x-` key, so JSON Schema and OpenAPI output stay valid). */
function fieldsFromSchema(schema: z.ZodType): CalcField[] {
  const shape = (schema as unknown as { shape?: Record<string, z.ZodType> }).shape;
  if (!shape) throw new Error('A calculator input must be an object schema');
  return Object.entries(shape).map(([key, fieldSchema]) => {
    const meta = fieldSchema.meta()?.['x-calc-field'] as FieldMeta | undefined;
    // Failing here (at module load) is deliberate: a field without metadata would give a form with no label.
    if (!meta) throw new Error(`Calculator field "${key}" was not built with the ./inputs helpers`);
    return { key, ...meta };
  });
}

/**
 * Builds a calculator object, deriving its form fields from the input schema so the labels, units
 * and bounds shown in a form are the ones validation enforces.
 */
export function defineCalculator<const N extends string, S extends z.ZodType, R>(definition: {
  name: N;
  title: string;
  description: string;
  input: S;
  defaults: z.input<S>;
  compute(input: z.output<S>): CalcOutput<R>;
}): Calculator<S, R, N> {
  const fields = fieldsFromSchema(definition.input) as Calculator<S, R, N>['fields'];
  return Object.freeze({ ...definition, fields });
}
