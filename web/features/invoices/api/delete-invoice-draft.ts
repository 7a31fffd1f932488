import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { invoiceKeys } from '../../../lib/query-keys';

/** Drafts only: an issued document is never deleted, it is cancelled or credited. */
export const deleteInvoiceDraft = (invoiceId: string) =>
  api<void>(`/invoices/${invoiceId}`, { method: 'DELETE' });

export function useDeleteInvoiceDraft(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteInvoiceDraft(invoiceId),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: invoiceKeys.detail(invoiceId) });
      void queryClient.invalidateQueries({ queryKey: invoiceKeys.lists() });
    },
  });
}
