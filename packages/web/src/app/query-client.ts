import { QueryClient } from '@tanstack/react-query';
import { ApiError } from '../lib/api-client';

/** The app's one QueryClient. Client errors (4xx) are not retried: they will not fix themselves. */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (failureCount, error) =>
          !(error instanceof ApiError && error.status >= 400 && error.status < 500) &&
          failureCount < 2,
        refetchOnWindowFocus: false,
      },
      mutations: { retry: false },
    },
  });
}
