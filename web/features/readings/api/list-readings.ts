import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { ParameterKey } from '@shared/parameters/keys';
import type { ReadingPage } from '@shared/schemas/readings';
import type { ReadingSource } from '@shared/readings/sources';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export interface ReadingFilters {
  parameter?: ParameterKey;
  source?: ReadingSource;
  /** ISO instants. */
  from?: string;
  to?: string;
}

export function filterSearch(filters: ReadingFilters): URLSearchParams {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value) search.set(key, value);
  return search;
}

export function listReadings(tankId: string, filters: ReadingFilters, before?: string, signal?: AbortSignal) {
  const search = filterSearch(filters);
  search.set('limit', '50');
  if (before) search.set('before', before);
  return api<ReadingPage>(`/tanks/${tankId}/readings/list?${search}`, { signal });
}

export const listReadingsQueryOptions = (tankId: string, filters: ReadingFilters) =>
  infiniteQueryOptions({
    queryKey: tankKeys.readingList(tankId, filters),
    queryFn: ({ pageParam, signal }) => listReadings(tankId, filters, pageParam, signal),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (page) => page.next ?? undefined,
  });

export const useListReadings = (tankId: string, filters: ReadingFilters) =>
  useInfiniteQuery(listReadingsQueryOptions(tankId, filters));
