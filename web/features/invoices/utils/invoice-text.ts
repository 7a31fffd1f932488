import { documentStatusLabel, type InvoiceKind } from '@shared/billing/invoices';
import { formatTaxRate } from '@shared/billing/money';
import { formatDate, formatDay } from '../../../lib/format';

/** "Invoice INV-000042", "Credit note CN-000007", "Draft invoice". */
export function documentTitle(doc: { kind: InvoiceKind; number: string | null }): string {
  const kind = doc.kind === 'invoice' ? 'Invoice' : 'Credit note';
  return doc.number ? `${kind} ${doc.number}` : `Draft ${kind.toLowerCase()}`;
}

/** The shared words for a document's state (a credit note, once issued, is "Issued"). */
export const statusLabel = documentStatusLabel;

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
