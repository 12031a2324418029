import { queryOptions } from '@tanstack/react-query';
import { api, type Envelope } from '@/lib/api-client';

export type CapturedMail = { id: string; to: string; from: string; subject: string; text: string; html: string | null; receivedAt: string };

export const devMailQueries = {
  all: () => ['dev-mail'] as const,
  list: () =>
    queryOptions({
      queryKey: [...devMailQueries.all(), 'list'] as const,
      queryFn: async () => (await api.get<Envelope<CapturedMail[]>>('/api/dev/mail')).data,
      refetchInterval: 3000,
    }),
};
