import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const deleteLivestock = (tankId: string, livestockId: string) =>
  api<void>(`/tanks/${tankId}/livestock/${livestockId}`, { method: 'DELETE' });

export function useDeleteLivestock(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (livestockId: string) => deleteLivestock(tankId, livestockId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.detail(tankId) }),
  });
}
