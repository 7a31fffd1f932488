import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDetail, NewInvoiceInput } from '@shared/schemas/billing';
import { api } from '../api-client';
import { invoiceKeys } from '../query-keys';

/**
 * A draft invoice from a published visit report (its service or time on site, consumables and parts)
 * or a resolved urgent request (its call-out fee, and its visit's report). 409 when one exists.
 */
export const draftInvoice = (source: NewInvoiceInput) =>
  api<InvoiceDetail>('/invoices', { method: 'POST', body: source });

export function useDraftInvoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: draftInvoice,
    onSuccess: (invoice) => {
      queryClient.setQueryData(invoiceKeys.detail(invoice.id), invoice);
      void queryClient.invalidateQueries({ queryKey: invoiceKeys.lists() });
    },
  });
}
