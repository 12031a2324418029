import { infiniteQueryOptions, keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { SearchMeta, SearchResponse, SearchSuggestion, SearchType } from '@shared/schemas/search';
import { api, type Envelope } from '@/lib/api-client';

export type SearchParams = { q: string; type?: SearchType; class?: string; surface?: string; parameter?: string; limit?: number };
export type SearchPage = { data: SearchResponse; meta: SearchMeta };

/** Where the page after `last` starts, or undefined when every match has been fetched. */
function nextOffset(last: SearchPage) {
  const next = last.meta.offset + last.data.hits.length;
  return last.data.hits.length > 0 && next < last.meta.total ? next : undefined;
}

export const searchQueries = {
  all: () => ['search'] as const,
  /** The results of one search, fetched a page at a time ("show more" asks for the next offset). */
  results: (params: SearchParams) =>
    infiniteQueryOptions({
      queryKey: [...searchQueries.all(), 'results', params] as const,
      queryFn: ({ signal, pageParam }) => api.get<SearchPage>('/api/search', { query: { ...params, offset: pageParam }, signal }),
      initialPageParam: 0,
      getNextPageParam: nextOffset,
      placeholderData: keepPreviousData,
      enabled: params.q.trim().length > 0,
      staleTime: 10_000,
    }),
  suggest: (q: string) =>
    queryOptions({
      queryKey: [...searchQueries.all(), 'suggest', q] as const,
      queryFn: async ({ signal }) => (await api.get<Envelope<SearchSuggestion[]>>('/api/search/suggest', { query: { q }, signal })).data,
      enabled: q.trim().length > 0,
      staleTime: 10_000,
    }),
};
