import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SpeciesEntry, SpeciesQuery } from '@shared/schemas/livestock';
import { api } from '../../../lib/api-client';
import { speciesKeys } from '../../../lib/query-keys';

export function searchSpecies(query: Partial<SpeciesQuery>, signal?: AbortSignal) {
  const params = new URLSearchParams();
  if (query.q) params.set('q', query.q);
  if (query.waterType) params.set('waterType', query.waterType);
  if (query.group) params.set('group', query.group);
  if (query.limit) params.set('limit', String(query.limit));
  return api<SpeciesEntry[]>(`/species?${params}`, { signal });
}

export const speciesSearchQueryOptions = (query: Partial<SpeciesQuery>) =>
  queryOptions({
    queryKey: speciesKeys.search(query),
    queryFn: ({ signal }) => searchSpecies(query, signal),
    placeholderData: keepPreviousData,
    staleTime: 5 * 60_000,
  });

export const useSpeciesSearch = (query: Partial<SpeciesQuery>, enabled = true) =>
  useQuery({ ...speciesSearchQueryOptions(query), enabled });
