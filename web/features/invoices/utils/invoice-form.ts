import type { z } from 'zod';
import type { InvoiceLineKind } from '@shared/billing/invoices';
import {
  invoiceTotals,
  lineAmount,
  minorToText,
  parseMoney,
  parseQuantity,
  quantityToText,
  type InvoiceTotals,
} from '@shared/billing/money';
import {
  creditNoteInput,
  invoiceDraftInput,
  moneyText,
  recordPaymentInput,
  type InvoiceDetail,
  type InvoiceLineView,
} from '@shared/schemas/billing';
import { blankAsNull } from '../../../lib/form-values';

/*
 * The invoice forms as the screen holds them: money and quantities as typed text, checked by the
 * shared request schemas (which take text too), plus the company's currency, which the shared
 * schemas cannot know: "12.50" is refused for yen here, as the server would refuse it.
 */

export interface LineFormValues {
  kind: InvoiceLineKind;
  description: string;
  quantity: string;
  unit: string;
  unitPrice: string;
  /** Kept from the price list when a line came from it, so the server still knows where it came from. */
  priceItemId: string | null;
}

export const blankLine = (kind: InvoiceLineKind = 'service'): LineFormValues => ({
  kind,
  description: '',
  quantity: '1',
  unit: '',
  unitPrice: '',
  priceItemId: null,
});

/** A stored line as text; a credit note's amounts (stored negative) are typed positive. */
export const lineFormValues = (line: InvoiceLineView, currency: string): LineFormValues => ({
  kind: line.kind,
  description: line.description,
  quantity: quantityToText(line.quantityHundredths),
  unit: line.unit,
  unitPrice: minorToText(Math.abs(line.unitPriceMinor), currency),
  priceItemId: line.priceItemId,
});

/**
 * The amounts the company's currency cannot hold ("12.5" in yen), said under their field; text the
 * shared schema already refuses keeps that one message.
 */
function moneyFor(currency: string) {
  return (text: string, context: z.RefinementCtx, path: (string | number)[]) => {
    if (!moneyText.safeParse(text).success) return;
    const parsed = parseMoney(text, currency);
    if (!parsed.ok) context.addIssue({ code: 'custom', path, message: parsed.message });
  };
}

function checkLines(currency: string) {
  const money = moneyFor(currency);
  return (values: { lines: { unitPrice: string }[] }, context: z.RefinementCtx) =>
    values.lines.forEach((line, index) => money(line.unitPrice, context, ['lines', index, 'unitPrice']));
}

/* ------------------------------------------------------------------ draft */

export const draftFormSchema = (currency: string) =>
  invoiceDraftInput
    .extend({ billToUserId: blankAsNull(invoiceDraftInput.shape.billToUserId) })
    .superRefine(checkLines(currency));

export type DraftFormValues = Omit<z.input<ReturnType<typeof draftFormSchema>>, 'billToUserId' | 'lines'> & {
  billToUserId: string;
  lines: LineFormValues[];
};

/** The draft as its form starts; a draft made without lines starts with one to fill in. */
export function draftFormValues(draft: InvoiceDetail): DraftFormValues {
  return {
    version: draft.version,
    billToUserId: draft.billToUserId ?? '',
    note: draft.note,
    lines:
      draft.lines.length > 0
        ? draft.lines.map((line) => lineFormValues(line, draft.currency))
        : [blankLine()],
  };
}

/* ------------------------------------------------------------------ credit note */

export const creditNoteFormSchema = (currency: string) => creditNoteInput.superRefine(checkLines(currency));

export interface CreditNoteFormValues {
  reason: string;
  lines: LineFormValues[];
}

export const creditNoteFormValues = (): CreditNoteFormValues => ({ reason: '', lines: [blankLine('other')] });

/* ------------------------------------------------------------------ payment */

export const paymentFormSchema = (currency: string) =>
  recordPaymentInput.superRefine((values, context) => {
    if (!moneyText.safeParse(values.amount).success) return;
    const parsed = parseMoney(values.amount, currency);
    if (!parsed.ok) context.addIssue({ code: 'custom', path: ['amount'], message: parsed.message });
    else if (parsed.minor === 0)
      context.addIssue({ code: 'custom', path: ['amount'], message: 'The amount is more than 0.' });
  });

export type PaymentFormValues = z.input<ReturnType<typeof paymentFormSchema>>;

/** What is still owed, received today by bank transfer: the usual case, changed when it is not. */
export const paymentFormValues = (invoice: InvoiceDetail, today: string): PaymentFormValues => ({
  method: 'bank-transfer',
  amount: invoice.balanceMinor > 0 ? minorToText(invoice.balanceMinor, invoice.currency) : '',
  receivedOn: today,
  reference: '',
});

/* ------------------------------------------------------------------ server issues */

const lineFields: readonly string[] = ['kind', 'description', 'quantity', 'unit', 'unitPrice'];

/**
 * Where a server issue goes on these forms: `lines.2.unitPrice` under that line's price, an issue
 * about a line as a whole (or its price-list item, which has no field) under its description, the
 * version nowhere (a stale version is its own message).
 */
export function invoiceFieldFor(path: string): string | null {
  if (path === 'version') return null;
  const line = /^lines\.(\d+)(?:\.(\w+))?/.exec(path);
  if (!line) return path;
  const field = line[2] && lineFields.includes(line[2]) ? line[2] : 'description';
  return `lines.${line[1]}.${field}`;
}

/* ------------------------------------------------------------------ preview */

export interface TaxTerms {
  currency: string;
  /** "VAT", "GST": shown beside the rate, not used in the sums. */
  taxLabel: string;
  taxRateBp: number;
  pricesIncludeTax: boolean;
}

export interface TotalsPreview {
  /** Each line's amount, or null while its quantity or price cannot be read. */
  amounts: (number | null)[];
  /** Over the lines that can be read, with the same rounding the server uses. */
  totals: InvoiceTotals;
  /** How many lines are left out because they cannot be read yet. */
  leftOut: number;
}

/** The totals the server will compute from these lines, computed by the same shared functions. */
export function previewTotals(
  lines: readonly { quantity?: string; unitPrice?: string }[],
  terms: TaxTerms,
): TotalsPreview {
  const amounts = lines.map((line) => {
    const quantity = parseQuantity(line.quantity ?? '');
    const price = parseMoney(line.unitPrice ?? '', terms.currency);
    return quantity.ok && price.ok ? lineAmount(quantity.hundredths, price.minor) : null;
  });
  const known = amounts.filter((amount): amount is number => amount !== null);
  return {
    amounts,
    totals: invoiceTotals(known, terms.taxRateBp, terms.pricesIncludeTax),
    leftOut: amounts.length - known.length,
  };
}
