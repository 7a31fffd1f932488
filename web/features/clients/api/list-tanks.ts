import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TankSummary } from '@shared/schemas/tanks';
import { api } from '../../../lib/api-client';

export const getTanks = (signal?: AbortSignal) => api<TankSummary[]>('/tanks', { signal });

/** The same key the console's tank list uses, so both read one cache entry. */
export const tanksQueryKey = ['tanks'] as const;

export const tanksQueryOptions = () =>
  queryOptions({ queryKey: tanksQueryKey, queryFn: ({ signal }) => getTanks(signal) });

export const useTanks = () => useQuery(tanksQueryOptions());
