import { queryOptions, useQuery } from '@tanstack/react-query';
import type { EquipmentItem } from '@shared/schemas/equipment';
import { api } from '../../../lib/api-client';
import { equipmentKeys } from './equipment-query-keys';

export const getEquipment = (tankId: string, signal?: AbortSignal) =>
  api<EquipmentItem[]>(`/tanks/${tankId}/equipment`, { signal });

export const equipmentQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: equipmentKeys.list(tankId),
    queryFn: ({ signal }) => getEquipment(tankId, signal),
  });

export const useEquipment = (tankId: string) => useQuery(equipmentQueryOptions(tankId));
