import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/** A query client with the app's defaults (the server's page pre-render makes its own per request). */
export function createQueryClient() {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // Client errors will not fix themselves; retry only network and server trouble.
        retry: (count, err) => count < 2 && !(err instanceof ApiError && err.status >= 400 && err.status < 500),
      },
    },
  });
}

/** The browser's one query client: route loaders and components share it. */
export const queryClient = createQueryClient();
