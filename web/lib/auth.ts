import { queryOptions, useQuery } from '@tanstack/react-query';
import { roleCan, type Permission } from '@shared/people/permissions';
import type { Me } from '@shared/schemas/users';
import { api, ApiError } from './api-client';
import { apiPaths } from '@shared/first-load/api-paths';

/** The signed-in person, or null when nobody is signed in (a 401 is an answer here, not an error). */
export async function getMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await api<Me>(apiPaths.me(), { signal });
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const meQueryKey = ['me'] as const;

export const meQueryOptions = () =>
  queryOptions({ queryKey: meQueryKey, queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());

/**
 * Whether the signed-in person may do something, read from the same role → permission table the
 * API enforces. Screens ask this instead of comparing role names.
 */
export function can(me: Pick<Me, 'role'> | null | undefined, permission: Permission): boolean {
  return me != null && roleCan(me.role, permission);
}

/** Where to send someone to sign in and come back to the page they were on. */
export function signInUrl(returnTo = `${window.location.pathname}${window.location.search}`) {
  return `/auth/login?returnTo=${encodeURIComponent(returnTo)}`;
}
