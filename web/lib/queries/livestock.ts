import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LivestockItem } from '@shared/schemas/livestock';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';

/*
 * A tank's livestock: its own screen, the tank page and the visit report all read it, so it lives
 * below the features.
 */

export const getLivestock = (tankId: string, signal?: AbortSignal) =>
  api<LivestockItem[]>(`/tanks/${tankId}/livestock`, { signal });

export const livestockQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.livestock(tankId),
    queryFn: ({ signal }) => getLivestock(tankId, signal),
  });

export const useLivestock = (tankId: string, enabled = true) =>
  useQuery({ ...livestockQueryOptions(tankId), enabled });
