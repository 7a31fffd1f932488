import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreditNoteInput, InvoiceDetail } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { invoiceChanged } from './get-invoice';

/** Answers with the new credit note; the invoice it credits is read again with everything else. */
export const createCreditNote = (invoiceId: string, input: CreditNoteInput) =>
  api<InvoiceDetail>(`/invoices/${invoiceId}/credit-notes`, { method: 'POST', body: input });

export function useCreateCreditNote(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreditNoteInput) => createCreditNote(invoiceId, input),
    onSuccess: (creditNote) => invoiceChanged(queryClient, creditNote),
  });
}
