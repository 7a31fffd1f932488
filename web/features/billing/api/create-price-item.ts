import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PriceItemInput, PriceItemView } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { billingKeys } from '../../../lib/query-keys';

export const createPriceItem = (input: PriceItemInput) =>
  api<PriceItemView>('/billing/price-items', { method: 'POST', body: input });

export function useCreatePriceItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPriceItem,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: billingKeys.all }),
  });
}
