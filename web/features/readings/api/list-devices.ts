import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DeviceSummary } from '@shared/schemas/readings';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const listDevices = (tankId: string, signal?: AbortSignal) =>
  api<DeviceSummary[]>(`/tanks/${tankId}/devices`, { signal });

export const devicesQueryOptions = (tankId: string) =>
  queryOptions({ queryKey: tankKeys.devices(tankId), queryFn: ({ signal }) => listDevices(tankId, signal) });

export const useDevices = (tankId: string, enabled = true) =>
  useQuery({ ...devicesQueryOptions(tankId), enabled });
