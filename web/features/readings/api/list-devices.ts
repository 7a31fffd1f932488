import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DeviceSummary } from '@shared/schemas/readings';
import { api } from '../../../lib/api-client';

export const devicesQueryKey = (tankId: string) => ['tanks', tankId, 'devices'] as const;

export const listDevices = (tankId: string, signal?: AbortSignal) =>
  api<DeviceSummary[]>(`/tanks/${tankId}/devices`, { signal });

export const devicesQueryOptions = (tankId: string) =>
  queryOptions({ queryKey: devicesQueryKey(tankId), queryFn: ({ signal }) => listDevices(tankId, signal) });

export const useDevices = (tankId: string, enabled = true) =>
  useQuery({ ...devicesQueryOptions(tankId), enabled });
