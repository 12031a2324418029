import { z } from 'zod';
import {
  searchQuerySchema,
  searchResponseSchema,
  searchSuggestionSchema,
  suggestQuerySchema,
  type SearchMeta,
  type SearchQuery,
  type SearchResponse,
} from '../../../shared/schemas/search';
import type { AppContext } from '../../context';
import { defineRoute } from '../../lib/route';

/** One page of results as GET /api/search answers it (the server-drawn results page sends the same). */
export function searchAnswer(ctx: Pick<AppContext, 'search'>, query: SearchQuery): { data: SearchResponse; meta: SearchMeta } {
  const { q, limit, offset, ...filters } = query;
  const r = ctx.search.search(q, filters, limit, offset);
  return {
    data: {
      hits: r.hits,
      facets: r.facets,
      ...(r.didYouMean ? { didYouMean: r.didYouMean } : {}),
      ...(r.searchedFor ? { searchedFor: r.searchedFor } : {}),
    },
    meta: { total: r.total, offset, limit, tookMs: r.tookMs },
  };
}

export const searchRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/search',
    summary: 'Search live parameters, guides and setup baselines, with facets and snippets; `offset` pages through all `meta.total` matches',
    tags: ['search'],
    access: 'public',
    query: searchQuerySchema,
    response: searchResponseSchema,
    handler: ({ query, ctx }) => searchAnswer(ctx, query),
  }),
  defineRoute({
    method: 'get',
    path: '/api/search/suggest',
    summary: 'Pages to offer while a reader types in the search box',
    tags: ['search'],
    access: 'public',
    query: suggestQuerySchema,
    response: z.array(searchSuggestionSchema),
    handler: ({ query, ctx }) => ({ data: ctx.search.suggest(query.q) }),
  }),
];
