import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDetail, RecordPaymentInput } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { invoiceChanged } from './get-invoice';

/** A payment received outside the provider (bank transfer, cash, a card in person). */
export const recordPayment = (invoiceId: string, input: RecordPaymentInput) =>
  api<InvoiceDetail>(`/invoices/${invoiceId}/payments`, { method: 'POST', body: input });

export function useRecordPayment(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RecordPaymentInput) => recordPayment(invoiceId, input),
    onSuccess: (detail) => invoiceChanged(queryClient, detail),
  });
}
