import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { Change } from '@shared/schemas/change';
import { api, type ListEnvelope } from '@/lib/api-client';

export type ChangeFilters = { kind?: string; class?: string; author?: string };

export const changeQueries = {
  all: () => ['changes'] as const,
  list: (filters: ChangeFilters, limit = 50) =>
    queryOptions({
      queryKey: [...changeQueries.all(), 'list', filters, limit] as const,
      queryFn: () => api.get<ListEnvelope<Change>>('/api/changes', { query: { ...filters, limit } }),
      placeholderData: keepPreviousData,
    }),
};
