import { and, asc, eq, gte, lt, ne } from 'drizzle-orm';
import { documentNumber, documentStatusLabel, paymentMethodLabels } from '@shared/billing/invoices';
import { minorToText, quantityToText } from '@shared/billing/money';
import { csvLine, guardText } from '@shared/readings/csv';
import { addDays } from '@shared/schemas/equipment';
import type { AppDeps } from '../deps';
import { invoices, payments, tanks } from '../db/schema/index';
import type { Actor } from './actors';

/*
 * CSV for the company's accountant: one row per issued invoice or credit note (by issue date), and
 * one per payment received (by date received). Amounts are plain decimals in the major unit with the
 * currency in its own column, so a spreadsheet sums them exactly; text cells are guarded against
 * formula injection like every CSV we write.
 */

export const invoiceCsvColumns = [
  'number',
  'kind',
  'status',
  'issue_date',
  'due_date',
  'client',
  'client_email',
  'tank',
  'currency',
  'net',
  'tax_rate_percent',
  'tax',
  'total',
  'credited',
  'paid',
  'balance',
  'credits_invoice',
] as const;

export function invoicesCsv(deps: AppDeps, actor: Actor, range: { from: string; to: string }) {
  const { db } = deps;
  async function* lines() {
    yield csvLine(invoiceCsvColumns);
    const rows = await db
      .select({ invoice: invoices, tankName: tanks.name })
      .from(invoices)
      .innerJoin(tanks, eq(tanks.id, invoices.tankId))
      .where(
        and(
          eq(invoices.companyId, actor.companyId),
          ne(invoices.status, 'draft'),
          gte(invoices.issueDate, range.from),
          lt(invoices.issueDate, addDays(range.to, 1)),
        ),
      )
      .orderBy(asc(invoices.kind), asc(invoices.number));
    const numbers = new Map(
      rows.map((row) => [row.invoice.id, documentNumber(row.invoice.kind, row.invoice.number)]),
    );
    for (const { invoice, tankName } of rows) {
      const money = (minor: number) => minorToText(minor, invoice.currency);
      const balance =
        invoice.kind === 'invoice' && invoice.status !== 'draft'
          ? invoice.totalMinor + invoice.creditedMinor - invoice.paidMinor
          : 0;
      yield csvLine([
        documentNumber(invoice.kind, invoice.number) ?? '',
        invoice.kind,
        documentStatusLabel(invoice.kind, invoice.status),
        invoice.issueDate ?? '',
        invoice.dueDate ?? '',
        guardText(invoice.billToName),
        guardText(invoice.billToEmail),
        guardText(tankName),
        invoice.currency,
        money(invoice.netMinor),
        quantityToText(invoice.taxRateBp),
        money(invoice.taxMinor),
        money(invoice.totalMinor),
        money(invoice.creditedMinor),
        money(invoice.paidMinor),
        money(balance),
        invoice.creditedInvoiceId ? (numbers.get(invoice.creditedInvoiceId) ?? '') : '',
      ]);
    }
  }
  return { fileName: `invoices-${range.from}-to-${range.to}.csv`, lines: lines() };
}

export const paymentCsvColumns = [
  'received_at',
  'invoice',
  'client',
  'method',
  'currency',
  'amount',
  'reference',
] as const;

export function paymentsCsv(deps: AppDeps, actor: Actor, range: { from: string; to: string }) {
  const { db } = deps;
  async function* lines() {
    yield csvLine(paymentCsvColumns);
    const rows = await db
      .select({ payment: payments, invoice: invoices })
      .from(payments)
      .innerJoin(invoices, eq(invoices.id, payments.invoiceId))
      .where(
        and(
          eq(payments.companyId, actor.companyId),
          gte(payments.receivedAt, new Date(`${range.from}T00:00:00Z`)),
          lt(payments.receivedAt, new Date(`${addDays(range.to, 1)}T00:00:00Z`)),
        ),
      )
      .orderBy(asc(payments.receivedAt));
    for (const { payment, invoice } of rows) {
      yield csvLine([
        payment.receivedAt.toISOString(),
        documentNumber(invoice.kind, invoice.number) ?? '',
        guardText(invoice.billToName),
        paymentMethodLabels[payment.method],
        payment.currency,
        minorToText(payment.amountMinor, payment.currency),
        guardText(payment.reference || payment.providerPaymentId || payment.checkoutSessionId || ''),
      ]);
    }
  }
  return { fileName: `payments-${range.from}-to-${range.to}.csv`, lines: lines() };
}
