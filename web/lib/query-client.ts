import { QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/** Retrying a 4xx only repeats the same answer; network blips and 5xx get two more tries. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

/**
 * `onUnauthenticated` runs when a query learns the session has ended (a 401): the app sends
 * the person to sign in and back to where they were.
 */
export function createQueryClient(onUnauthenticated: () => void = () => {}) {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (error instanceof ApiError && error.status === 401) onUnauthenticated();
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        gcTime: 5 * 60_000,
        retry: shouldRetry,
        refetchOnWindowFocus: true,
      },
      mutations: { retry: false },
    },
  });
}
