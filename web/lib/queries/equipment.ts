import { queryOptions, useQuery } from '@tanstack/react-query';
import type { EquipmentItem } from '@shared/schemas/equipment';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';

/*
 * A tank's equipment: its own screen, the tank page and the visit report all read it, so it lives
 * below the features.
 */

export const getEquipment = (tankId: string, signal?: AbortSignal) =>
  api<EquipmentItem[]>(`/tanks/${tankId}/equipment`, { signal });

export const equipmentQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.equipment(tankId),
    queryFn: ({ signal }) => getEquipment(tankId, signal),
  });

export const useEquipment = (tankId: string, enabled = true) =>
  useQuery({ ...equipmentQueryOptions(tankId), enabled });
