import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { EquipmentItem, EquipmentPatch } from '@shared/schemas/equipment';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const updateEquipment = (tankId: string, equipmentId: string, input: EquipmentPatch) =>
  api<EquipmentItem>(`/tanks/${tankId}/equipment/${equipmentId}`, { method: 'PATCH', body: input });

export function useUpdateEquipment(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ equipmentId, input }: { equipmentId: string; input: EquipmentPatch }) =>
      updateEquipment(tankId, equipmentId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.equipment(tankId) }),
  });
}
