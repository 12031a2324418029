import { z } from 'zod';
import { CLASS_SLUGS, SURFACE_SLUGS } from '../constants';
import { slugSchema } from './common';

/** What a guide revision holds (the fields an author can change). */
export const guideContentSchema = z.object({
  title: z.string().trim().min(5, 'Give the guide a title of at least 5 characters').max(140, 'Keep the title to 140 characters'),
  summary: z.string().trim().min(10, 'Write a summary of at least 10 characters').max(500, 'Keep the summary to 500 characters'),
  class: z.enum(CLASS_SLUGS, { message: 'Choose a class' }),
  surface: z.enum(SURFACE_SLUGS, { message: 'Choose a surface' }),
  conditions: z.string().trim().max(300).default(''),
  tags: z.array(z.string().trim().min(1).max(40)).max(20).default([]),
  parameters: z.array(slugSchema).max(40).default([]),
  body: z.string().max(100_000, 'The body is too long (100,000 characters at most)'),
});
export type GuideContent = z.infer<typeof guideContentSchema>;

/**
 * What a guide draft may hold while it is being written (autosave): a title, and the rest whenever the
 * author gets to it; the same length limits. Submitting checks the full guideContentSchema.
 */
export const guideDraftContentSchema = z.object({
  ...guideContentSchema.shape,
  title: z.string().trim().min(1, 'Give the guide a title').max(140, 'Keep the title to 140 characters'),
  summary: z.string().trim().max(500, 'Keep the summary to 500 characters').default(''),
  class: z.union([z.enum(CLASS_SLUGS, { message: 'Choose a class' }), z.literal('')]).default(''),
  surface: z.union([z.enum(SURFACE_SLUGS, { message: 'Choose a surface' }), z.literal('')]).default(''),
});

/** POST /api/guides: a new guide starts as the author's draft (revision 1); a title is enough to start. */
export const createGuideSchema = z.strictObject({
  ...guideDraftContentSchema.shape,
  body: guideContentSchema.shape.body.default(''),
  note: z.string().trim().max(1000).optional(),
});
export type CreateGuideInput = z.infer<typeof createGuideSchema>;

/** A row of the guide list (published, not hidden). */
export const guideSummarySchema = z.object({
  slug: z.string(),
  title: z.string(),
  summary: z.string(),
  class: z.string(),
  surface: z.string(),
  conditions: z.string(),
  tags: z.array(z.string()),
  parameters: z.array(z.string()),
  version: z.number().int(),
  publishedAt: z.string().nullable(),
  author: z.object({ id: z.uuid(), displayName: z.string() }),
});
export type GuideSummary = z.infer<typeof guideSummarySchema>;

/** A guide as its page shows it: the live revision's metadata plus the version it is at. */
export const guideRecordSchema = guideSummarySchema.extend({
  publishedRevisionId: z.uuid(),
  hidden: z.boolean(),
  hiddenReason: z.string().nullable().optional(),
});
export type GuideRecord = z.infer<typeof guideRecordSchema>;

/** Query of GET /api/guides. */
export const guideListQuerySchema = z.object({
  class: z.enum(CLASS_SLUGS).optional(),
  surface: z.enum(SURFACE_SLUGS).optional(),
  parameter: slugSchema.optional(),
  /** Guides carrying this tag, exactly as written on the guide. */
  tag: z.string().trim().min(1).max(40).optional(),
  q: z.string().trim().max(200).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(50),
});
export type GuideListQuery = z.infer<typeof guideListQuerySchema>;

/** GET /api/taxonomy */
export const taxonomySchema = z.object({
  classes: z.array(z.object({ slug: z.string(), name: z.string() })),
  surfaces: z.array(z.object({ slug: z.string(), name: z.string() })),
});
