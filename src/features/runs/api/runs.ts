import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { Run, RunCompare, RunListItem, RunPatch, RunSeries } from '@shared/schemas/run';
import type { RunMapping } from '@shared/runlog/mapping';
import { api, type Envelope } from '@/lib/api-client';

/** Query-option factories for runs (keys general → specific). */
export const runQueries = {
  all: () => ['runs'] as const,
  list: () =>
    queryOptions({ queryKey: [...runQueries.all(), 'list'] as const, queryFn: async () => (await api.get<Envelope<RunListItem[]>>('/api/runs')).data }),
  detail: (id: string) =>
    queryOptions({
      queryKey: [...runQueries.all(), 'detail', id] as const,
      queryFn: async () => (await api.get<Envelope<Run>>(`/api/runs/${encodeURIComponent(id)}`)).data,
    }),
  series: (id: string, points: number) =>
    queryOptions({
      queryKey: [...runQueries.all(), 'series', id, points] as const,
      queryFn: async () => (await api.get<Envelope<RunSeries>>(`/api/runs/${encodeURIComponent(id)}/series`, { query: { points } })).data,
      staleTime: Infinity,
    }),
  evidence: (revisionId: string) =>
    queryOptions({
      queryKey: [...runQueries.all(), 'evidence', revisionId] as const,
      queryFn: async () => (await api.get<Envelope<RunListItem[]>>(`/api/revisions/${encodeURIComponent(revisionId)}/runs`)).data,
    }),
  guideEvidence: (slug: string) =>
    queryOptions({
      queryKey: [...runQueries.all(), 'guide-evidence', slug] as const,
      queryFn: async () => (await api.get<Envelope<RunListItem[]>>(`/api/guides/${encodeURIComponent(slug)}/evidence`)).data,
    }),
  compare: (a: string, b: string) =>
    queryOptions({
      queryKey: [...runQueries.all(), 'compare', a, b] as const,
      queryFn: async () => (await api.get<Envelope<RunCompare>>('/api/runs/compare', { query: { a, b } })).data,
    }),
};

export type RunUploadInput = { file: File; title?: string; setupId?: string; mapping?: RunMapping; onProgress: (fraction: number) => void };

/** Uploads a run log with its upload progress (the API client's XMLHttpRequest upload); rejects with the API's error. */
export async function uploadRunFile({ file, title, setupId, mapping, onProgress }: RunUploadInput): Promise<Run> {
  const form = new FormData();
  if (title) form.append('title', title);
  if (setupId) form.append('setupId', setupId);
  if (mapping) form.append('mapping', JSON.stringify(mapping));
  form.append('file', file, file.name);
  return (await api.upload<Envelope<Run>>('/api/runs', form, onProgress)).data;
}

export function useUploadRun() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: uploadRunFile, onSuccess: () => qc.invalidateQueries({ queryKey: runQueries.all() }) });
}

export function useDeleteRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<void>(`/api/runs/${encodeURIComponent(id)}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: runQueries.all() }),
  });
}

/** Offers a run on (or takes it off) the author's own draft. */
export function useToggleEvidence(revisionId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ runId, attach }: { runId: string; attach: boolean }) =>
      attach
        ? api.put<Envelope<RunListItem[]>>(`/api/revisions/${encodeURIComponent(revisionId)}/runs/${encodeURIComponent(runId)}`)
        : api.delete<void>(`/api/revisions/${encodeURIComponent(revisionId)}/runs/${encodeURIComponent(runId)}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: runQueries.evidence(revisionId).queryKey }),
  });
}

/** Changes one of the member's runs: title, the setup it was run on, the registered motor (null detaches). */
export function useUpdateRun(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (patch: RunPatch) => (await api.patch<Envelope<Run>>(`/api/runs/${encodeURIComponent(id)}`, patch)).data,
    onSuccess: (run) => {
      qc.setQueryData(runQueries.detail(id).queryKey, run);
      return qc.invalidateQueries({ queryKey: runQueries.all() });
    },
  });
}
