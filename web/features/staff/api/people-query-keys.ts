import type { QueryClient } from '@tanstack/react-query';

/**
 * Both lists of people live here because a status change touches both, and the clients
 * feature builds on this one (never the other way round).
 */
export const staffQueryKey = ['staff'] as const;
export const clientsQueryKey = ['clients'] as const;

export const invalidatePeople = (queryClient: QueryClient) =>
  Promise.all([
    queryClient.invalidateQueries({ queryKey: staffQueryKey }),
    queryClient.invalidateQueries({ queryKey: clientsQueryKey }),
  ]);
