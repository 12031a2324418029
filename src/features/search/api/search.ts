import type { SearchPage, SearchParams } from '@shared/schemas/initial-data';
import { infiniteQueryOptions, keepPreviousData, queryOptions } from '@tanstack/react-query';
import { CLASS_SLUGS, SURFACE_SLUGS } from '@shared/constants';
import type { SearchSuggestion } from '@shared/schemas/search';
import { SEARCH_TYPES, type SearchType } from '@shared/search';
import { api, type Envelope } from '@/lib/api-client';

export type { SearchPage, SearchParams } from '@shared/schemas/initial-data';

/** How many results the search page asks for at a time. */
export const RESULTS_PAGE_SIZE = 20;

const pick = <T extends string>(value: string | null, allowed: readonly T[]) =>
  value && (allowed as readonly string[]).includes(value) ? (value as T) : undefined;

/**
 * The search a results page URL (/search?q=…&type=…&class=…&surface=…&parameter=…) asks for, with unknown
 * filter values left out; the page in the browser and the page the server draws read it alike.
 */
export function searchParamsFrom(sp: URLSearchParams): SearchParams {
  return {
    q: (sp.get('q') ?? '').trim(),
    type: pick<SearchType>(sp.get('type'), SEARCH_TYPES),
    class: pick(sp.get('class'), CLASS_SLUGS),
    surface: pick(sp.get('surface'), SURFACE_SLUGS),
    parameter: /^[a-z0-9-]{1,80}$/.test(sp.get('parameter') ?? '') ? sp.get('parameter')! : undefined,
  };
}

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
  /** The results page's own query: its first page is what the server draws (and sends) with the page. */
  page: (params: SearchParams) => searchQueries.results({ ...params, limit: RESULTS_PAGE_SIZE }),
  suggest: (q: string) =>
    queryOptions({
      queryKey: [...searchQueries.all(), 'suggest', q] as const,
      queryFn: async ({ signal }) => (await api.get<Envelope<SearchSuggestion[]>>('/api/search/suggest', { query: { q }, signal })).data,
      enabled: q.trim().length > 0,
      staleTime: 10_000,
    }),
};
