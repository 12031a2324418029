import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalcWarning } from '@shared/calc/types';
import type { Revision } from '@shared/schemas/revision';
import type { FieldChange, WordChange } from '@/components/diff/word-diff-view';
import { api, type Envelope, type ListEnvelope } from '@/lib/api-client';

export type ReviewFilters = { kind?: string; class?: string };

/** What the calculators say about one worked example of the proposal (blocks counted from 0). */
export type WorkedExampleCheck = { index: number; calc: string | null; ok: boolean; issues: Array<{ path: string; message: string }>; warnings: CalcWarning[] };

/** One proposal in the queue; `own` means the signed-in moderator wrote it, `stale` that its base is no longer live. */
export type ReviewItem = {
  revisionId: string;
  kind: 'guide' | 'parameter';
  slug: string;
  title: string;
  number: number;
  baseNumber: number | null;
  author: { id: string; displayName: string };
  submittedAt: string | null;
  note: string;
  class: string | null;
  own: boolean;
  stale: boolean;
};

/** One changed field of the attached setup record. */
export type SetupChange = { path: string; label?: string; from: unknown; to: unknown; unit?: string };

/** Everything a moderator needs to decide on a proposal. */
export type ReviewDetail = {
  revision: Revision;
  live: Revision | null;
  bodyDiff: WordChange[];
  changedFields: FieldChange[];
  workedExamples: WorkedExampleCheck[];
  own: boolean;
  stale: boolean;
  setupChanges?: SetupChange[] | null;
  setupWarnings?: CalcWarning[] | null;
};

/** Query-option factories for the review queue (keys general → specific). */
export const reviewQueries = {
  all: () => ['reviews'] as const,
  queue: (filters: ReviewFilters) =>
    queryOptions({
      queryKey: [...reviewQueries.all(), 'queue', filters] as const,
      queryFn: async () => (await api.get<ListEnvelope<ReviewItem>>('/api/reviews', { query: filters })).data,
    }),
  count: () =>
    queryOptions({
      queryKey: [...reviewQueries.all(), 'count'] as const,
      queryFn: async () => (await api.get<Envelope<{ count: number }>>('/api/reviews/count')).data.count,
      refetchInterval: 60_000,
      staleTime: 30_000,
    }),
  detail: (revisionId: string) =>
    queryOptions({
      queryKey: [...reviewQueries.all(), 'detail', revisionId] as const,
      queryFn: async () => (await api.get<Envelope<ReviewDetail>>(`/api/reviews/${revisionId}`)).data,
    }),
};

function useInvalidateAfterDecision() {
  const qc = useQueryClient();
  // A decision changes the queue, the count and the live content readers see.
  return () => qc.invalidateQueries({ predicate: (q) => ['reviews', 'guides', 'parameters', 'revisions'].includes(String(q.queryKey[0])) });
}

export function usePublishRevision(revisionId: string) {
  const invalidate = useInvalidateAfterDecision();
  return useMutation({
    mutationFn: async () => (await api.post<Envelope<{ revision: Revision }>>(`/api/reviews/${revisionId}/publish`)).data,
    onSuccess: invalidate,
  });
}

export function useReturnRevision(revisionId: string) {
  const invalidate = useInvalidateAfterDecision();
  return useMutation({
    mutationFn: async (reason: string) => (await api.post<Envelope<{ revision: Revision }>>(`/api/reviews/${revisionId}/return`, { reason })).data,
    onSuccess: invalidate,
  });
}
