import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PriceItemInput, PriceItemView } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { billingKeys } from '../../../lib/query-keys';

export const updatePriceItem = (priceItemId: string, input: PriceItemInput) =>
  api<PriceItemView>(`/billing/price-items/${priceItemId}`, { method: 'PUT', body: input });

export function useUpdatePriceItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ priceItemId, input }: { priceItemId: string; input: PriceItemInput }) =>
      updatePriceItem(priceItemId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: billingKeys.all }),
  });
}
