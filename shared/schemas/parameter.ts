import { z } from 'zod';
import { PARAMETER_CATEGORIES } from '../constants';
import { slugSchema } from './common';

/** The typical range and step of a parameter, in its unit. */
export const parameterRangeSchema = z
  .object({ min: z.number(), max: z.number(), step: z.number().positive() })
  .refine((r) => r.max >= r.min, { message: 'max must not be below min', path: ['max'] });

/** What a parameter revision holds (the fields an editor can change). */
export const parameterContentSchema = z.object({
  name: z.string().trim().min(2).max(80),
  aliases: z.array(z.string().trim().min(1).max(60)).max(20).default([]),
  category: z.enum(PARAMETER_CATEGORIES),
  unit: z.string().max(12).default(''),
  range: parameterRangeSchema,
  summary: z.string().trim().min(10).max(400),
  related: z.array(slugSchema).max(20).default([]),
  calculator: z.string().max(40).nullable().default(null),
  body: z.string().max(100_000),
});
export type ParameterContent = z.infer<typeof parameterContentSchema>;

/** A row of the parameter library list. */
export const parameterSummarySchema = z.object({
  slug: z.string(),
  name: z.string(),
  aliases: z.array(z.string()),
  category: z.enum(PARAMETER_CATEGORIES),
  unit: z.string(),
  range: z.object({ min: z.number(), max: z.number(), step: z.number() }),
  summary: z.string(),
});
export type ParameterSummary = z.infer<typeof parameterSummarySchema>;

/** A published guide that discusses a parameter. */
export const parameterGuideRefSchema = z.object({
  slug: z.string(),
  title: z.string(),
  class: z.string(),
  surface: z.string(),
});
export type ParameterGuideRef = z.infer<typeof parameterGuideRefSchema>;

/** A parameter entry as its page shows it: the summary fields, the body and what it links to. */
export const parameterDetailSchema = parameterSummarySchema.extend({
  body: z.string(),
  /** The body without its "## Cautions" section, as sanitized HTML (worked examples are `[data-example-slot]` elements). */
  bodyHtml: z.string(),
  /** The "## Cautions" section as sanitized HTML, shown in its own box; null when the entry has none. */
  cautionsHtml: z.string().nullable(),
  related: z.array(z.string()),
  /** The related entries that are live, with their names, in the order the entry lists them. */
  relatedParameters: z.array(z.object({ slug: z.string(), name: z.string(), summary: z.string() })),
  calculator: z.string().nullable(),
  guides: z.array(parameterGuideRefSchema),
});
export type ParameterDetail = z.infer<typeof parameterDetailSchema>;

/** The live revision behind a parameter page. */
export const parameterLiveRevisionSchema = z.object({
  id: z.uuid(),
  number: z.number().int(),
  publishedAt: z.string().nullable(),
  author: z.object({ id: z.uuid(), displayName: z.string() }),
});
export type ParameterLiveRevision = z.infer<typeof parameterLiveRevisionSchema>;
