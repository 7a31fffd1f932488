import { invoiceListQuery } from '@shared/schemas/billing';
import type { InvoiceFilters } from '../api/list-invoices';

/*
 * The staff list's filters live in the address, so a link or a reload shows the same documents. An
 * address is typed by people and pasted around: whatever cannot be read is left out rather than sent
 * on to be refused. The address uses the API's own names, so `invoiceSearch` writes both.
 */

export function readInvoiceAddress(params: URLSearchParams): InvoiceFilters {
  const read = <K extends keyof InvoiceFilters>(key: K): InvoiceFilters[K] | undefined => {
    const value = params.get(key);
    if (value === null || value.trim() === '') return undefined;
    const parsed = invoiceListQuery.shape[key].safeParse(value.trim());
    return parsed.success ? (parsed.data as InvoiceFilters[K]) : undefined;
  };
  const filters: InvoiceFilters = {
    status: read('status'),
    kind: read('kind'),
    tankId: read('tankId'),
    clientId: read('clientId'),
    month: read('month'),
  };
  return Object.fromEntries(
    Object.entries(filters).filter(([, value]) => value !== undefined),
  ) as InvoiceFilters;
}

/** Whether anything narrows the list, so an empty answer says "no match" rather than "none yet". */
export const narrowsInvoices = (filters: InvoiceFilters) =>
  Object.values(filters).some((value) => value !== undefined);

export const sameInvoiceFilters = (a: InvoiceFilters, b: InvoiceFilters) =>
  (a.status ?? '') === (b.status ?? '') &&
  (a.kind ?? '') === (b.kind ?? '') &&
  (a.tankId ?? '') === (b.tankId ?? '') &&
  (a.clientId ?? '') === (b.clientId ?? '') &&
  (a.month ?? '') === (b.month ?? '');
