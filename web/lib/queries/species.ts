import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SpeciesEntry } from '@shared/schemas/livestock';
import { api } from '../api-client';
import { speciesKeys } from '../query-keys';

/*
 * The species catalogue (with the company's own species) by name, and one species by its id: a care
 * tip's audience names a species, and its composer shows which.
 */

export const searchSpeciesByName = (q: string, limit: number, signal?: AbortSignal) =>
  api<SpeciesEntry[]>(`/species?${new URLSearchParams({ q, limit: String(limit) }).toString()}`, {
    signal,
  });

/** Searches from two letters on; the last results stay while a longer name is typed. */
export const useSpeciesByName = (q: string, limit = 8) =>
  useQuery({
    queryKey: speciesKeys.search({ q, limit }),
    queryFn: ({ signal }) => searchSpeciesByName(q, limit, signal),
    enabled: q.trim().length >= 2,
    placeholderData: keepPreviousData,
    staleTime: 5 * 60_000,
  });

export const speciesQueryOptions = (speciesId: string) =>
  queryOptions({
    queryKey: speciesKeys.detail(speciesId),
    queryFn: ({ signal }) => api<SpeciesEntry>(`/species/${encodeURIComponent(speciesId)}`, { signal }),
    staleTime: 5 * 60_000,
  });

export const useSpecies = (speciesId: string | null) =>
  useQuery({ ...speciesQueryOptions(speciesId ?? ''), enabled: speciesId !== null && speciesId !== '' });
