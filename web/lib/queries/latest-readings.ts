import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TankHealthSummary } from '@shared/schemas/readings';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

/*
 * A tank's latest reading of each parameter, judged against its limits. The readings section and
 * the owner's tank cards (for the last reading's age) both read it, so it lives below the features.
 */

export const getLatestReadings = (tankId: string, signal?: AbortSignal) =>
  api<TankHealthSummary>(apiPaths.latestReadings(tankId), { signal });

export const latestReadingsQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.latestReadings(tankId),
    queryFn: ({ signal }) => getLatestReadings(tankId, signal),
    // Devices report every few minutes; a minute keeps "latest" honest without hammering.
    refetchInterval: 60_000,
  });

export const useLatestReadings = (tankId: string, enabled = true) =>
  useQuery({ ...latestReadingsQueryOptions(tankId), enabled });
