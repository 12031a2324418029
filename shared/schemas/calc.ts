import { z } from 'zod';

/** One calculator as GET /api/calc lists it: identity, form fields, an example input and its JSON Schema. */
export const calculatorInfoSchema = z.object({
  name: z.string(),
  title: z.string(),
  description: z.string(),
  fields: z.array(
    z.object({
      key: z.string(),
      label: z.string(),
      unit: z.string(),
      help: z.string().optional(),
      kind: z.enum(['number', 'select']),
      options: z.array(z.object({ value: z.string(), label: z.string() })).optional(),
      min: z.number().optional(),
      max: z.number().optional(),
      step: z.number().optional(),
      optional: z.boolean(),
    }),
  ),
  defaults: z.record(z.string(), z.unknown()),
  /** JSON Schema (2020-12) of the request body POST /api/calc/:name accepts. */
  inputSchema: z.record(z.string(), z.unknown()),
});
export type CalculatorInfo = z.infer<typeof calculatorInfoSchema>;

/** A calculator warning as the API returns it. */
export const calcWarningSchema = z.object({
  level: z.enum(['info', 'caution', 'danger']),
  code: z.string(),
  message: z.string(),
  field: z.string().optional(),
});

/** What POST /api/calc/:name returns. */
export const calcRunResultSchema = z.object({
  results: z.record(z.string(), z.unknown()),
  warnings: z.array(calcWarningSchema),
});
