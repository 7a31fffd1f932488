import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ComfortRange } from '@shared/livestock/comfort-range';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';

/*
 * What a tank's livestock tolerate together: the livestock screen lists it and the readings chart
 * draws it, so it lives below the features.
 */

export interface TankComfortRange extends ComfortRange {
  species: { id: string; commonName: string; scientificName: string }[];
}

export const getComfortRange = (tankId: string, signal?: AbortSignal) =>
  api<TankComfortRange>(`/tanks/${tankId}/comfort-range`, { signal });

export const comfortRangeQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.comfortRange(tankId),
    queryFn: ({ signal }) => getComfortRange(tankId, signal),
  });

export const useComfortRange = (tankId: string) => useQuery(comfortRangeQueryOptions(tankId));
