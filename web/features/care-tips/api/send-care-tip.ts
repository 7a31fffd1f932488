import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CareTip } from '@shared/schemas/care-tips';
import { api } from '../../../lib/api-client';
import { tipKeys } from '../../../lib/query-keys';

/** `at` null: now; an instant: a scheduled send at that time. */
export const sendCareTip = (tipId: string, at: string | null) =>
  api<CareTip>(`/care-tips/${tipId}/send`, { method: 'POST', body: { at } });

export const withdrawCareTip = (tipId: string) =>
  api<CareTip>(`/care-tips/${tipId}/withdraw`, { method: 'POST' });

function useTipChange<V>(change: (variables: V) => Promise<CareTip>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: change,
    onSuccess: (tip) => {
      queryClient.setQueryData(tipKeys.detail(tip.id), tip);
      void queryClient.invalidateQueries({ queryKey: tipKeys.detail(tip.id) });
      void queryClient.invalidateQueries({ queryKey: tipKeys.lists() });
      // A tip sent or withdrawn enters or leaves the feeds.
      void queryClient.invalidateQueries({ queryKey: tipKeys.feeds() });
    },
  });
}

export const useSendCareTip = () =>
  useTipChange(({ tipId, at }: { tipId: string; at: string | null }) => sendCareTip(tipId, at));

export const useWithdrawCareTip = () => useTipChange((tipId: string) => withdrawCareTip(tipId));
