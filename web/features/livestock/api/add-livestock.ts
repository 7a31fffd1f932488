import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AddLivestockInput, LivestockItem } from '@shared/schemas/livestock';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const addLivestock = (tankId: string, input: AddLivestockInput) =>
  api<LivestockItem>(`/tanks/${tankId}/livestock`, { method: 'POST', body: input });

export function useAddLivestock(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AddLivestockInput) => addLivestock(tankId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.detail(tankId) }),
  });
}
