import { and, asc, eq, isNull, lte } from 'drizzle-orm';
import { documentNumber, type InvoiceEventType } from '@shared/billing/invoices';
import { formatMoney } from '@shared/billing/money';
import { formatDate } from '@shared/text/dates';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { deliveries, invoiceEvents, invoices, notifications, users } from '../db/schema/index';
import { appOrigin } from '../env';
import { escapeHtml } from '../lib/html';
import { renderInvoicePdf } from '../lib/invoice-pdf';
import { queues } from '../lib/job-queue';
import { publishEvent } from '../lib/event-bus';
import { invoiceForCompany } from './invoice-views';
import { headerSafe, markAttempt, markSent } from './notify';

/*
 * Telling the client about an invoice: issued (with the PDF), paid (the receipt), and the overdue
 * reminders. These are the company's documents rather than news, so they go by e-mail to the person
 * the invoice is addressed to whatever their notification choices, plus one in-app notification.
 * invoice_events is the outbox: one row per (invoice, what happened), written in the change's own
 * transaction, so a receipt is planned once even when the provider's webhook comes twice.
 */

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** Writes the event unless it already happened; returns its id only when it is new. */
export async function recordInvoiceEvent(
  db: Db | Tx,
  invoiceId: string,
  type: InvoiceEventType,
): Promise<string | null> {
  const [created] = await db
    .insert(invoiceEvents)
    .values({ invoiceId, type })
    .onConflictDoNothing()
    .returning({ id: invoiceEvents.id });
  return created?.id ?? null;
}

export const invoiceLink = (invoiceId: string) => `/invoices/${invoiceId}`;

async function loadEvent(deps: AppDeps, eventId: string) {
  const [row] = await deps.db
    .select({ event: invoiceEvents, invoice: invoices })
    .from(invoiceEvents)
    .innerJoin(invoices, eq(invoices.id, invoiceEvents.invoiceId))
    .where(eq(invoiceEvents.id, eventId));
  return row ?? null;
}

interface InvoiceNews {
  title: string;
  body: string;
}

function newsOf(
  type: InvoiceEventType,
  invoice: typeof invoices.$inferSelect,
  companyName: string,
  zone: string,
): InvoiceNews {
  const number = documentNumber(invoice.kind, invoice.number) ?? '';
  const owed = invoice.totalMinor + invoice.creditedMinor - invoice.paidMinor;
  const due = invoice.dueDate ? formatDate(new Date(`${invoice.dueDate}T12:00:00Z`), zone) : '';
  if (invoice.kind === 'credit-note') {
    return {
      title: `Credit note ${number} from ${companyName}`,
      body: `${companyName} credited ${formatMoney(-invoice.totalMinor, invoice.currency)}${invoice.reason ? `: ${invoice.reason}` : '.'}`,
    };
  }
  switch (type) {
    case 'issued':
      return {
        title: `Invoice ${number} from ${companyName}`,
        body: `${formatMoney(invoice.totalMinor, invoice.currency)}, due by ${due}.`,
      };
    case 'paid':
      return {
        title: `Receipt for invoice ${number}`,
        body: `Thank you: ${formatMoney(invoice.paidMinor, invoice.currency)} received. The invoice is paid.`,
      };
    case 'reminder-7':
    case 'reminder-14':
      return {
        title: `Reminder: invoice ${number} is overdue`,
        body: `${formatMoney(owed, invoice.currency)} was due on ${due}. If you have paid already, thank you — please ignore this.`,
      };
  }
}

/**
 * After commit: an in-app notification and one e-mail delivery (queued) for the person the invoice
 * is addressed to; then the event is marked announced. Failing here loses nothing: the minute sweep
 * announces any event left unannounced.
 */
export async function announceInvoiceEvent(deps: AppDeps, eventId: string) {
  try {
    const loaded = await loadEvent(deps, eventId);
    if (!loaded || loaded.event.announcedAt) return;
    const { event, invoice } = loaded;
    const [reader] = invoice.billToUserId
      ? await deps.db
          .select({ id: users.id, email: users.email })
          .from(users)
          .where(eq(users.id, invoice.billToUserId))
      : [];
    if (reader) {
      const context = await invoiceForCompany(deps, invoice.id);
      const news = newsOf(event.type, invoice, context?.companyName ?? '', context?.timeZone ?? 'UTC');
      await deps.db
        .insert(notifications)
        .values({
          userId: reader.id,
          invoiceEventId: event.id,
          severity: event.type.startsWith('reminder') ? 'warning' : 'notice',
          title: news.title,
          body: news.body,
          link: invoiceLink(invoice.id),
        })
        .onConflictDoNothing();
      const destination = invoice.billToEmail || reader.email;
      const [created] = await deps.db
        .insert(deliveries)
        .values({ invoiceEventId: event.id, userId: reader.id, channel: 'email', destination })
        .onConflictDoNothing()
        .returning({ id: deliveries.id });
      if (created) {
        if (deps.jobs) await deps.jobs.send(queues.email, { deliveryId: created.id });
        else await deliverInvoiceEmail(deps, created.id);
      }
      await publishEvent(deps.pool, { type: 'notification', userIds: [reader.id], tankId: invoice.tankId });
    }
    await deps.db
      .update(invoiceEvents)
      .set({ announcedAt: deps.clock() })
      .where(eq(invoiceEvents.id, event.id));
  } catch (error) {
    deps.logger.error({ err: error, invoiceEventId: eventId }, 'announcing an invoice event failed');
  }
}

/** Events never announced (the process stopped between commit and queueing), oldest first. */
export async function unannouncedInvoiceEvents(deps: Pick<AppDeps, 'db' | 'clock'>, olderThanMs: number) {
  const cutoff = new Date(deps.clock().getTime() - olderThanMs);
  const rows = await deps.db
    .select({ id: invoiceEvents.id })
    .from(invoiceEvents)
    .where(and(isNull(invoiceEvents.announcedAt), lte(invoiceEvents.createdAt, cutoff)))
    .orderBy(asc(invoiceEvents.createdAt))
    .limit(100);
  return rows.map((row) => row.id);
}

/** The e-mail job for an invoice delivery: the message, with the document as a PDF attached. */
export async function deliverInvoiceEmail(deps: AppDeps, deliveryId: string) {
  const [delivery] = await deps.db.select().from(deliveries).where(eq(deliveries.id, deliveryId));
  if (!delivery || delivery.status !== 'pending' || !delivery.invoiceEventId) return;
  const loaded = await loadEvent(deps, delivery.invoiceEventId);
  const context = loaded ? await invoiceForCompany(deps, loaded.invoice.id) : null;
  if (!loaded || !context) return;
  const { detail, companyName, timeZone } = context;
  const news = newsOf(loaded.event.type, loaded.invoice, companyName, timeZone);
  const link = `${appOrigin(deps.env)}${invoiceLink(detail.id)}`;
  const action =
    detail.payable || (detail.kind === 'invoice' && detail.balanceMinor > 0) ? 'View and pay it' : 'View it';
  try {
    const pdf = await renderInvoicePdf(detail, { companyName, timeZone });
    await deps.mailer.send({
      to: delivery.destination,
      subject: headerSafe(news.title),
      text: [
        news.title,
        '',
        news.body,
        '',
        `${action} in Brinewatch: ${link}`,
        '',
        `The ${detail.kind === 'invoice' ? 'invoice' : 'credit note'} is attached as a PDF.`,
      ].join('\n'),
      html: `<h1 style="font-size:18px">${escapeHtml(news.title)}</h1>
<p>${escapeHtml(news.body)}</p>
<p><a href="${escapeHtml(link)}">${escapeHtml(action)} in Brinewatch</a></p>
<p style="font-size:12px;color:#555">The ${detail.kind === 'invoice' ? 'invoice' : 'credit note'} is attached as a PDF.</p>`,
      headers: { 'X-Brinewatch-Invoice': detail.id, 'X-Brinewatch-Invoice-Event': loaded.event.type },
      attachments: [
        { filename: `${detail.number ?? 'draft'}.pdf`, content: pdf, contentType: 'application/pdf' },
      ],
    });
  } catch (error) {
    await markAttempt(deps, deliveryId, error instanceof Error ? error.message : String(error));
    throw error;
  }
  await markSent(deps, deliveryId);
}
