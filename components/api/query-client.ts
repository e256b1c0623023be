/** The app's TanStack Query client: retries only failures that may pass on a second try. */
import { QueryClient } from '@tanstack/react-query';
import { isRetryable } from './api-error';

const maxRetries = 2;

/** Builds the client once per app start (one per test in tests). */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        retry: (failureCount, error) => failureCount < maxRetries && isRetryable(error),
      },
      mutations: { retry: false },
    },
  });
}
