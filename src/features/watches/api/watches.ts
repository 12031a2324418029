import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { DocumentKind } from '@shared/constants';
import type { UnsubscribeResult, Watch, WatchDelivery, WatchSettings, WatchState } from '@shared/schemas/watch';
import { api, type Envelope, type ListEnvelope } from '@/lib/api-client';

export const watchQueries = {
  all: () => ['watches'] as const,
  mine: () =>
    queryOptions({ queryKey: [...watchQueries.all(), 'mine'] as const, queryFn: async () => (await api.get<ListEnvelope<Watch>>('/api/watches')).data }),
  settings: () =>
    queryOptions({
      queryKey: [...watchQueries.all(), 'settings'] as const,
      queryFn: async () => (await api.get<Envelope<WatchSettings>>('/api/watches/settings')).data,
    }),
  state: (kind: DocumentKind, slug: string) =>
    queryOptions({
      queryKey: [...watchQueries.all(), 'state', kind, slug] as const,
      queryFn: async () => (await api.get<Envelope<WatchState>>(`/api/watches/${kind}/${encodeURIComponent(slug)}`)).data,
    }),
};

export function useSetWatching(kind: DocumentKind, slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (watching: boolean) => {
      const path = `/api/watches/${kind}/${encodeURIComponent(slug)}`;
      return (watching ? await api.put<Envelope<WatchState>>(path) : await api.delete<Envelope<WatchState>>(path)).data;
    },
    onSuccess: (state) => {
      qc.setQueryData(watchQueries.state(kind, slug).queryKey, state);
      return qc.invalidateQueries({ queryKey: watchQueries.mine().queryKey });
    },
  });
}

export function useSetDelivery() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (delivery: WatchDelivery) => (await api.put<Envelope<WatchSettings>>('/api/watches/settings', { delivery })).data,
    onSuccess: (s) => qc.setQueryData(watchQueries.settings().queryKey, s),
  });
}

export function useUnsubscribe() {
  return useMutation({ mutationFn: async (token: string) => (await api.post<Envelope<UnsubscribeResult>>('/api/unsubscribe', { token })).data });
}
