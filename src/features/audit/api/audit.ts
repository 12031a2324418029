import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { AuditEntry, AuditFilter, HiddenDocument } from '@shared/schemas/audit';
import type { DocumentKind } from '@shared/constants';
import { api, type ListEnvelope } from '@/lib/api-client';

export type AuditListParams = AuditFilter & { limit: number; offset: number };

/** The audit-log CSV address for these filters (the same filters as the list, no paging). */
export function auditCsvHref(filters: AuditFilter) {
  const q = new URLSearchParams(Object.entries(filters).filter((e): e is [string, string] => typeof e[1] === 'string' && e[1] !== '')).toString();
  return `/api/audit.csv${q ? `?${q}` : ''}`;
}

export const auditQueries = {
  all: () => ['audit'] as const,
  list: (params: AuditListParams) =>
    queryOptions({
      queryKey: [...auditQueries.all(), 'list', params] as const,
      queryFn: () => api.get<ListEnvelope<AuditEntry, { total: number; limit: number; offset: number }>>('/api/audit', { query: params }),
      placeholderData: keepPreviousData,
    }),
  hidden: () =>
    queryOptions({
      queryKey: [...auditQueries.all(), 'hidden'] as const,
      queryFn: async () => (await api.get<ListEnvelope<HiddenDocument>>('/api/hidden')).data,
    }),
};

/** Moderator: show a hidden guide or parameter entry to readers again, from the hidden list. */
export function useShowAgain() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ kind, slug }: { kind: DocumentKind; slug: string }) => api.post(`/api/${kind}s/${encodeURIComponent(slug)}/unhide`, {}),
    onSuccess: () => qc.invalidateQueries({ predicate: (q) => ['audit', 'guides', 'parameters', 'changes'].includes(String(q.queryKey[0])) }),
  });
}
