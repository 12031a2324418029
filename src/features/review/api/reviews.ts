import type { ImageState } from '@shared/schemas/image';
import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReviewDetail as SharedReviewDetail, ReviewItem, Revision, WorkedExampleCheck } from '@shared/schemas/revision';
import { api, type Envelope, type ListEnvelope } from '@/lib/api-client';

export type { ReviewItem, WorkedExampleCheck };

export type ReviewFilters = { kind?: string; class?: string };

/** One changed field of the attached setup record. */
export type SetupChange = NonNullable<SharedReviewDetail['setupChanges']>[number];

/** Everything a moderator needs to decide on a proposal. */
export type ReviewDetail = SharedReviewDetail;

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

function useInvalidateAfterDecision(revisionId: string) {
  const qc = useQueryClient();
  return () => {
    // The moderator goes straight back to the queue: drop the decided proposal from the cached copy,
    // so it does not show there again while the queue refetches.
    qc.setQueriesData<ReviewItem[]>({ queryKey: [...reviewQueries.all(), 'queue'] }, (rows) => rows?.filter((r) => r.revisionId !== revisionId));
    // A decision changes the queue, the count and the live content readers see.
    return qc.invalidateQueries({ predicate: (q) => ['reviews', 'guides', 'parameters', 'revisions'].includes(String(q.queryKey[0])) });
  };
}

export function usePublishRevision(revisionId: string) {
  const invalidate = useInvalidateAfterDecision(revisionId);
  return useMutation({
    // 202 with `approval` when a safety-relevant change needs a second moderator: recorded, still in review.
    mutationFn: async () => (await api.post<Envelope<{ revision: Revision; approval?: ReviewDetail['approval'] }>>(`/api/reviews/${revisionId}/publish`)).data,
    onSuccess: invalidate,
  });
}

export function useReturnRevision(revisionId: string) {
  const invalidate = useInvalidateAfterDecision(revisionId);
  return useMutation({
    mutationFn: async (reason: string) => (await api.post<Envelope<{ revision: Revision }>>(`/api/reviews/${revisionId}/return`, { reason })).data,
    onSuccess: invalidate,
  });
}

/** A moderator hides an image (pages show a notice in its place) or shows it again. */
export function useSetImageHidden() {
  return useMutation({
    mutationFn: async ({ id, hide, reason }: { id: string; hide: boolean; reason?: string }) =>
      (await api.post<Envelope<ImageState>>(`/api/images/${id}/${hide ? 'hide' : 'unhide'}`, hide ? { reason } : {})).data,
  });
}
