import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const deleteEquipment = (tankId: string, equipmentId: string) =>
  api<void>(`/tanks/${tankId}/equipment/${equipmentId}`, { method: 'DELETE' });

export function useDeleteEquipment(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (equipmentId: string) => deleteEquipment(tankId, equipmentId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.equipment(tankId) }),
  });
}
