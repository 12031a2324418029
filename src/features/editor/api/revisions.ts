import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { DocumentKind } from '@shared/constants';
import type { ContentCheckItem } from '@shared/schemas/content-check';
import type { CompareResult, DocumentStatus, MyRevision, RebaseResult, Revision } from '@shared/schemas/revision';
import { api, ApiError, type Envelope, type ListEnvelope } from '@/lib/api-client';

/** The fields an author edits, for either kind (validated by the kind's content schema on the server). */
export type EditableContent = Record<string, unknown> & { body: string };

export type { DocumentStatus, MyRevision, RebaseResult };

const plural = (kind: DocumentKind) => (kind === 'guide' ? 'guides' : 'parameters');

/** Query-option factories for the author's revisions (keys general → specific). */
export const revisionQueries = {
  all: () => ['revisions'] as const,
  mine: () =>
    queryOptions({
      queryKey: [...revisionQueries.all(), 'mine'] as const,
      queryFn: async () => (await api.get<ListEnvelope<MyRevision>>('/api/me/revisions')).data,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: [...revisionQueries.all(), 'detail', id] as const,
      queryFn: async () =>
        (await api.get<Envelope<{ revision: Revision; document?: DocumentStatus; checks?: ContentCheckItem[] }>>(`/api/revisions/${id}`)).data,
    }),
  /** Two versions of a document compared (the author's own drafts included): the workbench shows a sent-back proposal's changes. */
  compare: (kind: DocumentKind, slug: string, from: number, to: number) =>
    queryOptions({
      queryKey: [...revisionQueries.all(), 'compare', kind, slug, from, to] as const,
      queryFn: async () => (await api.get<Envelope<CompareResult>>(`/api/${plural(kind)}/${encodeURIComponent(slug)}/compare`, { query: { from, to } })).data,
    }),
  /** The live revision a proposal starts from (read through the history, which both kinds share). */
  live: (kind: DocumentKind, slug: string) =>
    queryOptions({
      queryKey: [...revisionQueries.all(), 'live', kind, slug] as const,
      queryFn: async () => {
        const base = `/api/${plural(kind)}/${encodeURIComponent(slug)}`;
        const history = (await api.get<ListEnvelope<{ number: number; state: Revision['state'] }>>(`${base}/revisions`)).data;
        const live = history.find((h) => h.state === 'published');
        if (!live) throw new ApiError(404, 'not_found', 'This has no live version yet.');
        return (await api.get<Envelope<{ revision: Revision }>>(`${base}/revisions/${live.number}`)).data.revision;
      },
    }),
};

/** Creates a new guide as a draft (revision 1). */
export async function createGuide(content: EditableContent) {
  return (await api.post<Envelope<{ guide: { slug: string }; revision: Revision }>>('/api/guides', content)).data;
}

/** Starts a proposal against the live revision of a guide or parameter. */
export async function createProposal(kind: DocumentKind, slug: string, baseRevisionId: string, content: EditableContent) {
  const res = await api.post<Envelope<{ revision: Revision } | Revision>>(`/api/${plural(kind)}/${encodeURIComponent(slug)}/revisions`, {
    baseRevisionId,
    ...content,
  });
  return 'revision' in res.data ? res.data.revision : res.data;
}

/** Autosave: replaces the draft's content (own drafts only). */
export async function patchRevision(id: string, patch: Partial<EditableContent> & { baseRevisionId?: string }) {
  return (await patchRevisionWithChecks(id, patch)).revision;
}

/** Autosave that also returns what the content checks find in the saved draft (they run on every save). */
export async function patchRevisionWithChecks(id: string, patch: Partial<EditableContent> & { baseRevisionId?: string }) {
  const res = await api.patch<Envelope<{ revision: Revision; checks?: ContentCheckItem[] }>>(`/api/revisions/${id}`, patch);
  return { revision: res.data.revision, checks: res.data.checks ?? [] };
}

function useInvalidateRevisions() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ predicate: (q) => ['revisions', 'reviews'].includes(String(q.queryKey[0])) });
}

export function useSubmitRevision() {
  const invalidate = useInvalidateRevisions();
  return useMutation({
    mutationFn: async ({ id, note }: { id: string; note: string }) =>
      (await api.post<Envelope<{ revision: Revision }>>(`/api/revisions/${id}/submit`, { note })).data,
    onSuccess: invalidate,
  });
}

export function useWithdrawRevision() {
  const invalidate = useInvalidateRevisions();
  return useMutation({
    mutationFn: async (id: string) => (await api.post<Envelope<{ revision: Revision }>>(`/api/revisions/${id}/withdraw`)).data,
    onSuccess: invalidate,
  });
}

export function useRebaseRevision() {
  return useMutation({
    mutationFn: async (id: string) => (await api.post<Envelope<RebaseResult>>(`/api/revisions/${id}/rebase`)).data,
  });
}

/** Throws away the author's own draft or sent-back revision (a never-live guide goes with its only draft). */
export function useDiscardRevision() {
  const invalidate = useInvalidateRevisions();
  return useMutation({
    mutationFn: (id: string) => api.delete<void>(`/api/revisions/${id}`),
    onSuccess: invalidate,
  });
}
