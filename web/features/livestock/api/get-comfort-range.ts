import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ComfortRange } from '@shared/livestock/comfort-range';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

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
