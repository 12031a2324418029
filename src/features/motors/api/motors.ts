import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { Check, Motor, MotorCompare, MotorCreate, MotorPatch } from '@shared/schemas/motor';
import { api, type Envelope, type ListEnvelope } from '@/lib/api-client';

/** Query-option factories for the motor register (keys general → specific). */
export const motorQueries = {
  all: () => ['motors'] as const,
  list: () =>
    queryOptions({ queryKey: [...motorQueries.all(), 'list'] as const, queryFn: async () => (await api.get<ListEnvelope<Motor>>('/api/motors')).data }),
  detail: (id: string) =>
    queryOptions({ queryKey: [...motorQueries.all(), 'detail', id] as const, queryFn: async () => (await api.get<Envelope<Motor>>(`/api/motors/${id}`)).data }),
  checks: (id: string) =>
    queryOptions({
      queryKey: [...motorQueries.all(), 'detail', id, 'checks'] as const,
      queryFn: async () => (await api.get<ListEnvelope<Check>>(`/api/motors/${id}/checks`)).data,
    }),
  compare: (id: string, from?: string, to?: string) =>
    queryOptions({
      queryKey: [...motorQueries.all(), 'detail', id, 'compare', from ?? null, to ?? null] as const,
      queryFn: async () => (await api.get<Envelope<MotorCompare>>(`/api/motors/${id}/compare`, { query: { from, to } })).data,
    }),
};

/** Where a motor's checks download as CSV, and its printable sheet. */
export const motorLinks = (id: string) => ({ csv: `/api/motors/${id}/checks.csv`, print: `/motors/${id}/print` });

export function useCreateMotor() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: MotorCreate) => (await api.post<Envelope<Motor>>('/api/motors', body)).data,
    onSuccess: () => qc.invalidateQueries({ queryKey: motorQueries.all() }),
  });
}

export function useUpdateMotor(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (patch: MotorPatch) => (await api.patch<Envelope<Motor>>(`/api/motors/${id}`, patch)).data,
    onSuccess: () => qc.invalidateQueries({ queryKey: motorQueries.all() }),
  });
}

export function useDeleteMotor() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<void>(`/api/motors/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: motorQueries.all() }),
  });
}

export function useAddCheck(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: Record<string, unknown>) => (await api.post<Envelope<Check>>(`/api/motors/${id}/checks`, body)).data,
    onSuccess: () => qc.invalidateQueries({ queryKey: motorQueries.all() }),
  });
}

export function useDeleteCheck(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (checkId: string) => api.delete<void>(`/api/motors/${id}/checks/${checkId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: motorQueries.all() }),
  });
}
