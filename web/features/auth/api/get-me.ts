import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Me } from '@shared/schemas/users';
import { api, ApiError } from '../../../lib/api-client';

/** The signed-in person, or null when nobody is signed in (a 401 is an answer here, not an error). */
export async function getMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await api<Me>('/me', { signal });
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const meQueryKey = ['me'] as const;

export const meQueryOptions = () =>
  queryOptions({ queryKey: meQueryKey, queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
