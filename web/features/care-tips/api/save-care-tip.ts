import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CareTip, CareTipInput } from '@shared/schemas/care-tips';
import { api } from '../../../lib/api-client';
import { tipKeys } from '../../../lib/query-keys';

export const createCareTip = (input: CareTipInput) =>
  api<CareTip>('/care-tips', { method: 'POST', body: input });

export const updateCareTip = (tipId: string, input: Partial<CareTipInput>) =>
  api<CareTip>(`/care-tips/${tipId}`, { method: 'PATCH', body: input });

/** Saves a draft (or changes a tip not yet sent): a new one without `tipId`, a change with it. */
export function useSaveCareTip() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ tipId, input }: { tipId: string | null; input: CareTipInput }) =>
      tipId === null ? createCareTip(input) : updateCareTip(tipId, input),
    onSuccess: (tip) => {
      queryClient.setQueryData(tipKeys.detail(tip.id), tip);
      void queryClient.invalidateQueries({ queryKey: tipKeys.lists() });
    },
  });
}
