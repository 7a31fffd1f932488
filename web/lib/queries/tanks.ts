import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TankListQuery, TankSummary } from '@shared/schemas/tanks';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

/*
 * The list of tanks the signed-in person may see, each judged and summarised, for the tanks pages.
 * Pickers and labels that only name tanks read the lighter `useTankChoices` (./tank-choices.ts).
 */

export function getTanks(query: Partial<TankListQuery> = {}, signal?: AbortSignal) {
  const params = new URLSearchParams();
  if (query.q) params.set('q', query.q);
  if (query.technicianId) params.set('technicianId', query.technicianId);
  const search = params.size > 0 ? `?${params}` : '';
  return api<TankSummary[]>(`${apiPaths.tanks()}${search}`, { signal });
}

export const tanksQueryOptions = (query: Partial<TankListQuery> = {}) =>
  queryOptions({
    queryKey: tankKeys.list(query),
    queryFn: ({ signal }) => getTanks(query, signal),
    // While a new search runs, the last results stay on screen instead of a spinner.
    placeholderData: keepPreviousData,
  });

export const useTanks = (query: Partial<TankListQuery> = {}) => useQuery(tanksQueryOptions(query));
