import { queryOptions } from '@tanstack/react-query';
import type { ParameterSummary } from '@shared/schemas/parameter';
import type { ParameterPageData } from '@shared/schemas/reading';
import { api, type Envelope } from '@/lib/api-client';

export type { ParameterPageData } from '@shared/schemas/reading';

/** Query options for the parameter library; keys run general → specific so one invalidation covers all. */
export const parameterQueries = {
  all: () => ['parameters'] as const,
  list: () =>
    queryOptions({
      queryKey: [...parameterQueries.all(), 'list'] as const,
      queryFn: async () => (await api.get<Envelope<ParameterSummary[]>>('/api/parameters')).data,
      staleTime: 5 * 60_000,
    }),
  detail: (slug: string) =>
    queryOptions({
      queryKey: [...parameterQueries.all(), 'detail', slug] as const,
      queryFn: async () => (await api.get<Envelope<ParameterPageData>>(`/api/parameters/${encodeURIComponent(slug)}`)).data,
    }),
};
