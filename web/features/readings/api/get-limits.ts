import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TankLimitsView } from '@shared/schemas/limits';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const getLimits = (tankId: string, signal?: AbortSignal) =>
  api<TankLimitsView>(`/tanks/${tankId}/limits`, { signal });

export const limitsQueryOptions = (tankId: string) =>
  queryOptions({ queryKey: tankKeys.limits(tankId), queryFn: ({ signal }) => getLimits(tankId, signal) });

export const useLimits = (tankId: string) => useQuery(limitsQueryOptions(tankId));
