import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { billingKeys } from '../../../lib/query-keys';

/** Archived, not deleted: reports and invoices that name the item keep its name. */
export const archivePriceItem = (priceItemId: string) =>
  api<void>(`/billing/price-items/${priceItemId}`, { method: 'DELETE' });

export function useArchivePriceItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: archivePriceItem,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: billingKeys.all }),
  });
}
