import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TankHealthSummary } from '@shared/schemas/readings';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const getLatestReadings = (tankId: string, signal?: AbortSignal) =>
  api<TankHealthSummary>(`/tanks/${tankId}/readings/latest`, { signal });

export const latestReadingsQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.latestReadings(tankId),
    queryFn: ({ signal }) => getLatestReadings(tankId, signal),
    // Devices report every few minutes; a minute keeps "latest" honest without hammering.
    refetchInterval: 60_000,
  });

export const useLatestReadings = (tankId: string) => useQuery(latestReadingsQueryOptions(tankId));
