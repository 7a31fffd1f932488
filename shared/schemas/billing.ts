import { z } from 'zod';
import {
  invoiceKinds,
  invoiceLineKinds,
  invoiceStatuses,
  paymentMethods,
  priceItemKinds,
  type InvoiceEventType,
  type InvoiceKind,
  type InvoiceLineKind,
  type InvoiceStatus,
  type PaymentMethod,
  type PriceItemKind,
} from '@shared/billing/invoices';
import { currencies, maxQuantity, type Currency } from '@shared/billing/money';
import { cursorParam } from '@shared/lists/cursor';
import { calendarDay } from '@shared/time/plausible';

/*
 * Billing requests and answers. Money travels as text in the major unit ("12.50") on the way in,
 * so no client ever sends a floating-point amount, and as integer minor units with the currency on
 * the way out. The server parses the text for the company's currency and recomputes every total.
 */

export const priceItemIdParams = z.object({ priceItemId: z.uuid() });
export const invoiceIdParams = z.object({ invoiceId: z.uuid() });

/** An amount typed in the major unit: digits, at most two decimals (fewer for some currencies). */
export const moneyText = z
  .string()
  .trim()
  .regex(/^\d{1,7}([.,]\d{1,2})?$/, 'Use an amount such as 12.50 (at most two decimals, not negative).');
export const quantityText = z
  .string()
  .trim()
  .regex(/^\d{1,5}([.,]\d{1,2})?$/, 'Use a quantity such as 2 or 1.5 (at most two decimals).')
  .refine((text) => Number(text.replace(',', '.')) > 0, 'The quantity is more than 0.')
  .refine(
    (text) => Number(text.replace(',', '.')) <= maxQuantity,
    `At most ${maxQuantity.toLocaleString('en')}.`,
  );
/** A tax rate in percent with at most two decimals: "20", "8.1", "0". */
export const percentText = z
  .string()
  .trim()
  .regex(/^\d{1,3}([.,]\d{1,2})?$/, 'Use a rate such as 20 or 8.1 (at most two decimals).')
  .refine((text) => Number(text.replace(',', '.')) <= 100, 'At most 100 %.');

export const currencyCode = z.enum(currencies, {
  error: 'Choose one of the currencies offered (ISO 4217 codes such as EUR or GBP).',
});

/* ------------------------------------------------------------------ price list */

export const billingSettingsInput = z.object({
  currency: currencyCode,
  taxRate: percentText,
  taxLabel: z.string().trim().min(1, 'Name the tax, such as VAT or GST.').max(20),
  pricesIncludeTax: z.boolean(),
  paymentTermsDays: z.int().min(0).max(120),
  hourlyRate: moneyText.nullable(),
  callOutFee: moneyText.nullable(),
  sellerName: z.string().trim().max(200),
  sellerAddress: z.string().trim().max(500),
  sellerTaxId: z.string().trim().max(50),
  invoiceFooter: z.string().trim().max(1000),
});
export type BillingSettingsInput = z.infer<typeof billingSettingsInput>;

export interface BillingSettingsView {
  currency: Currency;
  taxRateBp: number;
  taxLabel: string;
  pricesIncludeTax: boolean;
  paymentTermsDays: number;
  hourlyRateMinor: number | null;
  callOutFeeMinor: number | null;
  sellerName: string;
  sellerAddress: string;
  sellerTaxId: string;
  invoiceFooter: string;
  /** The currency cannot change once an invoice was issued or a price is set in it. */
  currencyLocked: boolean;
  /** Whether owners can pay online (the payment provider is configured). */
  onlinePayment: boolean;
}

export const priceItemInput = z
  .object({
    kind: z.enum(priceItemKinds),
    name: z.string().trim().min(1, 'Name it.').max(120),
    unit: z.string().trim().min(1, 'Say what one of it is: visit, bag, each…').max(30),
    unitPrice: moneyText,
    /** Routine service only: the band covers systems up to this many litres; null for any larger. */
    upToLitres: z.int().min(1).max(1_000_000).nullable().default(null),
  })
  .refine((item) => item.kind === 'routine' || item.upToLitres === null, {
    path: ['upToLitres'],
    message: 'Only routine service is priced by tank size.',
  });
export type PriceItemInput = z.infer<typeof priceItemInput>;

export interface PriceItemView {
  id: string;
  kind: PriceItemKind;
  name: string;
  unit: string;
  unitPriceMinor: number;
  upToLitres: number | null;
  archived: boolean;
}

export interface PriceListView {
  settings: BillingSettingsView;
  /** Routine bands smallest first, then consumables and parts by name; archived ones last. */
  items: PriceItemView[];
}

/* ------------------------------------------------------------------ invoices */

export const invoiceLineInput = z.object({
  kind: z.enum(invoiceLineKinds),
  description: z.string().trim().min(1, 'Describe the line.').max(300),
  quantity: quantityText,
  unit: z.string().trim().max(30).default(''),
  unitPrice: moneyText,
  priceItemId: z.uuid().nullable().default(null),
});
export type InvoiceLineInput = z.infer<typeof invoiceLineInput>;

export const newInvoiceInput = z.union([
  z.object({ visitId: z.uuid() }).strict(),
  z.object({ urgentRequestId: z.uuid() }).strict(),
  z.object({ tankId: z.uuid() }).strict(),
]);
export type NewInvoiceInput = z.infer<typeof newInvoiceInput>;

export const invoiceDraftInput = z.object({
  /** The version the edit started from; another save in between answers 409 stale_version. */
  version: z.int().min(1),
  billToUserId: z.uuid().nullable(),
  note: z.string().trim().max(1000).default(''),
  lines: z.array(invoiceLineInput).min(1, 'An invoice has at least one line.').max(100),
});
export type InvoiceDraftInput = z.infer<typeof invoiceDraftInput>;

export const issueInvoiceInput = z.object({ version: z.int().min(1) });

export const voidInvoiceInput = z.object({ reason: z.string().trim().min(1, 'Say why.').max(500) });

/** A credit note's lines are typed as positive amounts to take back; they are stored negative. */
export const creditNoteInput = z.object({
  reason: z.string().trim().min(1, 'Say why.').max(500),
  lines: z.array(invoiceLineInput).min(1, 'A credit note has at least one line.').max(100),
});
export type CreditNoteInput = z.infer<typeof creditNoteInput>;

export const recordPaymentInput = z.object({
  method: z
    .enum(paymentMethods)
    .exclude(['card-online'], { error: 'Online payments come from the provider.' }),
  amount: moneyText,
  receivedOn: calendarDay,
  reference: z.string().trim().max(200).default(''),
});
export type RecordPaymentInput = z.infer<typeof recordPaymentInput>;

/** Where a page of invoices ends: newest first by when each was made. */
export const invoicePosition = z.object({ createdAt: z.iso.datetime({ offset: true }), id: z.uuid() });

const month = z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'Use a month as YYYY-MM.');

export const invoiceListQuery = z.object({
  status: z.enum(invoiceStatuses).optional(),
  kind: z.enum(invoiceKinds).optional(),
  tankId: z.uuid().optional(),
  /** A client: invoices addressed to this owner. */
  clientId: z.uuid().optional(),
  /** Issue month (drafts by the month they were made). */
  month: month.optional(),
  after: cursorParam(invoicePosition).optional(),
});
export type InvoiceListQuery = z.infer<typeof invoiceListQuery>;

export const billingExportQuery = z
  .object({ from: calendarDay, to: calendarDay })
  .refine((q) => q.to >= q.from, { path: ['to'], message: 'The end is on or after the start.' });

export interface InvoiceLineView {
  id: string;
  kind: InvoiceLineKind;
  description: string;
  quantityHundredths: number;
  unit: string;
  unitPriceMinor: number;
  amountMinor: number;
  priceItemId: string | null;
}

export interface PaymentView {
  id: string;
  method: PaymentMethod;
  amountMinor: number;
  currency: string;
  receivedAt: string;
  reference: string;
}

export interface InvoiceSummary {
  id: string;
  kind: InvoiceKind;
  status: InvoiceStatus;
  /** "INV-000042"; null while a draft. */
  number: string | null;
  tank: { id: string; name: string };
  billToName: string;
  currency: string;
  totalMinor: number;
  /** What is still owed: total, less credit notes and payments (0 for drafts; below 0 when more came in than was owed). */
  balanceMinor: number;
  issueDate: string | null;
  dueDate: string | null;
  createdAt: string;
}

export interface InvoiceDetail extends InvoiceSummary {
  version: number;
  /** The tank's zone: dates on the document read in it. */
  timeZone: string;
  billToUserId: string | null;
  billToEmail: string;
  taxRateBp: number;
  taxLabel: string;
  pricesIncludeTax: boolean;
  netMinor: number;
  taxMinor: number;
  paidMinor: number;
  creditedMinor: number;
  note: string;
  reason: string | null;
  paidAt: string | null;
  lines: InvoiceLineView[];
  payments: PaymentView[];
  /** Credit notes against this invoice, or, on a credit note, the invoice it credits. */
  related: {
    id: string;
    kind: InvoiceKind;
    number: string | null;
    totalMinor: number;
    issueDate: string | null;
  }[];
  source:
    | { kind: 'visit'; id: string; label: string; date: string }
    | { kind: 'urgent'; id: string; label: string; date: string }
    | null;
  seller: { name: string; address: string; taxId: string; footer: string } | null;
  /** Owners the invoice can be addressed to (the tank's owners), for the draft editor. */
  billToChoices: { id: string; name: string; email: string }[];
  /** Whether the signed-in person can pay it online now. */
  payable: boolean;
}

export interface InvoiceTotalsRow {
  currency: string;
  count: number;
  totalMinor: number;
  paidMinor: number;
  balanceMinor: number;
}

export interface InvoicePage {
  items: InvoiceSummary[];
  nextCursor: string | null;
  /** Over everything the filters match (not just this page), per currency. */
  totals: InvoiceTotalsRow[];
}

export interface CheckoutStarted {
  /** The provider's hosted payment page. */
  url: string;
}

export type { InvoiceEventType };
