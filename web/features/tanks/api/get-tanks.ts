import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TankListQuery, TankSummary } from '@shared/schemas/tanks';
import { api } from '../../../lib/api-client';
import { tankKeys } from './tank-query-keys';

export function getTanks(query: TankListQuery, signal?: AbortSignal) {
  const params = new URLSearchParams();
  if (query.q) params.set('q', query.q);
  if (query.technicianId) params.set('technicianId', query.technicianId);
  const search = params.size > 0 ? `?${params}` : '';
  return api<TankSummary[]>(`/tanks${search}`, { signal });
}

export const tanksListQueryOptions = (query: TankListQuery = {}) =>
  queryOptions({
    queryKey: tankKeys.list(query),
    queryFn: ({ signal }) => getTanks(query, signal),
    // While a new search runs, the last results stay on screen instead of a spinner.
    placeholderData: keepPreviousData,
  });

export const useTanksList = (query: TankListQuery = {}) => useQuery(tanksListQueryOptions(query));
