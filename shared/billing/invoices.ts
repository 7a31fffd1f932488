/*
 * Invoices and credit notes: their states, kinds of line and the words people see. Plain values
 * without zod, so screens that only show an invoice's state do not load the validator.
 *
 * draft ──issue──▶ issued ──(due date passes)──▶ overdue
 *   │                 │  └──────────────┬──────────┘
 * (deleted)           ├── paid (online through the provider's webhook, or recorded by an admin)
 *                     └── void (a credit note for the whole amount, before any payment)
 * An issued invoice is never edited: a credit note (its own numbered document) takes amounts back.
 */

export const invoiceKinds = ['invoice', 'credit-note'] as const;
export type InvoiceKind = (typeof invoiceKinds)[number];

export const invoiceStatuses = ['draft', 'issued', 'overdue', 'paid', 'void'] as const;
export type InvoiceStatus = (typeof invoiceStatuses)[number];

export const invoiceStatusLabels: Readonly<Record<InvoiceStatus, string>> = {
  draft: 'Draft',
  issued: 'Awaiting payment',
  overdue: 'Overdue',
  paid: 'Paid',
  void: 'Cancelled',
};

/**
 * A credit note is never owed, so once issued it is simply "Issued", whatever state it is kept in;
 * an invoice's states are the words above. Screens, e-mails and exports all say it this way.
 */
export function documentStatusLabel(kind: InvoiceKind, status: InvoiceStatus): string {
  if (kind === 'credit-note' && status !== 'draft' && status !== 'void') return 'Issued';
  return invoiceStatusLabels[status];
}

/** States in which the client still owes money. */
export const unpaidStatuses: readonly InvoiceStatus[] = ['issued', 'overdue'];

export const invoiceLineKinds = ['service', 'labour', 'call-out', 'consumable', 'part', 'other'] as const;
export type InvoiceLineKind = (typeof invoiceLineKinds)[number];

export const invoiceLineKindLabels: Readonly<Record<InvoiceLineKind, string>> = {
  service: 'Service',
  labour: 'Labour',
  'call-out': 'Call-out',
  consumable: 'Consumable',
  part: 'Part',
  other: 'Other',
};

/** Price-list entries: routine service by tank size, and things used or fitted on a visit. */
export const priceItemKinds = ['routine', 'consumable', 'part'] as const;
export type PriceItemKind = (typeof priceItemKinds)[number];

export const priceItemKindLabels: Readonly<Record<PriceItemKind, string>> = {
  routine: 'Routine service',
  consumable: 'Consumable',
  part: 'Part',
};

/** What happened to an invoice that someone is told about (the outbox of invoice e-mails). */
export const invoiceEventTypes = ['issued', 'paid', 'reminder-7', 'reminder-14'] as const;
export type InvoiceEventType = (typeof invoiceEventTypes)[number];

/** Overdue reminders go out this many days after the due date, once each. */
export const reminderDays = [7, 14] as const;

export const paymentMethods = ['card-online', 'bank-transfer', 'cash', 'card-in-person'] as const;
export type PaymentMethod = (typeof paymentMethods)[number];

export const paymentMethodLabels: Readonly<Record<PaymentMethod, string>> = {
  'card-online': 'Card, paid online',
  'bank-transfer': 'Bank transfer',
  cash: 'Cash',
  'card-in-person': 'Card, in person',
};

/** "INV-000042" / "CN-000007": numbered without gaps per company, one series per kind. */
export function documentNumber(kind: InvoiceKind, number: number | null): string | null {
  if (number === null) return null;
  return `${kind === 'invoice' ? 'INV' : 'CN'}-${String(number).padStart(6, '0')}`;
}
