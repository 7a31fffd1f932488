import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDetail } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { invoiceChanged } from './get-invoice';

/** Numbers the draft and e-mails it, with its PDF, to the owner it is addressed to. */
export const issueInvoice = (invoiceId: string, version: number) =>
  api<InvoiceDetail>(`/invoices/${invoiceId}/issue`, { method: 'POST', body: { version } });

export function useIssueInvoice(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (version: number) => issueInvoice(invoiceId, version),
    onSuccess: (detail) => invoiceChanged(queryClient, detail),
  });
}
