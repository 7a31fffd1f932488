import { and, asc, eq, inArray, ne, or, sql, type SQL } from 'drizzle-orm';
import { documentNumber, unpaidStatuses, type InvoiceKind } from '@shared/billing/invoices';
import { formatMoney, invoiceTotals, lineAmount, parseQuantity } from '@shared/billing/money';
import type {
  CreditNoteInput,
  InvoiceDetail,
  InvoiceDraftInput,
  InvoiceLineInput,
  NewInvoiceInput,
  RecordPaymentInput,
} from '@shared/schemas/billing';
import { visitReportContent } from '@shared/schemas/visits';
import { formatDate } from '@shared/text/dates';
import { visitKindLabels } from '@shared/visits/kinds';
import { wallTimeOf } from '@shared/visits/recurrence';
import { addDays } from '@shared/schemas/equipment';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  companies,
  equipment,
  invoiceLines,
  invoices,
  payments,
  priceItems,
  tankMembers,
  tanks,
  urgentRequests,
  users,
  visits,
} from '../db/schema/index';
import { badRequest, conflict, notFound, type ErrorIssue } from '../lib/http-error';
import type { Actor } from './actors';
import { recordAudit, type AuditSource } from './audit';
import { announceInvoiceEvent, recordInvoiceEvent } from './invoice-notify';
import { balanceOf, billToChoices, getInvoice, invoiceFor } from './invoice-views';
import { billingSettingsOf, moneyOf, routineBandFor, type BillingSettings } from './price-list';

/*
 * Invoices: drafted from a published visit report or a resolved urgent request, edited while a
 * draft, then issued with the next number of the company's series (taken inside the issuing
 * transaction, so numbers have no gaps), e-mailed with a PDF, and settled by payments or cancelled
 * by a credit note. Totals are always recomputed here from the lines (shared/billing/money.ts).
 */

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type InvoiceRow = typeof invoices.$inferSelect;
type LineValues = Omit<typeof invoiceLines.$inferInsert, 'invoiceId' | 'position'>;

/** Labour is billed in quarter hours, rounded up (common practice in service trades). */
const billedMinutesStep = 15;

/** Today on the company's calendar, as YYYY-MM-DD. */
async function companyToday(db: Db | Tx, companyId: string, now: Date): Promise<string> {
  const [company] = await db
    .select({ zone: companies.timeZone })
    .from(companies)
    .where(eq(companies.id, companyId));
  return wallTimeOf(now, company?.zone ?? 'UTC').day;
}

/* ------------------------------------------------------------------ lines and totals */

/** Parses typed lines for the company's currency; every problem is reported at once, at its field. */
function linesFrom(inputs: readonly InvoiceLineInput[], currency: string, sign: 1 | -1): LineValues[] {
  const issues: ErrorIssue[] = [];
  const lines = inputs.map((input, index): LineValues => {
    const quantity = parseQuantity(input.quantity);
    if (!quantity.ok) issues.push({ path: `body.lines.${index}.quantity`, message: quantity.message });
    let unitPriceMinor = 0;
    try {
      unitPriceMinor = moneyOf(input.unitPrice, currency, `body.lines.${index}.unitPrice`);
    } catch (error) {
      const found = (error as { issues?: ErrorIssue[] }).issues;
      if (found) issues.push(...found);
      else throw error;
    }
    const hundredths = quantity.ok ? quantity.hundredths : 100;
    return {
      kind: input.kind,
      description: input.description,
      quantityHundredths: hundredths,
      unit: input.unit,
      unitPriceMinor: sign * unitPriceMinor,
      amountMinor: lineAmount(hundredths, sign * unitPriceMinor),
      priceItemId: input.priceItemId,
    };
  });
  if (issues.length > 0) throw badRequest('invalid_request', 'Some lines need attention.', issues);
  return lines;
}

/** Lines may name price-list items of the company only; anything else is a 400 at the line. */
async function checkPriceItems(db: Db | Tx, companyId: string, inputs: readonly InvoiceLineInput[]) {
  const named = [
    ...new Set(inputs.map((line) => line.priceItemId).filter((id): id is string => id !== null)),
  ];
  if (named.length === 0) return;
  const known = await db
    .select({ id: priceItems.id })
    .from(priceItems)
    .where(and(eq(priceItems.companyId, companyId), inArray(priceItems.id, named)));
  const ids = new Set(known.map((row) => row.id));
  const issues = inputs.flatMap((line, index) =>
    line.priceItemId !== null && !ids.has(line.priceItemId)
      ? [{ path: `body.lines.${index}.priceItemId`, message: 'No such item on the price list.' }]
      : [],
  );
  if (issues.length > 0) throw badRequest('invalid_request', 'Some lines need attention.', issues);
}

function totalsOf(
  lines: readonly Pick<LineValues, 'amountMinor'>[],
  settings: Pick<BillingSettings, 'taxRateBp' | 'pricesIncludeTax'>,
) {
  return invoiceTotals(
    lines.map((line) => line.amountMinor),
    settings.taxRateBp,
    settings.pricesIncludeTax,
  );
}

async function replaceLines(tx: Tx, invoiceId: string, lines: readonly LineValues[]) {
  await tx.delete(invoiceLines).where(eq(invoiceLines.invoiceId, invoiceId));
  if (lines.length > 0) {
    await tx.insert(invoiceLines).values(lines.map((line, position) => ({ ...line, invoiceId, position })));
  }
}

const taxSnapshot = (settings: BillingSettings) => ({
  currency: settings.currency,
  taxRateBp: settings.taxRateBp,
  taxLabel: settings.taxLabel,
  pricesIncludeTax: settings.pricesIncludeTax,
});

/* ------------------------------------------------------------------ drafting */

/** The tank's first owner (by when they joined it): who a new draft is addressed to. */
async function billingOwnerOf(db: Db | Tx, tankId: string) {
  const [owner] = await db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(tankMembers)
    .innerJoin(users, eq(users.id, tankMembers.userId))
    .where(and(eq(tankMembers.tankId, tankId), eq(users.role, 'owner'), eq(users.status, 'active')))
    .orderBy(asc(tankMembers.createdAt), asc(users.name))
    .limit(1);
  return owner ?? null;
}

/** Minutes on site rounded up to the billing step; null without both times. */
function billedHours(arrivedAt: string | null, departedAt: string | null): number | null {
  if (!arrivedAt || !departedAt) return null;
  const minutes = Math.max(0, (Date.parse(departedAt) - Date.parse(arrivedAt)) / 60_000);
  const billed = Math.max(billedMinutesStep, Math.ceil(minutes / billedMinutesStep) * billedMinutesStep);
  // Hundredths of an hour: quarter hours are exact (25, 50, 75).
  return Math.round((billed / 60) * 100);
}

/** The lines a published visit report bills: the service or the time on site, then what was used and fitted. */
async function visitLines(
  db: Db | Tx,
  visit: typeof visits.$inferSelect,
  tank: typeof tanks.$inferSelect,
  settings: BillingSettings,
  zone: string,
): Promise<LineValues[]> {
  const report = visitReportContent.parse(visit.published);
  const day = formatDate(new Date(report.arrivedAt ?? visit.windowStart), zone);
  const lines: LineValues[] = [];
  if (visit.kind === 'routine') {
    const bands = await db
      .select()
      .from(priceItems)
      .where(
        and(
          eq(priceItems.companyId, visit.companyId),
          eq(priceItems.kind, 'routine'),
          sql`${priceItems.archivedAt} is null`,
        ),
      );
    const litres = tank.displayVolumeL + tank.sumpVolumeL;
    const band = routineBandFor(bands, litres);
    lines.push({
      kind: 'service',
      description: `${band?.name ?? 'Routine service'} — ${day}`,
      quantityHundredths: 100,
      unit: band?.unit ?? 'visit',
      unitPriceMinor: band?.unitPriceMinor ?? 0,
      amountMinor: band?.unitPriceMinor ?? 0,
      priceItemId: band?.id ?? null,
    });
  } else {
    const hours =
      billedHours(report.arrivedAt, report.departedAt) ??
      billedHours(visit.windowStart.toISOString(), visit.windowEnd.toISOString())!;
    const rate = settings.hourlyRateMinor ?? 0;
    lines.push({
      kind: 'labour',
      description: `${visitKindLabels[visit.kind]}: time on site — ${day}`,
      quantityHundredths: hours,
      unit: 'hour',
      unitPriceMinor: rate,
      amountMinor: lineAmount(hours, rate),
      priceItemId: null,
    });
  }
  const usedIds = report.itemsUsed.map((item) => item.priceItemId);
  const items =
    usedIds.length > 0
      ? await db
          .select()
          .from(priceItems)
          .where(and(eq(priceItems.companyId, visit.companyId), inArray(priceItems.id, usedIds)))
      : [];
  const byId = new Map(items.map((item) => [item.id, item]));
  for (const used of report.itemsUsed) {
    const item = byId.get(used.priceItemId);
    if (!item) continue;
    const hundredths = Math.round(used.quantity * 100);
    lines.push({
      kind: item.kind === 'part' ? 'part' : 'consumable',
      description: item.name,
      quantityHundredths: hundredths,
      unit: item.unit,
      unitPriceMinor: item.unitPriceMinor,
      amountMinor: lineAmount(hundredths, item.unitPriceMinor),
      priceItemId: item.id,
    });
  }
  // Equipment the report says was replaced, when no part from the price list was recorded for it:
  // a line to price before issuing, so nothing fitted goes unbilled by accident.
  const replacedIds = report.equipmentChecks
    .filter((check) => check.state === 'replaced')
    .map((check) => check.equipmentId);
  if (replacedIds.length > 0 && !lines.some((line) => line.kind === 'part')) {
    const replaced = await db
      .select({ name: equipment.description })
      .from(equipment)
      .where(and(eq(equipment.tankId, tank.id), inArray(equipment.id, replacedIds)));
    for (const piece of replaced) {
      lines.push({
        kind: 'part',
        description: `Replacement: ${piece.name}`,
        quantityHundredths: 100,
        unit: 'each',
        unitPriceMinor: 0,
        amountMinor: 0,
        priceItemId: null,
      });
    }
  }
  return lines;
}

const alreadyInvoiced = (existing: { id: string; kind: InvoiceKind; number: number | null }) =>
  conflict(
    'already_invoiced',
    `This is already invoiced: ${documentNumber(existing.kind, existing.number) ?? 'a draft'} (${existing.id}).`,
  );

async function existingInvoice(db: Db | Tx, where: SQL) {
  const [row] = await db
    .select({ id: invoices.id, kind: invoices.kind, number: invoices.number })
    .from(invoices)
    .where(and(where, eq(invoices.kind, 'invoice'), ne(invoices.status, 'void')))
    .limit(1);
  return row ?? null;
}

/**
 * A draft invoice from a published visit report, a resolved urgent request (its call-out fee, and
 * its visit when that was reported), or blank for a tank. One live invoice per visit and request.
 */
export async function draftInvoice(
  deps: AppDeps,
  actor: Actor,
  input: NewInvoiceInput,
): Promise<InvoiceDetail> {
  const { db } = deps;
  const settings = await billingSettingsOf(db, actor.companyId);
  const [company] = await db
    .select({ zone: companies.timeZone })
    .from(companies)
    .where(eq(companies.id, actor.companyId));
  const companyZone = company?.zone ?? 'UTC';
  let tankId: string;
  const lines: LineValues[] = [];
  let sourceVisitId: string | null = null;
  let sourceUrgentRequestId: string | null = null;

  const tankOf = async (id: string) => {
    const [tank] = await db
      .select()
      .from(tanks)
      .where(and(eq(tanks.id, id), eq(tanks.companyId, actor.companyId)));
    if (!tank) throw notFound('tank');
    return tank;
  };

  if ('visitId' in input) {
    const [visit] = await db
      .select()
      .from(visits)
      .where(and(eq(visits.id, input.visitId), eq(visits.companyId, actor.companyId)));
    if (!visit) throw notFound('visit');
    if (visit.status !== 'published' || visit.published === null) {
      throw conflict('not_published', 'Publish the visit report first; the invoice is drafted from it.');
    }
    const tank = await tankOf(visit.tankId);
    const [request] = await db
      .select({
        id: urgentRequests.id,
        fee: urgentRequests.callOutFeeCents,
        currency: urgentRequests.currency,
      })
      .from(urgentRequests)
      .where(eq(urgentRequests.visitId, visit.id))
      .limit(1);
    const existing = await existingInvoice(
      db,
      or(
        eq(invoices.sourceVisitId, visit.id),
        request ? eq(invoices.sourceUrgentRequestId, request.id) : undefined,
      )!,
    );
    if (existing) throw alreadyInvoiced(existing);
    tankId = tank.id;
    sourceVisitId = visit.id;
    if (request) {
      sourceUrgentRequestId = request.id;
      lines.push(...callOutLines(request.fee, request.currency, settings));
    }
    lines.push(...(await visitLines(db, visit, tank, settings, tank.timeZone ?? companyZone)));
  } else if ('urgentRequestId' in input) {
    const [request] = await db
      .select()
      .from(urgentRequests)
      .where(
        and(eq(urgentRequests.id, input.urgentRequestId), eq(urgentRequests.companyId, actor.companyId)),
      );
    if (!request) throw notFound('urgent request');
    if (request.status !== 'resolved') {
      throw conflict(
        'not_resolved',
        'Resolve the urgent request first; its call-out fee is billed once it is resolved.',
      );
    }
    const existing = await existingInvoice(
      db,
      or(
        eq(invoices.sourceUrgentRequestId, request.id),
        request.visitId ? eq(invoices.sourceVisitId, request.visitId) : undefined,
      )!,
    );
    if (existing) throw alreadyInvoiced(existing);
    const tank = await tankOf(request.tankId);
    tankId = tank.id;
    sourceUrgentRequestId = request.id;
    lines.push(...callOutLines(request.callOutFeeCents, request.currency, settings));
    if (request.visitId) {
      const [visit] = await db.select().from(visits).where(eq(visits.id, request.visitId));
      if (visit?.status === 'published' && visit.published !== null) {
        sourceVisitId = visit.id;
        lines.push(...(await visitLines(db, visit, tank, settings, tank.timeZone ?? companyZone)));
      }
    }
  } else {
    tankId = (await tankOf(input.tankId)).id;
  }

  const owner = await billingOwnerOf(db, tankId);
  const totals = totalsOf(lines, settings);
  const id = await db.transaction(async (tx) => {
    const [created] = await tx
      .insert(invoices)
      .values({
        companyId: actor.companyId,
        tankId,
        sourceVisitId,
        sourceUrgentRequestId,
        billToUserId: owner?.id ?? null,
        billToName: owner?.name ?? '',
        billToEmail: owner?.email ?? '',
        ...taxSnapshot(settings),
        ...totals,
        createdBy: actor.id,
      })
      .returning({ id: invoices.id })
      .catch((error: unknown) => {
        // Two admins drafting the same visit at once: the partial unique index decides.
        if ((error as { cause?: { code?: string } }).cause?.code === '23505') {
          throw conflict('already_invoiced', 'This is already invoiced: someone drafted it a moment ago.');
        }
        throw error;
      });
    await replaceLines(tx, created!.id, lines);
    return created!.id;
  });
  return getInvoice(deps, actor, id);
}

/** The call-out fee the owner agreed to when asking (stored on the request), in the company's currency. */
function callOutLines(feeMinor: number | null, currency: string, settings: BillingSettings): LineValues[] {
  if (feeMinor === null || feeMinor === 0) return [];
  // A fee agreed in another currency than the company bills in now is not converted: the admin prices it.
  const price = currency === settings.currency ? feeMinor : 0;
  return [
    {
      kind: 'call-out',
      description:
        currency === settings.currency
          ? 'Urgent call-out'
          : `Urgent call-out (agreed as ${formatMoney(feeMinor, currency)})`,
      quantityHundredths: 100,
      unit: 'visit',
      unitPriceMinor: price,
      amountMinor: price,
      priceItemId: null,
    },
  ];
}

/* ------------------------------------------------------------------ editing a draft */

async function lockedDraft(tx: Tx, actor: Actor, invoiceId: string, version: number) {
  const invoice = await invoiceFor(tx, actor, invoiceId, { lock: true });
  if (invoice.status !== 'draft') {
    throw conflict('not_draft', 'This invoice was issued; it cannot change. Issue a credit note instead.');
  }
  if (invoice.version !== version) {
    throw conflict(
      'stale_version',
      'Someone else saved this draft since you opened it. Reload to see their changes.',
    );
  }
  return invoice;
}

export async function saveDraft(
  deps: AppDeps,
  actor: Actor,
  invoiceId: string,
  input: InvoiceDraftInput,
): Promise<InvoiceDetail> {
  await deps.db.transaction(async (tx) => {
    const invoice = await lockedDraft(tx, actor, invoiceId, input.version);
    const settings = await billingSettingsOf(tx, actor.companyId);
    await checkPriceItems(tx, actor.companyId, input.lines);
    const lines = linesFrom(input.lines, settings.currency, 1);
    const billTo = input.billToUserId
      ? (await billToChoices(tx, invoice.tankId)).find((owner) => owner.id === input.billToUserId)
      : null;
    if (input.billToUserId && !billTo) {
      throw badRequest('invalid_request', 'Some fields need attention.', [
        { path: 'body.billToUserId', message: 'Choose one of the tank’s owners.' },
      ]);
    }
    await replaceLines(tx, invoice.id, lines);
    await tx
      .update(invoices)
      .set({
        billToUserId: billTo?.id ?? null,
        billToName: billTo?.name ?? '',
        billToEmail: billTo?.email ?? '',
        note: input.note,
        ...taxSnapshot(settings),
        ...totalsOf(lines, settings),
        version: invoice.version + 1,
      })
      .where(eq(invoices.id, invoice.id));
  });
  return getInvoice(deps, actor, invoiceId);
}

export async function deleteDraft(deps: AppDeps, actor: Actor, invoiceId: string): Promise<void> {
  await deps.db.transaction(async (tx) => {
    const invoice = await invoiceFor(tx, actor, invoiceId, { lock: true });
    if (invoice.status !== 'draft') {
      throw conflict('not_draft', 'An issued invoice is never deleted; cancel it with a credit note.');
    }
    await tx.delete(invoices).where(eq(invoices.id, invoice.id));
  });
}

/* ------------------------------------------------------------------ issuing */

/**
 * The next number of the company's series for this kind. The counter row is locked by the UPDATE
 * until the issuing transaction ends, so concurrent issues queue here, and a rollback gives the
 * number back: numbers are consecutive with no gaps.
 */
async function nextNumber(tx: Tx, companyId: string, kind: InvoiceKind): Promise<number> {
  const result = await tx.execute<{ last_number: number }>(sql`
    insert into billing_counters (company_id, kind, last_number) values (${companyId}, ${kind}, 1)
    on conflict (company_id, kind) do update set last_number = billing_counters.last_number + 1, updated_at = now()
    returning last_number`);
  return Number(result.rows[0]!.last_number);
}

function sellerOf(settings: BillingSettings, companyName: string) {
  return {
    name: settings.sellerName || companyName,
    address: settings.sellerAddress,
    taxId: settings.sellerTaxId,
    footer: settings.invoiceFooter,
  };
}

export async function issueInvoice(
  deps: AppDeps,
  actor: Actor,
  invoiceId: string,
  version: number,
  source: AuditSource,
): Promise<InvoiceDetail> {
  const eventId = await deps.db.transaction(async (tx) => {
    const invoice = await lockedDraft(tx, actor, invoiceId, version);
    const lines = await tx.select().from(invoiceLines).where(eq(invoiceLines.invoiceId, invoice.id));
    if (lines.length === 0) throw conflict('no_lines', 'Add at least one line before issuing.');
    if (!invoice.billToUserId || !invoice.billToEmail) {
      throw conflict('no_recipient', 'Choose which owner the invoice is addressed to.');
    }
    const settings = await billingSettingsOf(tx, actor.companyId);
    const totals = totalsOf(lines, settings);
    const now = deps.clock();
    const today = await companyToday(tx, actor.companyId, now);
    const number = await nextNumber(tx, actor.companyId, 'invoice');
    await tx
      .update(invoices)
      .set({
        status: 'issued',
        number,
        ...taxSnapshot(settings),
        ...totals,
        seller: sellerOf(settings, actor.companyName),
        issueDate: today,
        dueDate: addDays(today, settings.paymentTermsDays),
        issuedAt: now,
        issuedBy: actor.id,
        version: invoice.version + 1,
      })
      .where(eq(invoices.id, invoice.id));
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'invoice.issued',
      target: { kind: 'invoice', id: invoice.id, label: documentNumber('invoice', number)! },
      after: {
        number: documentNumber('invoice', number),
        totalMinor: totals.totalMinor,
        currency: settings.currency,
      },
      source,
    });
    return recordInvoiceEvent(tx, invoice.id, 'issued');
  });
  if (eventId) await announceInvoiceEvent(deps, eventId);
  return getInvoice(deps, actor, invoiceId);
}

/* ------------------------------------------------------------------ credit notes and cancelling */

async function issueCreditNote(
  tx: Tx,
  deps: AppDeps,
  actor: Actor,
  invoice: InvoiceRow,
  lines: LineValues[],
  reason: string,
) {
  const settings = { taxRateBp: invoice.taxRateBp, pricesIncludeTax: invoice.pricesIncludeTax };
  const totals = totalsOf(lines, settings);
  const creditable = invoice.totalMinor + invoice.creditedMinor;
  if (-totals.totalMinor > creditable) {
    throw conflict(
      'credit_too_large',
      `A credit note can take back at most ${formatMoney(creditable, invoice.currency)} of this invoice.`,
    );
  }
  const now = deps.clock();
  const today = await companyToday(tx, actor.companyId, now);
  const number = await nextNumber(tx, actor.companyId, 'credit-note');
  const [note] = await tx
    .insert(invoices)
    .values({
      companyId: invoice.companyId,
      tankId: invoice.tankId,
      kind: 'credit-note',
      status: 'issued',
      number,
      creditedInvoiceId: invoice.id,
      billToUserId: invoice.billToUserId,
      billToName: invoice.billToName,
      billToEmail: invoice.billToEmail,
      currency: invoice.currency,
      taxRateBp: invoice.taxRateBp,
      taxLabel: invoice.taxLabel,
      pricesIncludeTax: invoice.pricesIncludeTax,
      ...totals,
      seller: invoice.seller,
      issueDate: today,
      issuedAt: now,
      issuedBy: actor.id,
      reason,
      createdBy: actor.id,
    })
    .returning({ id: invoices.id });
  await replaceLines(tx, note!.id, lines);
  return { id: note!.id, number, totalMinor: totals.totalMinor };
}

/** After a credit: an unpaid invoice credited down to nothing is cancelled; one covered by payments is paid. */
function settledStatus(invoice: InvoiceRow, creditedMinor: number) {
  const balance = invoice.totalMinor + creditedMinor - invoice.paidMinor;
  if (!unpaidStatuses.includes(invoice.status) || balance > 0) return {};
  return invoice.paidMinor > 0
    ? { status: 'paid' as const, paidAt: invoice.paidAt }
    : { status: 'void' as const };
}

export async function creditInvoice(
  deps: AppDeps,
  actor: Actor,
  invoiceId: string,
  input: CreditNoteInput,
  source: AuditSource,
): Promise<InvoiceDetail> {
  const { noteId, eventId } = await deps.db.transaction(async (tx) => {
    const invoice = await invoiceFor(tx, actor, invoiceId, { lock: true });
    if (invoice.kind !== 'invoice' || invoice.status === 'draft' || invoice.status === 'void') {
      throw conflict('not_creditable', 'Only an issued invoice can be credited.');
    }
    await checkPriceItems(tx, actor.companyId, input.lines);
    const lines = linesFrom(input.lines, invoice.currency, -1);
    const note = await issueCreditNote(tx, deps, actor, invoice, lines, input.reason);
    const creditedMinor = invoice.creditedMinor + note.totalMinor;
    const settled = settledStatus(invoice, creditedMinor);
    await tx
      .update(invoices)
      .set({
        creditedMinor,
        ...settled,
        ...(settled.status === 'void' ? { voidedAt: deps.clock(), reason: input.reason } : {}),
      })
      .where(eq(invoices.id, invoice.id));
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'invoice.credited',
      target: { kind: 'invoice', id: invoice.id, label: documentNumber('invoice', invoice.number)! },
      after: {
        creditNote: documentNumber('credit-note', note.number),
        totalMinor: note.totalMinor,
        reason: input.reason,
      },
      source,
    });
    return { noteId: note.id, eventId: await recordInvoiceEvent(tx, note.id, 'issued') };
  });
  if (eventId) await announceInvoiceEvent(deps, eventId);
  return getInvoice(deps, actor, noteId);
}

/** Cancels an unpaid, uncredited invoice with a credit note for the whole of it. */
export async function voidInvoice(
  deps: AppDeps,
  actor: Actor,
  invoiceId: string,
  reason: string,
  source: AuditSource,
): Promise<InvoiceDetail> {
  const eventId = await deps.db.transaction(async (tx) => {
    const invoice = await invoiceFor(tx, actor, invoiceId, { lock: true });
    if (invoice.kind !== 'invoice' || !unpaidStatuses.includes(invoice.status)) {
      throw conflict('not_voidable', 'Only an issued invoice awaiting payment can be cancelled.');
    }
    if (invoice.paidMinor > 0 || invoice.creditedMinor !== 0) {
      throw conflict(
        'not_voidable',
        'Money was paid or credited against this invoice; issue a credit note instead.',
      );
    }
    const original = await tx
      .select()
      .from(invoiceLines)
      .where(eq(invoiceLines.invoiceId, invoice.id))
      .orderBy(asc(invoiceLines.position));
    const lines = original.map((line): LineValues => ({
      kind: line.kind,
      description: line.description,
      quantityHundredths: line.quantityHundredths,
      unit: line.unit,
      unitPriceMinor: -line.unitPriceMinor,
      amountMinor: -line.amountMinor,
      priceItemId: line.priceItemId,
    }));
    const note = await issueCreditNote(tx, deps, actor, invoice, lines, reason);
    await tx
      .update(invoices)
      .set({ status: 'void', creditedMinor: note.totalMinor, voidedAt: deps.clock(), reason })
      .where(eq(invoices.id, invoice.id));
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'invoice.voided',
      target: { kind: 'invoice', id: invoice.id, label: documentNumber('invoice', invoice.number)! },
      after: { creditNote: documentNumber('credit-note', note.number), reason },
      source,
    });
    return recordInvoiceEvent(tx, note.id, 'issued');
  });
  if (eventId) await announceInvoiceEvent(deps, eventId);
  return getInvoice(deps, actor, invoiceId);
}

/* ------------------------------------------------------------------ payments */

/**
 * Money received against an invoice, inside the caller's transaction: the payment row, the paid
 * sum, and — when that settles it — the paid state and the receipt event (at most one per invoice).
 * Returns the receipt event to announce after commit.
 */
export async function applyPayment(
  tx: Tx,
  invoice: InvoiceRow,
  payment: Omit<typeof payments.$inferInsert, 'invoiceId' | 'companyId' | 'currency'>,
): Promise<string | null> {
  await tx
    .insert(payments)
    .values({ ...payment, invoiceId: invoice.id, companyId: invoice.companyId, currency: invoice.currency });
  const paidMinor = invoice.paidMinor + payment.amountMinor;
  const settles =
    unpaidStatuses.includes(invoice.status) && invoice.totalMinor + invoice.creditedMinor - paidMinor <= 0;
  await tx
    .update(invoices)
    .set({ paidMinor, ...(settles ? { status: 'paid' as const, paidAt: payment.receivedAt } : {}) })
    .where(eq(invoices.id, invoice.id));
  return settles ? recordInvoiceEvent(tx, invoice.id, 'paid') : null;
}

/** A payment received another way (bank transfer, cash, card in person), recorded by an admin. */
export async function recordPayment(
  deps: AppDeps,
  actor: Actor,
  invoiceId: string,
  input: RecordPaymentInput,
  source: AuditSource,
): Promise<InvoiceDetail> {
  const eventId = await deps.db.transaction(async (tx) => {
    const invoice = await invoiceFor(tx, actor, invoiceId, { lock: true });
    if (invoice.kind !== 'invoice' || !unpaidStatuses.includes(invoice.status)) {
      throw conflict(
        'not_payable',
        invoice.status === 'paid' ? 'This invoice is already paid.' : 'This invoice is not awaiting payment.',
      );
    }
    const amountMinor = moneyOf(input.amount, invoice.currency, 'body.amount');
    const balance = balanceOf(invoice);
    if (amountMinor <= 0 || amountMinor > balance) {
      throw badRequest('invalid_request', 'Some fields need attention.', [
        {
          path: 'body.amount',
          message: `Enter an amount above 0 and at most the ${formatMoney(balance, invoice.currency)} still owed.`,
        },
      ]);
    }
    const event = await applyPayment(tx, invoice, {
      method: input.method,
      amountMinor,
      receivedAt: new Date(`${input.receivedOn}T12:00:00Z`),
      reference: input.reference,
      recordedBy: actor.id,
    });
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'invoice.payment-recorded',
      target: { kind: 'invoice', id: invoice.id, label: documentNumber('invoice', invoice.number)! },
      after: { method: input.method, amountMinor, currency: invoice.currency, receivedOn: input.receivedOn },
      source,
    });
    return event;
  });
  if (eventId) await announceInvoiceEvent(deps, eventId);
  return getInvoice(deps, actor, invoiceId);
}

/* ------------------------------------------------------------------ due dates and reminders */

/** Reminders go out from this hour of the company's morning, not at midnight. */
const reminderHour = 9;

/**
 * Issued invoices past their due date become overdue; an overdue invoice reminds its owner 7 and 14
 * days after the due date (from 9:00 on the company's clock), once each (the event's unique key). A sweep that was down for a while
 * sends only the latest reminder due, not both at once. Returns the reminder events to announce.
 */
export async function sweepOverdueInvoices(deps: AppDeps): Promise<string[]> {
  const now = deps.clock();
  await deps.db.execute(sql`
    update invoices set status = 'overdue', updated_at = now()
    from companies
    where companies.id = invoices.company_id and invoices.kind = 'invoice' and invoices.status = 'issued'
      and invoices.due_date < (${now}::timestamptz at time zone companies.time_zone)::date`);
  const due = await deps.db.execute<{ id: string; stage: 'reminder-7' | 'reminder-14' }>(sql`
    with overdue as (
      select i.id, (${now}::timestamptz at time zone c.time_zone)::date - i.due_date as days_over,
        extract(hour from ${now}::timestamptz at time zone c.time_zone) as local_hour
      from invoices i join companies c on c.id = i.company_id
      where i.status = 'overdue' and i.kind = 'invoice'
    )
    select o.id, case when o.days_over >= 14 then 'reminder-14' else 'reminder-7' end as stage
    from overdue o
    where o.days_over >= 7 and o.local_hour >= ${reminderHour}
      and not exists (select 1 from invoice_events e where e.invoice_id = o.id and e.type = 'reminder-14')
      and (o.days_over >= 14
        or not exists (select 1 from invoice_events e where e.invoice_id = o.id and e.type = 'reminder-7'))
    limit 200`);
  const events: string[] = [];
  for (const row of due.rows) {
    const id = await recordInvoiceEvent(deps.db, row.id, row.stage);
    if (id) events.push(id);
  }
  for (const id of events) await announceInvoiceEvent(deps, id);
  return events;
}
