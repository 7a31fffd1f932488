import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TankDetail } from '@shared/schemas/tanks';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

export const getTank = (tankId: string, signal?: AbortSignal) =>
  api<TankDetail>(apiPaths.tank(tankId), { signal });

export const tankQueryOptions = (tankId: string) =>
  queryOptions({ queryKey: tankKeys.detail(tankId), queryFn: ({ signal }) => getTank(tankId, signal) });

export const useTank = (tankId: string) => useQuery(tankQueryOptions(tankId));
