import { queryOptions, useQuery } from '@tanstack/react-query';
import type { EquipmentItem } from '@shared/schemas/equipment';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const getEquipment = (tankId: string, signal?: AbortSignal) =>
  api<EquipmentItem[]>(`/tanks/${tankId}/equipment`, { signal });

export const equipmentQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.equipment(tankId),
    queryFn: ({ signal }) => getEquipment(tankId, signal),
  });

export const useEquipment = (tankId: string) => useQuery(equipmentQueryOptions(tankId));
