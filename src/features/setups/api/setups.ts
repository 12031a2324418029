import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { SettingDefinitionRow, SetupLibrary, SetupUpload, CompareSide } from '@shared/schemas/setup';
import type { SetupRecord } from '@shared/schemas/setup-record';
import type { SetupComputed } from '@shared/setup/computed';
import type { SetupComparison } from '@shared/setup/compare';
import { api, type Envelope } from '@/lib/api-client';

export type CompareResult = SetupComparison & { a: CompareSide; b: CompareSide };

/** Query-option factories for setups (keys general → specific). */
export const setupQueries = {
  all: () => ['setups'] as const,
  library: () =>
    queryOptions({ queryKey: [...setupQueries.all(), 'library'] as const, queryFn: async () => (await api.get<Envelope<SetupLibrary>>('/api/setups')).data }),
  escSettings: () =>
    queryOptions({
      queryKey: [...setupQueries.all(), 'esc-settings'] as const,
      queryFn: async () => (await api.get<Envelope<SettingDefinitionRow[]>>('/api/setups/esc-settings')).data,
      staleTime: 10 * 60_000,
    }),
  guide: (slug: string) =>
    queryOptions({
      queryKey: [...setupQueries.all(), 'guide', slug] as const,
      queryFn: async () => {
        const res = await api.get<{ data: SetupRecord; meta: { computed: SetupComputed } }>(`/api/guides/${encodeURIComponent(slug)}/setup`);
        return { record: res.data, computed: res.meta.computed };
      },
    }),
  compare: (a: string, b: string, rpm?: number) =>
    queryOptions({
      queryKey: [...setupQueries.all(), 'compare', a, b, rpm ?? null] as const,
      queryFn: async () => (await api.get<Envelope<CompareResult>>('/api/setups/compare', { query: { a, b, rpm } })).data,
    }),
};

/** Download links of a guide's baseline. */
export const guideSetupLinks = (slug: string) => ({
  json: `/api/guides/${encodeURIComponent(slug)}/setup.json`,
  csv: `/api/guides/${encodeURIComponent(slug)}/setup.csv`,
  print: `/guides/${encodeURIComponent(slug)}/setup/print`,
});

/**
 * Uploads a setup file with its upload progress (the API client's XMLHttpRequest upload).
 * Resolves with the stored upload; rejects with an ApiError whose details list every problem.
 */
export async function uploadSetupFile(file: File, onProgress: (fraction: number) => void): Promise<SetupUpload> {
  const form = new FormData();
  form.append('file', file, file.name);
  const stored = (await api.upload<Envelope<SetupUpload>>('/api/setups', form, onProgress)).data;
  onProgress(1);
  return stored;
}

export function useUploadSetup() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ file, onProgress }: { file: File; onProgress: (f: number) => void }) => uploadSetupFile(file, onProgress),
    onSuccess: () => qc.invalidateQueries({ queryKey: setupQueries.all() }),
  });
}

export function useDeleteUpload() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<void>(`/api/setups/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: setupQueries.all() }),
  });
}

/** Attaches a baseline to the author's own draft (used by the guide editor). */
export function useAttachSetup(revisionId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (record: SetupRecord | null) =>
      record
        ? (await api.put<Envelope<SetupRecord>>(`/api/revisions/${revisionId}/setup`, record)).data
        : (await api.delete<void>(`/api/revisions/${revisionId}/setup`), null),
    onSuccess: () => qc.invalidateQueries({ queryKey: setupQueries.all() }),
  });
}
