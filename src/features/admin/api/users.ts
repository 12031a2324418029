import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { AdminUser } from '@shared/schemas/user';
import type { Role } from '@shared/constants';
import { api, type Envelope, type ListEnvelope } from '@/lib/api-client';

type UserListParams = { q?: string; page: number; pageSize: number };

export const adminUserQueries = {
  all: () => ['admin', 'users'] as const,
  list: (params: UserListParams) =>
    queryOptions({
      queryKey: [...adminUserQueries.all(), 'list', params] as const,
      queryFn: () => api.get<ListEnvelope<AdminUser, { total: number; page: number; pageSize: number }>>('/api/admin/users', { query: params }),
      placeholderData: keepPreviousData,
    }),
};

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, ...patch }: { id: string; role?: Role; disabled?: boolean; reason?: string }) =>
      (await api.patch<Envelope<{ user: AdminUser }>>(`/api/admin/users/${id}`, patch)).data.user,
    onSuccess: () => qc.invalidateQueries({ queryKey: adminUserQueries.all() }),
  });
}
