import { z } from 'zod';
import { SEARCH_TYPES } from '../search';
import { guideSummarySchema } from './guide';
import { parameterSummarySchema } from './parameter';
import { guideDetailSchema, parameterPageDataSchema, readableGuideRevisionSchema } from './reading';
import { searchMetaSchema, searchResponseSchema } from './search';
import { userSchema } from './user';

/** The guides list's filters as the page keeps them in its URL (the query key of the list). */
export const guideFiltersSchema = z.object({
  class: z.string().optional(),
  surface: z.string().optional(),
  parameter: z.string().optional(),
  tag: z.string().optional(),
  q: z.string().optional(),
});
export type GuideFilters = z.infer<typeof guideFiltersSchema>;

/** A search page's own parameters (the query key of its results). */
export const searchParamsSchema = z.object({
  q: z.string(),
  type: z.enum(SEARCH_TYPES).optional(),
  class: z.string().optional(),
  surface: z.string().optional(),
  parameter: z.string().optional(),
  limit: z.number().int().optional(),
});
export type SearchParams = z.infer<typeof searchParamsSchema>;

/** One page of search results as GET /api/search answers it. */
export const searchPageSchema = z.object({ data: searchResponseSchema, meta: searchMetaSchema });
export type SearchPage = z.infer<typeof searchPageSchema>;

/**
 * What the server sends with a page it draws (home, a guide, a parameter entry, the library, the guides
 * list, search results), in the page's `script#tw-initial-data` block: the reads the page's first render
 * needs, each in the shape its API route answers, so the browser draws the same page without asking again.
 * The server types the block with this schema; tests/server/pages/initial-data.test.ts parses every drawn
 * page's block with it.
 */
export const initialDataSchema = z.strictObject({
  me: userSchema.nullable(),
  guide: z
    .strictObject({
      slug: z.string(),
      detail: guideDetailSchema,
      /** Set on a version's permalink (/guides/:slug/v/:number). */
      version: z.strictObject({ number: z.number().int().min(1), revision: readableGuideRevisionSchema }).optional(),
      parameters: z.array(parameterSummarySchema),
    })
    .optional(),
  parameter: z.strictObject({ slug: z.string(), detail: parameterPageDataSchema }).optional(),
  /** The parameter library (/parameters). */
  library: z.array(parameterSummarySchema).optional(),
  /** The guides list (/guides), for these filters, with the settings its filter offers. */
  guides: z.strictObject({ filters: guideFiltersSchema, list: z.array(guideSummarySchema), parameters: z.array(parameterSummarySchema) }).optional(),
  /** The first page of results of a search (/search?q=…). */
  search: z.strictObject({ params: searchParamsSchema, page: searchPageSchema }).optional(),
});
export type InitialData = z.infer<typeof initialDataSchema>;
