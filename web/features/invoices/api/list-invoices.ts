import {
  infiniteQueryOptions,
  keepPreviousData,
  useInfiniteQuery,
  type InfiniteData,
} from '@tanstack/react-query';
import type {
  InvoiceListQuery,
  InvoicePage,
  InvoiceSummary,
  InvoiceTotalsRow,
} from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { invoiceKeys } from '../../../lib/query-keys';

/** The list's filters as the API reads them; the cursor belongs to each page, not to the list. */
export type InvoiceFilters = Omit<InvoiceListQuery, 'after'>;

/** The query string for `filters`, its parts in a fixed order so one choice always reads the same. */
export function invoiceSearch(filters: InvoiceFilters, after?: string): URLSearchParams {
  const search = new URLSearchParams();
  if (filters.status) search.set('status', filters.status);
  if (filters.kind) search.set('kind', filters.kind);
  if (filters.tankId) search.set('tankId', filters.tankId);
  if (filters.clientId) search.set('clientId', filters.clientId);
  if (filters.month) search.set('month', filters.month);
  if (after) search.set('after', after);
  return search;
}

export function listInvoices(filters: InvoiceFilters, after?: string, signal?: AbortSignal) {
  const search = invoiceSearch(filters, after);
  return api<InvoicePage>(`/invoices${search.size > 0 ? `?${search}` : ''}`, { signal });
}

/** The pages loaded so far, read as one list. */
export interface InvoiceList {
  items: InvoiceSummary[];
  /** Per currency, over everything the filters match, from the newest page read. */
  totals: InvoiceTotalsRow[];
  /** Every page is loaded. */
  complete: boolean;
}

/**
 * Pages are read at different moments, so a document that moved between them (a draft issued) can
 * come back on a later page too; it is shown once, where it was first seen.
 */
export function mergeInvoicePages(data: InfiniteData<InvoicePage, unknown>): InvoiceList {
  const seen = new Set<string>();
  const items: InvoiceSummary[] = [];
  for (const page of data.pages) {
    for (const item of page.items) {
      if (seen.has(item.id)) continue;
      seen.add(item.id);
      items.push(item);
    }
  }
  const last = data.pages.at(-1);
  return { items, totals: last?.totals ?? [], complete: last !== undefined && last.nextCursor === null };
}

export const invoiceListQueryOptions = (filters: InvoiceFilters) =>
  infiniteQueryOptions({
    queryKey: invoiceKeys.list(filters),
    queryFn: ({ pageParam, signal }) => listInvoices(filters, pageParam, signal),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (page) => page.nextCursor ?? undefined,
    select: mergeInvoicePages,
    // While new filters load, the last list stays on screen instead of a spinner.
    placeholderData: keepPreviousData,
  });

export const useInvoiceList = (filters: InvoiceFilters) => useInfiniteQuery(invoiceListQueryOptions(filters));
