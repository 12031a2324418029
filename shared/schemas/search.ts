import { z } from 'zod';
import { CLASS_SLUGS, LIMITS, SURFACE_SLUGS } from '../constants';

import { SEARCH_MAX_OFFSET, SEARCH_TYPES } from '../search';

// Re-exported from the zod-free module the browser's search page imports (zod stays off that page's path).
export { SEARCH_MAX_OFFSET, SEARCH_TYPES, snippetSegments, type SearchType } from '../search';

/** Query of GET /api/search. */
export const searchQuerySchema = z.object({
  q: z
    .string({ message: 'Type something to search for' })
    .trim()
    .min(1, 'Type something to search for')
    .max(LIMITS.searchQueryMax, `Keep the search under ${LIMITS.searchQueryMax} characters`),
  type: z.enum(SEARCH_TYPES, { message: 'Type is parameter, guide or setup' }).optional(),
  class: z.enum(CLASS_SLUGS, { message: 'Unknown class' }).optional(),
  surface: z.enum(SURFACE_SLUGS, { message: 'Unknown surface' }).optional(),
  parameter: z
    .string()
    .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Unknown parameter')
    .max(80)
    .optional(),
  limit: z.coerce.number().int().min(1).max(50).default(10),
  /** How many of the ranked matches to skip: with `meta.total`, a client pages through every match. */
  offset: z.coerce.number().int().min(0, 'Offset is 0 or more').max(SEARCH_MAX_OFFSET, `Offset is at most ${SEARCH_MAX_OFFSET}`).default(0),
});
export type SearchQuery = z.infer<typeof searchQuerySchema>;

/** Query of GET /api/search/suggest. */
export const suggestQuerySchema = searchQuerySchema.pick({ q: true });

export const searchHitSchema = z.object({
  type: z.enum(SEARCH_TYPES),
  slug: z.string(),
  title: z.string(),
  /** Plain text; the matched words are wrapped in <mark>…</mark> (no other markup). */
  snippet: z.string(),
  score: z.number(),
  url: z.string(),
  /** True when at least one typed word (or one of its names) matched as written, not only by typo tolerance. */
  exact: z.boolean(),
});
export type SearchHit = z.infer<typeof searchHitSchema>;

const facetValueSchema = z.object({ value: z.string(), label: z.string(), count: z.number().int() });
export type FacetValue = z.infer<typeof facetValueSchema>;

export const searchFacetsSchema = z.object({
  type: z.array(facetValueSchema),
  class: z.array(facetValueSchema),
  surface: z.array(facetValueSchema),
  parameter: z.array(facetValueSchema),
});
export type SearchFacets = z.infer<typeof searchFacetsSchema>;

export const searchResponseSchema = z.object({
  hits: z.array(searchHitSchema),
  facets: searchFacetsSchema,
  /** A nearby name or spelling, offered when nothing matched as typed. */
  didYouMean: z.string().optional(),
  /**
   * What the results were found for, when that is not what was typed: a name written run together or
   * misspelt ("dragbreak" → "drag brake"), or an unknown word read as a known one. The query as typed
   * with the corrected words in place.
   */
  searchedFor: z.string().optional(),
});
export type SearchResponse = z.infer<typeof searchResponseSchema>;

/** `meta` of GET /api/search: `total` counts every match (with the filters), not only this page. */
export const searchMetaSchema = z.object({
  total: z.number().int(),
  offset: z.number().int(),
  limit: z.number().int(),
  tookMs: z.number(),
});
export type SearchMeta = z.infer<typeof searchMetaSchema>;

export const searchSuggestionSchema = z.object({ type: z.enum(SEARCH_TYPES), slug: z.string(), title: z.string(), url: z.string() });
export type SearchSuggestion = z.infer<typeof searchSuggestionSchema>;
