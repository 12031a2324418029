import type { GuideFilters } from '@shared/schemas/initial-data';
import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { CLASSES, SURFACES } from '@shared/constants';
import type { GuideSummary } from '@shared/schemas/guide';
import type { GuideComparison, GuideDetail, GuideRevision, ReadableGuideRevision } from '@shared/schemas/reading';
import type { ParameterSummary } from '@shared/schemas/parameter';
import type { RevisionHistoryItem } from '@shared/schemas/revision';
import { api, type Envelope, type ListEnvelope } from '@/lib/api-client';

export type TaxonomyEntry = { slug: string; name: string };
export type Taxonomy = { classes: TaxonomyEntry[]; surfaces: TaxonomyEntry[] };

// Response shapes come from the one contract in shared/schemas (the routes declare the same schemas).
export type { GuideDetail, GuideComparison, GuideRevision, ReadableGuideRevision } from '@shared/schemas/reading';
export type { GuideRecord, GuideSummary } from '@shared/schemas/guide';
/** One row of a guide's history (no content). */
export type HistoryItem = RevisionHistoryItem;

export type { GuideFilters } from '@shared/schemas/initial-data';

/** The guides list's filters in its URL (`?class=…&surface=…&parameter=…&tag=…`). */
export const GUIDE_FILTER_KEYS = ['class', 'surface', 'parameter', 'tag'] as const;

/** The filters a guides list URL asks for; the page in the browser and the page the server draws read them alike. */
export function guideFiltersFrom(params: URLSearchParams): GuideFilters {
  const filters: GuideFilters = {};
  for (const k of GUIDE_FILTER_KEYS) {
    const v = params.get(k);
    if (v) filters[k] = v;
  }
  return filters;
}

const fallbackTaxonomy: Taxonomy = { classes: CLASSES.map((c) => ({ ...c })), surfaces: SURFACES.map((s) => ({ ...s })) };

/** Query-option factories for guides (keys general → specific). */
export const guideQueries = {
  all: () => ['guides'] as const,
  lists: () => [...guideQueries.all(), 'list'] as const,
  list: (filters: GuideFilters) =>
    queryOptions({
      queryKey: [...guideQueries.lists(), filters] as const,
      queryFn: async () => (await api.get<ListEnvelope<GuideSummary>>('/api/guides', { query: filters })).data,
      placeholderData: keepPreviousData,
    }),
  detail: (slug: string) =>
    queryOptions({
      queryKey: [...guideQueries.all(), 'detail', slug] as const,
      queryFn: async () => (await api.get<Envelope<GuideDetail>>(`/api/guides/${encodeURIComponent(slug)}`)).data,
    }),
  revisions: (slug: string) =>
    queryOptions({
      queryKey: [...guideQueries.all(), 'detail', slug, 'revisions'] as const,
      queryFn: async () => (await api.get<ListEnvelope<HistoryItem>>(`/api/guides/${encodeURIComponent(slug)}/revisions`)).data,
    }),
  revision: (slug: string, number: number) =>
    queryOptions({
      queryKey: [...guideQueries.all(), 'detail', slug, 'revisions', number] as const,
      queryFn: async () => (await api.get<Envelope<{ revision: ReadableGuideRevision }>>(`/api/guides/${encodeURIComponent(slug)}/revisions/${number}`)).data,
      select: (data) => data.revision,
    }),
  compare: (slug: string, from: number, to: number) =>
    queryOptions({
      queryKey: [...guideQueries.all(), 'detail', slug, 'compare', from, to] as const,
      queryFn: async () => (await api.get<Envelope<GuideComparison>>(`/api/guides/${encodeURIComponent(slug)}/compare`, { query: { from, to } })).data,
    }),
  taxonomy: () =>
    queryOptions({
      queryKey: [...guideQueries.all(), 'taxonomy'] as const,
      queryFn: async () => (await api.get<Envelope<Taxonomy>>('/api/taxonomy')).data,
      staleTime: Infinity,
      placeholderData: fallbackTaxonomy,
    }),
  parameterOptions: () =>
    queryOptions({
      queryKey: [...guideQueries.all(), 'parameter-options'] as const,
      queryFn: async () => (await api.get<ListEnvelope<ParameterSummary>>('/api/parameters')).data,
      staleTime: 10 * 60_000,
    }),
};

/** A name for a class or surface slug, falling back to the slug itself. */
export function taxonomyName(list: TaxonomyEntry[] | undefined, slug: string) {
  return list?.find((e) => e.slug === slug)?.name ?? slug;
}

/** Moderator: publish a copy of an older revision as the new live one, with a reason its author is sent. */
export function useRestoreRevision(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ number, reason }: { number: number; reason: string }) =>
      (await api.post<Envelope<{ revision: GuideRevision }>>(`/api/guides/${encodeURIComponent(slug)}/restore`, { number, reason })).data,
    onSuccess: () => qc.invalidateQueries({ queryKey: guideQueries.all() }),
  });
}

/** Moderator: take a guide out of public view, with a reason for the record. */
export function useHideGuide(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (reason: string) => api.post(`/api/guides/${encodeURIComponent(slug)}/hide`, { reason }),
    onSuccess: () => qc.invalidateQueries({ queryKey: guideQueries.all() }),
  });
}

/** Moderator: show a hidden guide to readers again. */
export function useUnhideGuide(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post(`/api/guides/${encodeURIComponent(slug)}/unhide`, {}),
    onSuccess: () => qc.invalidateQueries({ queryKey: guideQueries.all() }),
  });
}
