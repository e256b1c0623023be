/** The app's TanStack Query client: retries only failures that may pass on a second try. */
import { onlineManager, QueryClient } from '@tanstack/react-query';
import { isRetryable } from './api-error';

const maxRetries = 2;

/** Builds the client once per app start (one per test in tests). */
export function createQueryClient(): QueryClient {
  // TanStack Query assumes "online" until the browser fires an event; a page opened with no network must know at
  // once, so queries wait (paused) and screens show their device copies, said so, instead of a browser-cache answer.
  if (typeof navigator !== 'undefined' && navigator.onLine === false) onlineManager.setOnline(false);
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
