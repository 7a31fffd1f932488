import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TankVisits } from '@shared/schemas/visits';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

export const getTankVisits = (tankId: string, signal?: AbortSignal) =>
  api<TankVisits>(apiPaths.tankVisits(tankId), { signal });

export const tankVisitsQueryOptions = (tankId: string) =>
  queryOptions({ queryKey: tankKeys.visits(tankId), queryFn: ({ signal }) => getTankVisits(tankId, signal) });

export const useTankVisits = (tankId: string) => useQuery(tankVisitsQueryOptions(tankId));
