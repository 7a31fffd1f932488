import { and, asc, desc, eq, lt, ne, or, sql, type SQL } from 'drizzle-orm';
import { documentNumber, unpaidStatuses } from '@shared/billing/invoices';
import { encodeCursor } from '@shared/lists/cursor';
import type { InvoiceDetail, InvoiceListQuery, InvoicePage, InvoiceSummary } from '@shared/schemas/billing';
import { formatDate } from '@shared/text/dates';
import { visitKindLabels } from '@shared/visits/kinds';
import { addDays } from '@shared/schemas/equipment';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  companies,
  invoiceLines,
  invoices,
  payments,
  tankMembers,
  tanks,
  urgentRequests,
  users,
  visits,
} from '../db/schema/index';
import { notFound } from '../lib/http-error';
import { isStaff, visibleTanks } from '../policy/index';
import type { Actor } from './actors';

/*
 * Reading invoices: who may see which (owners never see drafts or other owners' tanks), the list
 * with its filters and totals, and the whole document. Changes live in invoices.ts, the e-mails in
 * invoice-notify.ts; both read through here.
 */

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type InvoiceRow = typeof invoices.$inferSelect;

const pageSize = 30;

/* ------------------------------------------------------------------ finding */

/** The invoice as this person may see it, or 404: another company's, another owner's, or an owner's look at a draft. */
export async function invoiceFor(
  db: Db | Tx,
  actor: Actor,
  invoiceId: string,
  options: { lock?: boolean } = {},
) {
  const query = db
    .select({ invoice: invoices })
    .from(invoices)
    .innerJoin(tanks, eq(tanks.id, invoices.tankId))
    .where(
      and(
        eq(invoices.id, invoiceId),
        eq(invoices.companyId, actor.companyId),
        visibleTanks(db as Db, actor),
        isStaff(actor) ? undefined : ne(invoices.status, 'draft'),
      ),
    );
  const [row] = options.lock ? await query.for('update', { of: invoices }) : await query;
  if (!row) throw notFound('invoice');
  return row.invoice;
}

export const balanceOf = (
  row: Pick<InvoiceRow, 'status' | 'kind' | 'totalMinor' | 'creditedMinor' | 'paidMinor'>,
) =>
  // A cancelled invoice owes nothing, unless money came in anyway: then it shows as owed back.
  row.kind === 'invoice' && row.status !== 'draft' ? row.totalMinor + row.creditedMinor - row.paidMinor : 0;

export async function billToChoices(db: Db | Tx, tankId: string) {
  return db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(tankMembers)
    .innerJoin(users, eq(users.id, tankMembers.userId))
    .where(and(eq(tankMembers.tankId, tankId), eq(users.role, 'owner')))
    .orderBy(asc(tankMembers.createdAt), asc(users.name));
}

/* ------------------------------------------------------------------ reading */

function summaryOf(row: InvoiceRow & { tankName: string }): InvoiceSummary {
  return {
    id: row.id,
    kind: row.kind,
    status: row.status,
    number: documentNumber(row.kind, row.number),
    tank: { id: row.tankId, name: row.tankName },
    billToName: row.billToName,
    currency: row.currency,
    totalMinor: row.totalMinor,
    balanceMinor: balanceOf(row),
    issueDate: row.issueDate,
    dueDate: row.dueDate,
    createdAt: row.createdAt.toISOString(),
  };
}

function listFilters(db: Db, actor: Actor, query: InvoiceListQuery): SQL {
  const conditions: (SQL | undefined)[] = [
    eq(invoices.companyId, actor.companyId),
    visibleTanks(db, actor),
    isStaff(actor) ? undefined : ne(invoices.status, 'draft'),
    query.status ? eq(invoices.status, query.status) : undefined,
    query.kind ? eq(invoices.kind, query.kind) : undefined,
    query.tankId ? eq(invoices.tankId, query.tankId) : undefined,
    query.clientId ? eq(invoices.billToUserId, query.clientId) : undefined,
  ];
  if (query.month) {
    const from = `${query.month}-01`;
    const to = addDays(`${query.month}-28`, 4).slice(0, 7) + '-01';
    // Issued documents by their issue date, drafts by when they were made.
    conditions.push(
      sql`coalesce(${invoices.issueDate}, (${invoices.createdAt} at time zone 'UTC')::date) >= ${from}::date`,
      sql`coalesce(${invoices.issueDate}, (${invoices.createdAt} at time zone 'UTC')::date) < ${to}::date`,
    );
  }
  return and(...conditions)!;
}

export async function listInvoices(
  deps: AppDeps,
  actor: Actor,
  query: InvoiceListQuery,
): Promise<InvoicePage> {
  const { db } = deps;
  const where = listFilters(db, actor, query);
  const after = query.after;
  const rows = await db
    .select({ invoice: invoices, tankName: tanks.name })
    .from(invoices)
    .innerJoin(tanks, eq(tanks.id, invoices.tankId))
    .where(
      and(
        where,
        after
          ? or(
              lt(invoices.createdAt, new Date(after.createdAt)),
              and(eq(invoices.createdAt, new Date(after.createdAt)), lt(invoices.id, after.id)),
            )
          : undefined,
      ),
    )
    .orderBy(desc(invoices.createdAt), desc(invoices.id))
    .limit(pageSize + 1);
  const page = rows.slice(0, pageSize);
  const last = page.at(-1);
  const totals = await db
    .select({
      currency: invoices.currency,
      count: sql<number>`count(*)::int`,
      totalMinor: sql<number>`coalesce(sum(${invoices.totalMinor}), 0)::bigint`,
      paidMinor: sql<number>`coalesce(sum(${invoices.paidMinor}), 0)::bigint`,
      balanceMinor: sql<number>`coalesce(sum(case when ${invoices.kind} = 'invoice' and ${invoices.status} in ('issued', 'overdue') then ${invoices.totalMinor} + ${invoices.creditedMinor} - ${invoices.paidMinor} else 0 end), 0)::bigint`,
    })
    .from(invoices)
    .innerJoin(tanks, eq(tanks.id, invoices.tankId))
    .where(where)
    .groupBy(invoices.currency)
    .orderBy(asc(invoices.currency));
  return {
    items: page.map((row) => summaryOf({ ...row.invoice, tankName: row.tankName })),
    nextCursor:
      rows.length > pageSize && last
        ? encodeCursor([last.invoice.createdAt.toISOString(), last.invoice.id])
        : null,
    totals: totals.map((row) => ({
      currency: row.currency,
      count: Number(row.count),
      totalMinor: Number(row.totalMinor),
      paidMinor: Number(row.paidMinor),
      balanceMinor: Number(row.balanceMinor),
    })),
  };
}

export async function getInvoice(deps: AppDeps, actor: Actor, invoiceId: string): Promise<InvoiceDetail> {
  const { db } = deps;
  const invoice = await invoiceFor(db, actor, invoiceId);
  const [[tank], lines, paid, related, choices] = await Promise.all([
    db
      .select({ name: tanks.name, zone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})` })
      .from(tanks)
      .innerJoin(companies, eq(companies.id, tanks.companyId))
      .where(eq(tanks.id, invoice.tankId)),
    db
      .select()
      .from(invoiceLines)
      .where(eq(invoiceLines.invoiceId, invoice.id))
      .orderBy(asc(invoiceLines.position)),
    db.select().from(payments).where(eq(payments.invoiceId, invoice.id)).orderBy(asc(payments.receivedAt)),
    db
      .select({
        id: invoices.id,
        kind: invoices.kind,
        number: invoices.number,
        totalMinor: invoices.totalMinor,
        issueDate: invoices.issueDate,
      })
      .from(invoices)
      .where(
        and(
          ne(invoices.status, 'draft'),
          invoice.kind === 'invoice'
            ? eq(invoices.creditedInvoiceId, invoice.id)
            : eq(invoices.id, invoice.creditedInvoiceId ?? invoice.id),
        ),
      )
      .orderBy(asc(invoices.issuedAt)),
    isStaff(actor) ? billToChoices(db, invoice.tankId) : Promise.resolve([]),
  ]);
  const source = await sourceOf(db, invoice, tank?.zone ?? 'UTC');
  const seller = invoice.seller as InvoiceDetail['seller'];
  return {
    ...summaryOf({ ...invoice, tankName: tank?.name ?? '' }),
    version: invoice.version,
    timeZone: tank?.zone ?? 'UTC',
    billToUserId: invoice.billToUserId,
    billToEmail: invoice.billToEmail,
    taxRateBp: invoice.taxRateBp,
    taxLabel: invoice.taxLabel,
    pricesIncludeTax: invoice.pricesIncludeTax,
    netMinor: invoice.netMinor,
    taxMinor: invoice.taxMinor,
    paidMinor: invoice.paidMinor,
    creditedMinor: invoice.creditedMinor,
    note: invoice.note,
    reason: invoice.reason,
    paidAt: invoice.paidAt?.toISOString() ?? null,
    lines: lines.map((line) => ({
      id: line.id,
      kind: line.kind,
      description: line.description,
      quantityHundredths: line.quantityHundredths,
      unit: line.unit,
      unitPriceMinor: line.unitPriceMinor,
      amountMinor: line.amountMinor,
      priceItemId: line.priceItemId,
    })),
    payments: paid.map((payment) => ({
      id: payment.id,
      method: payment.method,
      amountMinor: payment.amountMinor,
      currency: payment.currency,
      receivedAt: payment.receivedAt.toISOString(),
      reference: payment.reference,
    })),
    related: related.map((row) => ({ ...row, number: documentNumber(row.kind, row.number) })),
    source,
    seller,
    billToChoices: choices,
    payable:
      actor.role === 'owner' &&
      deps.payments !== null &&
      invoice.kind === 'invoice' &&
      unpaidStatuses.includes(invoice.status) &&
      balanceOf(invoice) > 0,
  };
}

async function sourceOf(db: Db, invoice: InvoiceRow, zone: string): Promise<InvoiceDetail['source']> {
  if (invoice.sourceVisitId) {
    const [visit] = await db
      .select({ kind: visits.kind, windowStart: visits.windowStart })
      .from(visits)
      .where(eq(visits.id, invoice.sourceVisitId));
    if (visit) {
      return {
        kind: 'visit',
        id: invoice.sourceVisitId,
        label: `${visitKindLabels[visit.kind]} on ${formatDate(visit.windowStart, zone)}`,
        date: visit.windowStart.toISOString(),
      };
    }
  }
  if (invoice.sourceUrgentRequestId) {
    const [request] = await db
      .select({ createdAt: urgentRequests.createdAt })
      .from(urgentRequests)
      .where(eq(urgentRequests.id, invoice.sourceUrgentRequestId));
    if (request) {
      return {
        kind: 'urgent',
        id: invoice.sourceUrgentRequestId,
        label: `Urgent visit request of ${formatDate(request.createdAt, zone)}`,
        date: request.createdAt.toISOString(),
      };
    }
  }
  return null;
}

/** For the PDF and e-mails, which have no actor: the invoice as its company sees it. */
export async function invoiceForCompany(deps: AppDeps, invoiceId: string) {
  const [row] = await deps.db
    .select({
      companyId: invoices.companyId,
      companyName: companies.name,
      zone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
    })
    .from(invoices)
    .innerJoin(companies, eq(companies.id, invoices.companyId))
    .innerJoin(tanks, eq(tanks.id, invoices.tankId))
    .where(eq(invoices.id, invoiceId));
  if (!row) return null;
  const systemActor: Actor = {
    id: '00000000-0000-0000-0000-000000000000',
    companyId: row.companyId,
    companyName: row.companyName,
    role: 'admin',
    name: 'Brinewatch',
    email: '',
  };
  return {
    detail: await getInvoice(deps, systemActor, invoiceId),
    companyName: row.companyName,
    timeZone: row.zone,
  };
}
