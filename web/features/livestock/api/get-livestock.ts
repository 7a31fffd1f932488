import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LivestockItem } from '@shared/schemas/livestock';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const getLivestock = (tankId: string, signal?: AbortSignal) =>
  api<LivestockItem[]>(`/tanks/${tankId}/livestock`, { signal });

export const livestockQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.livestock(tankId),
    queryFn: ({ signal }) => getLivestock(tankId, signal),
  });

export const useLivestock = (tankId: string) => useQuery(livestockQueryOptions(tankId));
