import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDetail } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { invoiceChanged } from './get-invoice';

/** Cancels an invoice nothing was paid or credited on; the answer is the invoice, its full credit note in `related`. */
export const voidInvoice = (invoiceId: string, reason: string) =>
  api<InvoiceDetail>(`/invoices/${invoiceId}/void`, { method: 'POST', body: { reason } });

export function useVoidInvoice(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (reason: string) => voidInvoice(invoiceId, reason),
    onSuccess: (detail) => invoiceChanged(queryClient, detail),
  });
}
