import { sql } from 'drizzle-orm';
import {
  boolean,
  check,
  date,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  type AnyPgColumn,
} from 'drizzle-orm/pg-core';
import {
  invoiceEventTypes,
  invoiceKinds,
  invoiceLineKinds,
  invoiceStatuses,
  paymentMethods,
  priceItemKinds,
} from '@shared/billing/invoices';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { tanks } from './tanks';
import { urgentRequests } from './urgent-requests';
import { users } from './users';
import { visits } from './visits';

/*
 * Billing. Money is integer minor units with the currency beside it; quantities are hundredths;
 * tax rates basis points (shared/billing/money.ts). Issued documents are never edited: their
 * numbers come from billing_counters inside the issuing transaction, so they have no gaps.
 */

export const priceItemKind = pgEnum('price_item_kind', priceItemKinds);
export const invoiceKind = pgEnum('invoice_kind', invoiceKinds);
export const invoiceStatus = pgEnum('invoice_status', invoiceStatuses);
export const invoiceLineKind = pgEnum('invoice_line_kind', invoiceLineKinds);
export const invoiceEventType = pgEnum('invoice_event_type', invoiceEventTypes);
export const paymentMethod = pgEnum('payment_method', paymentMethods);

/** One row per company: currency, tax, terms, the call-out fee and hourly rate, what invoices say of the seller. */
export const billingSettings = pgTable(
  'billing_settings',
  {
    companyId: uuid('company_id')
      .primaryKey()
      .references(() => companies.id, { onDelete: 'cascade' }),
    currency: text('currency').notNull().default('EUR'),
    taxRateBp: integer('tax_rate_bp').notNull().default(0),
    taxLabel: text('tax_label').notNull().default('VAT'),
    pricesIncludeTax: boolean('prices_include_tax').notNull().default(true),
    paymentTermsDays: integer('payment_terms_days').notNull().default(14),
    /** Charged per hour on site for visits other than routine service. */
    hourlyRateMinor: integer('hourly_rate_minor'),
    /** Charged for an urgent visit; the owner sees it before sending the request. */
    callOutFeeMinor: integer('call_out_fee_minor'),
    sellerName: text('seller_name').notNull().default(''),
    sellerAddress: text('seller_address').notNull().default(''),
    sellerTaxId: text('seller_tax_id').notNull().default(''),
    /** Printed at the foot of every invoice: bank details, thanks. */
    invoiceFooter: text('invoice_footer').notNull().default(''),
    ...timestamps,
  },
  (t) => [
    check('billing_settings_tax_rate', sql`${t.taxRateBp} between 0 and 10000`),
    check('billing_settings_terms', sql`${t.paymentTermsDays} between 0 and 120`),
    check(
      'billing_settings_amounts',
      sql`coalesce(${t.hourlyRateMinor}, 0) >= 0 and coalesce(${t.callOutFeeMinor}, 0) >= 0`,
    ),
  ],
);

/** The price list: routine service by tank size band, and consumables and parts used on visits. */
export const priceItems = pgTable(
  'price_items',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    kind: priceItemKind('kind').notNull(),
    name: text('name').notNull(),
    /** What one of it is: "visit", "bag", "each", "pot". */
    unit: text('unit').notNull(),
    unitPriceMinor: integer('unit_price_minor').notNull(),
    /** Routine service only: the band covers systems up to this many litres (display + sump); null = any larger. */
    upToLitres: integer('up_to_litres'),
    /** Retired items stay for the invoices and reports that name them. */
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index('price_items_company_idx').on(t.companyId, t.kind),
    check('price_items_price', sql`${t.unitPriceMinor} >= 0`),
  ],
);

/** The next number of each series, per company; taken with UPDATE … RETURNING in the issuing transaction. */
export const billingCounters = pgTable(
  'billing_counters',
  {
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    kind: invoiceKind('kind').notNull(),
    lastNumber: integer('last_number').notNull().default(0),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.companyId, t.kind] })],
);

export const invoices = pgTable(
  'invoices',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    /** Accounting records outlive nothing: a tank with invoices cannot be deleted. */
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'restrict' }),
    kind: invoiceKind('kind').notNull().default('invoice'),
    status: invoiceStatus('status').notNull().default('draft'),
    /** Gapless per company and kind, set when issued. */
    number: integer('number'),
    /** A credit note names the invoice it takes amounts back from. */
    creditedInvoiceId: uuid('credited_invoice_id').references((): AnyPgColumn => invoices.id, {
      onDelete: 'restrict',
    }),
    sourceVisitId: uuid('source_visit_id').references(() => visits.id, { onDelete: 'set null' }),
    sourceUrgentRequestId: uuid('source_urgent_request_id').references(() => urgentRequests.id, {
      onDelete: 'set null',
    }),
    /** The tank owner the invoice is addressed to. */
    billToUserId: uuid('bill_to_user_id').references(() => users.id, { onDelete: 'set null' }),
    billToName: text('bill_to_name').notNull().default(''),
    billToEmail: text('bill_to_email').notNull().default(''),
    currency: text('currency').notNull(),
    taxRateBp: integer('tax_rate_bp').notNull(),
    taxLabel: text('tax_label').notNull(),
    pricesIncludeTax: boolean('prices_include_tax').notNull(),
    netMinor: integer('net_minor').notNull().default(0),
    taxMinor: integer('tax_minor').notNull().default(0),
    totalMinor: integer('total_minor').notNull().default(0),
    /** Sum of payments recorded against it. */
    paidMinor: integer('paid_minor').notNull().default(0),
    /** Sum of its credit notes' totals (zero or negative). */
    creditedMinor: integer('credited_minor').notNull().default(0),
    note: text('note').notNull().default(''),
    /** The seller as printed when issued (name, address, tax id, footer). */
    seller: jsonb('seller'),
    issueDate: date('issue_date'),
    dueDate: date('due_date'),
    issuedAt: timestamp('issued_at', { withTimezone: true }),
    issuedBy: uuid('issued_by').references(() => users.id, { onDelete: 'set null' }),
    paidAt: timestamp('paid_at', { withTimezone: true }),
    voidedAt: timestamp('voided_at', { withTimezone: true }),
    reason: text('reason'),
    /** Counts the draft's saves; an edit names the version it started from. */
    version: integer('version').notNull().default(1),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('invoices_number_key').on(t.companyId, t.kind, t.number),
    uniqueIndex('invoices_visit_key')
      .on(t.sourceVisitId)
      .where(sql`${t.kind} = 'invoice' and ${t.status} <> 'void'`),
    uniqueIndex('invoices_urgent_key')
      .on(t.sourceUrgentRequestId)
      .where(sql`${t.kind} = 'invoice' and ${t.status} <> 'void'`),
    index('invoices_company_status_idx').on(t.companyId, t.status, t.issueDate),
    index('invoices_tank_idx').on(t.tankId, t.createdAt),
    index('invoices_credited_idx').on(t.creditedInvoiceId),
    check('invoices_numbered_when_issued', sql`(${t.status} = 'draft') = (${t.number} is null)`),
    check(
      'invoices_credit_note_names_invoice',
      sql`(${t.kind} = 'credit-note') = (${t.creditedInvoiceId} is not null)`,
    ),
    check(
      'invoices_sign',
      sql`case when ${t.kind} = 'invoice' then ${t.totalMinor} >= 0 else ${t.totalMinor} <= 0 end`,
    ),
  ],
);

export const invoiceLines = pgTable(
  'invoice_lines',
  {
    id: id(),
    invoiceId: uuid('invoice_id')
      .notNull()
      .references(() => invoices.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    kind: invoiceLineKind('kind').notNull(),
    description: text('description').notNull(),
    quantityHundredths: integer('quantity_hundredths').notNull(),
    unit: text('unit').notNull().default(''),
    /** Negative on a credit note. */
    unitPriceMinor: integer('unit_price_minor').notNull(),
    amountMinor: integer('amount_minor').notNull(),
    priceItemId: uuid('price_item_id').references(() => priceItems.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('invoice_lines_position_key').on(t.invoiceId, t.position),
    check('invoice_lines_quantity', sql`${t.quantityHundredths} > 0`),
  ],
);

/** Money received against an invoice: online through the provider, or recorded by an admin. */
export const payments = pgTable(
  'payments',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    invoiceId: uuid('invoice_id')
      .notNull()
      .references(() => invoices.id, { onDelete: 'restrict' }),
    method: paymentMethod('method').notNull(),
    amountMinor: integer('amount_minor').notNull(),
    currency: text('currency').notNull(),
    receivedAt: timestamp('received_at', { withTimezone: true }).notNull(),
    /** The provider's checkout session and payment, for online payments. */
    checkoutSessionId: text('checkout_session_id'),
    providerPaymentId: text('provider_payment_id'),
    reference: text('reference').notNull().default(''),
    recordedBy: uuid('recorded_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    index('payments_invoice_idx').on(t.invoiceId),
    index('payments_company_received_idx').on(t.companyId, t.receivedAt),
    uniqueIndex('payments_session_key').on(t.checkoutSessionId),
    check('payments_amount', sql`${t.amountMinor} > 0`),
  ],
);

/** Hosted checkout sessions made for "Pay now", to find the invoice again when the webhook comes. */
export const checkoutSessions = pgTable(
  'checkout_sessions',
  {
    id: text('id').primaryKey(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    invoiceId: uuid('invoice_id')
      .notNull()
      .references(() => invoices.id, { onDelete: 'restrict' }),
    amountMinor: integer('amount_minor').notNull(),
    currency: text('currency').notNull(),
    url: text('url').notNull(),
    /** open → complete | expired, as the provider's events say. */
    status: text('status').notNull().default('open'),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [index('checkout_sessions_invoice_idx').on(t.invoiceId, t.createdAt)],
);

/** Every provider event received, by its id: a replay or a duplicate finds its row and changes nothing. */
export const paymentEvents = pgTable(
  'payment_events',
  {
    id: text('id').primaryKey(),
    type: text('type').notNull(),
    /** When the provider made the event (its `created`). */
    occurredAt: timestamp('occurred_at', { withTimezone: true }).notNull(),
    checkoutSessionId: text('checkout_session_id'),
    invoiceId: uuid('invoice_id').references(() => invoices.id, { onDelete: 'set null' }),
    /** What it did: applied, or why it changed nothing. */
    outcome: text('outcome').notNull(),
    payload: jsonb('payload').notNull(),
    ...timestamps,
  },
  (t) => [index('payment_events_session_idx').on(t.checkoutSessionId)],
);

/** What someone is told about an invoice; at most one of each per invoice (a receipt goes out once). */
export const invoiceEvents = pgTable(
  'invoice_events',
  {
    id: id(),
    invoiceId: uuid('invoice_id')
      .notNull()
      .references(() => invoices.id, { onDelete: 'cascade' }),
    type: invoiceEventType('type').notNull(),
    /** When its deliveries were made; a sweep retries any left unannounced. */
    announcedAt: timestamp('announced_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('invoice_events_once_key').on(t.invoiceId, t.type),
    index('invoice_events_unannounced_idx')
      .on(t.createdAt)
      .where(sql`${t.announcedAt} is null`),
  ],
);
