import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { InvoiceDetail } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { invoiceKeys } from '../../../lib/query-keys';

export const getInvoice = (invoiceId: string, signal?: AbortSignal) =>
  api<InvoiceDetail>(`/invoices/${invoiceId}`, { signal });

export const invoiceQueryOptions = (invoiceId: string) =>
  queryOptions({
    queryKey: invoiceKeys.detail(invoiceId),
    queryFn: ({ signal }) => getInvoice(invoiceId, signal),
  });

/**
 * `refetchEvery` says, from the invoice as last read, how often to read it again (false: not until
 * something changes it), so a page can poll while a payment is being confirmed and stop once paid.
 */
export const useInvoice = (
  invoiceId: string,
  { refetchEvery }: { refetchEvery?: (invoice: InvoiceDetail | undefined) => number | false } = {},
) =>
  useQuery({
    ...invoiceQueryOptions(invoiceId),
    refetchInterval: refetchEvery ? (query) => refetchEvery(query.state.data) : false,
  });

/** The document as a PDF: a plain link, downloaded by the browser with the session cookie. */
export const invoicePdfUrl = (invoiceId: string) => `/api/invoices/${invoiceId}/pdf`;

/**
 * After any change: the document answered is stored as it is, and everything about invoices is read
 * again, since lists, totals and related documents move with it.
 */
export function invoiceChanged(queryClient: QueryClient, detail?: InvoiceDetail) {
  if (detail) queryClient.setQueryData(invoiceKeys.detail(detail.id), detail);
  void queryClient.invalidateQueries({ queryKey: invoiceKeys.all });
}
