import { queryOptions } from '@tanstack/react-query';
import type { User } from '@shared/schemas/user';
import { api, type Envelope } from '@/lib/api-client';

/**
 * The signed-in account (or null) as one query, here in the client library so shared code (display
 * preferences) can read it; the auth feature's `authQueries.me` is this same query.
 */
export const meQuery = () =>
  queryOptions({
    queryKey: ['auth', 'me'] as const,
    queryFn: async () => (await api.get<Envelope<{ user: User | null }>>('/api/auth/me')).data.user,
    staleTime: 60_000,
  });
