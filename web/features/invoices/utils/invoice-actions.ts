import { unpaidStatuses } from '@shared/billing/invoices';
import type { InvoiceDetail } from '@shared/schemas/billing';

/**
 * What an admin can still do with an issued document in its state (a draft has its editor instead):
 * an invoice still owed takes a payment, a credit note or a cancellation; a paid one a credit note
 * only; a cancelled invoice or a credit note nothing.
 */
export function invoiceActions(
  invoice: Pick<InvoiceDetail, 'kind' | 'status' | 'paidMinor' | 'creditedMinor'>,
) {
  const isInvoice = invoice.kind === 'invoice';
  const unpaid = isInvoice && unpaidStatuses.includes(invoice.status);
  // Once anything was paid or credited, the API refuses to cancel: a credit note says exactly what is taken back.
  const touched = invoice.paidMinor !== 0 || invoice.creditedMinor !== 0;
  return {
    recordPayment: unpaid,
    creditNote: unpaid || (isInvoice && invoice.status === 'paid'),
    cancel: unpaid && !touched,
    /** Owed, but cancelling is no longer possible: the page says why. */
    cancelRefused: unpaid && touched,
  };
}
