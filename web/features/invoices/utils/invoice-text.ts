import { invoiceStatusLabels, type InvoiceKind, type InvoiceStatus } from '@shared/billing/invoices';
import { formatTaxRate } from '@shared/billing/money';
import { formatDate, formatDay } from '../../../lib/format';

/** "Invoice INV-000042", "Credit note CN-000007", "Draft invoice". */
export function documentTitle(doc: { kind: InvoiceKind; number: string | null }): string {
  const kind = doc.kind === 'invoice' ? 'Invoice' : 'Credit note';
  return doc.number ? `${kind} ${doc.number}` : `Draft ${kind.toLowerCase()}`;
}

/**
 * A credit note is never owed, so once issued it is simply "Issued", whatever state the API keeps
 * it in; an invoice's states are the shared words.
 */
export function statusLabel(kind: InvoiceKind, status: InvoiceStatus): string {
  if (kind === 'credit-note' && status !== 'draft' && status !== 'void') return 'Issued';
  return invoiceStatusLabels[status];
}

/** "VAT 20 %": the tax's own name with its rate. */
export const taxLine = (taxLabel: string, taxRateBp: number) => `${taxLabel} ${formatTaxRate(taxRateBp)}`;

/**
 * A calendar day ("2026-12-01") as that day, or a moment as its date in `timeZone` (the tank's, where
 * the document is read in it); "—" for none.
 */
export function documentDate(value: string | null, timeZone?: string): string {
  if (!value) return '—';
  return /^\d{4}-\d\d-\d\d$/.test(value) ? formatDay(value) : formatDate(value, timeZone);
}
