import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { EquipmentInput, EquipmentItem } from '@shared/schemas/equipment';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const createEquipment = (tankId: string, input: EquipmentInput) =>
  api<EquipmentItem>(`/tanks/${tankId}/equipment`, { method: 'POST', body: input });

export function useCreateEquipment(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: EquipmentInput) => createEquipment(tankId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.equipment(tankId) }),
  });
}
