import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { SearchResponse, SearchSuggestion, SearchType } from '@shared/schemas/search';
import { api, type Envelope } from '@/lib/api-client';

export type SearchParams = { q: string; type?: SearchType; class?: string; surface?: string; parameter?: string; limit?: number };
export type SearchPage = { data: SearchResponse; meta: { tookMs: number; total: number } };

export const searchQueries = {
  all: () => ['search'] as const,
  results: (params: SearchParams) =>
    queryOptions({
      queryKey: [...searchQueries.all(), 'results', params] as const,
      queryFn: ({ signal }) => api.get<SearchPage>('/api/search', { query: params, signal }),
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
