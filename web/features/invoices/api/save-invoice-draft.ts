import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDetail, InvoiceDraftInput } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { invoiceChanged } from './get-invoice';

/** A draft's bill-to, note and lines; 409 stale_version when someone saved it since `version`. */
export const saveInvoiceDraft = (invoiceId: string, input: InvoiceDraftInput) =>
  api<InvoiceDetail>(`/invoices/${invoiceId}`, { method: 'PUT', body: input });

export function useSaveInvoiceDraft(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvoiceDraftInput) => saveInvoiceDraft(invoiceId, input),
    onSuccess: (detail) => invoiceChanged(queryClient, detail),
  });
}
