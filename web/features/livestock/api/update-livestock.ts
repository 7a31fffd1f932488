import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LivestockItem, UpdateLivestockInput } from '@shared/schemas/livestock';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const updateLivestock = (tankId: string, livestockId: string, input: UpdateLivestockInput) =>
  api<LivestockItem>(`/tanks/${tankId}/livestock/${livestockId}`, { method: 'PATCH', body: input });

export function useUpdateLivestock(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ livestockId, input }: { livestockId: string; input: UpdateLivestockInput }) =>
      updateLivestock(tankId, livestockId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.detail(tankId) }),
  });
}
