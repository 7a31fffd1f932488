import { and, desc, eq, gt } from 'drizzle-orm';
import type Stripe from 'stripe';
import { documentNumber, unpaidStatuses } from '@shared/billing/invoices';
import type { CheckoutStarted } from '@shared/schemas/billing';
import type { AppDeps } from '../deps';
import { checkoutSessions, invoices, paymentEvents, payments, tanks } from '../db/schema/index';
import { appOrigin } from '../env';
import { badRequest, conflict, notFound } from '../lib/http-error';
import { visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import { announceInvoiceEvent, invoiceLink } from './invoice-notify';
import { applyPayment } from './invoices';

/*
 * Online payment through the provider's hosted checkout. "Pay now" makes a checkout session for what
 * is still owed and sends the owner to the provider's page; the result comes back only through the
 * provider's signed webhook, never from the browser's return. Each event is stored by its id in the
 * transaction that applies it, so a replayed or duplicated delivery changes nothing, and the order
 * events arrive in does not matter: a completed payment is recorded once whatever came before it,
 * and an expiry only closes a session that is still open.
 */

/** How long the owner has to pay on the provider's page (the provider allows 30 minutes to 24 hours). */
const checkoutMinutes = 60;

const paymentsOff = () =>
  conflict('payments_off', 'Online payment is not set up for this company. Pay by the means on the invoice.');

export async function startCheckout(
  deps: AppDeps,
  actor: Actor,
  invoiceId: string,
): Promise<CheckoutStarted> {
  const provider = deps.payments;
  const { db } = deps;
  const [row] = await db
    .select({ invoice: invoices, tankName: tanks.name })
    .from(invoices)
    .innerJoin(tanks, eq(tanks.id, invoices.tankId))
    .where(and(eq(invoices.id, invoiceId), eq(invoices.companyId, actor.companyId), visibleTanks(db, actor)));
  if (!row || row.invoice.status === 'draft') throw notFound('invoice');
  const { invoice } = row;
  if (invoice.kind !== 'invoice' || !unpaidStatuses.includes(invoice.status)) {
    throw conflict(
      'not_payable',
      invoice.status === 'paid'
        ? 'This invoice is already paid. Thank you.'
        : 'This invoice is cancelled; there is nothing to pay.',
    );
  }
  if (!provider) throw paymentsOff();
  const owed = invoice.totalMinor + invoice.creditedMinor - invoice.paidMinor;
  if (owed <= 0) throw conflict('not_payable', 'Nothing is owed on this invoice.');
  const now = deps.clock();

  // A session still open for the same amount is offered again rather than a second one made, so
  // two tabs cannot pay the same invoice twice.
  const [open] = await db
    .select()
    .from(checkoutSessions)
    .where(
      and(
        eq(checkoutSessions.invoiceId, invoice.id),
        eq(checkoutSessions.status, 'open'),
        eq(checkoutSessions.amountMinor, owed),
        gt(checkoutSessions.expiresAt, new Date(now.getTime() + 5 * 60_000)),
      ),
    )
    .orderBy(desc(checkoutSessions.createdAt))
    .limit(1);
  if (open) return { url: open.url };

  const origin = appOrigin(deps.env);
  const number = documentNumber('invoice', invoice.number)!;
  const attempts = await db.$count(checkoutSessions, eq(checkoutSessions.invoiceId, invoice.id));
  let session: Stripe.Checkout.Session;
  try {
    session = await provider.stripe.checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency: invoice.currency.toLowerCase(),
              unit_amount: owed,
              product_data: { name: `Invoice ${number} — ${row.tankName}` },
            },
          },
        ],
        client_reference_id: invoice.id,
        customer_email: invoice.billToEmail || undefined,
        metadata: { invoiceId: invoice.id, companyId: invoice.companyId, number },
        payment_intent_data: { metadata: { invoiceId: invoice.id, number } },
        success_url: `${origin}${invoiceLink(invoice.id)}?paid=1`,
        cancel_url: `${origin}${invoiceLink(invoice.id)}`,
        expires_at: Math.floor(now.getTime() / 1000) + checkoutMinutes * 60,
      },
      // The same attempt retried (a lost answer) gets the same session back from the provider.
      { idempotencyKey: `checkout-${invoice.id}-${attempts + 1}-${owed}` },
    );
  } catch (error) {
    deps.logger.error(
      { err: error, invoiceId: invoice.id },
      'the payment provider refused a checkout session',
    );
    throw conflict(
      'provider_unavailable',
      'The payment page could not be opened just now. Try again in a minute.',
    );
  }
  if (!session.url) throw conflict('provider_unavailable', 'The payment page could not be opened just now.');
  await db
    .insert(checkoutSessions)
    .values({
      id: session.id,
      companyId: invoice.companyId,
      invoiceId: invoice.id,
      amountMinor: owed,
      currency: invoice.currency,
      url: session.url,
      expiresAt: new Date(session.expires_at * 1000),
      createdBy: actor.id,
    })
    .onConflictDoNothing();
  return { url: session.url };
}

export interface WebhookOutcome {
  received: true;
  /** What the event did: applied, duplicate, or why it changed nothing. */
  outcome: string;
}

/**
 * The provider's webhook. The signature is checked over the exact bytes (400 and nothing stored when
 * it is missing or wrong); then, in one transaction, the event is stored by id and applied.
 */
export async function receiveWebhook(
  deps: AppDeps,
  rawBody: Buffer | undefined,
  signature: string | undefined,
): Promise<WebhookOutcome> {
  const provider = deps.payments;
  if (!provider) throw paymentsOff();
  if (!rawBody || !signature) {
    throw badRequest('invalid_signature', 'A signed event from the payment provider is expected here.');
  }
  let event: Stripe.Event;
  try {
    // The signature's age is judged on the app's clock (the provider's default tolerance of 300 s).
    event = provider.stripe.webhooks.constructEvent(
      rawBody,
      signature,
      provider.webhookSecret,
      undefined,
      undefined,
      deps.clock().getTime(),
    );
  } catch {
    throw badRequest('invalid_signature', 'The event’s signature does not match; it was not accepted.');
  }
  const session = event.type.startsWith('checkout.session.')
    ? (event.data.object as Stripe.Checkout.Session)
    : null;
  const { outcome, receiptEvent } = await deps.db.transaction(async (tx) => {
    const [stored] = await tx
      .insert(paymentEvents)
      .values({
        id: event.id,
        type: event.type,
        occurredAt: new Date(event.created * 1000),
        checkoutSessionId: session?.id ?? null,
        outcome: 'received',
        payload: event,
      })
      .onConflictDoNothing()
      .returning({ id: paymentEvents.id });
    if (!stored) return { outcome: 'duplicate', receiptEvent: null };
    const result = session
      ? await applySessionEvent(tx, event.type, session, new Date(event.created * 1000))
      : { outcome: 'ignored', receiptEvent: null };
    await tx
      .update(paymentEvents)
      .set({ outcome: result.outcome, invoiceId: result.invoiceId ?? null })
      .where(eq(paymentEvents.id, event.id));
    return result;
  });
  if (outcome === 'unknown-session') {
    deps.logger.warn(
      { eventId: event.id, sessionId: session?.id },
      'payment event for a checkout session we did not make',
    );
  } else if (outcome === 'paid-after-settled') {
    deps.logger.error(
      { eventId: event.id, sessionId: session?.id },
      'a payment arrived for an invoice already settled; refund it',
    );
  }
  if (receiptEvent) await announceInvoiceEvent(deps, receiptEvent);
  return { received: true, outcome };
}

type Tx = Parameters<Parameters<AppDeps['db']['transaction']>[0]>[0];

async function applySessionEvent(
  tx: Tx,
  type: string,
  session: Stripe.Checkout.Session,
  occurredAt: Date,
): Promise<{ outcome: string; receiptEvent: string | null; invoiceId?: string }> {
  const [known] = await tx
    .select()
    .from(checkoutSessions)
    .where(eq(checkoutSessions.id, session.id))
    .for('update');
  if (!known) return { outcome: 'unknown-session', receiptEvent: null };
  const invoiceId = known.invoiceId;
  const paid =
    (type === 'checkout.session.completed' || type === 'checkout.session.async_payment_succeeded') &&
    session.payment_status === 'paid';
  if (paid) {
    await tx.update(checkoutSessions).set({ status: 'complete' }).where(eq(checkoutSessions.id, session.id));
    const [already] = await tx
      .select({ id: payments.id })
      .from(payments)
      .where(eq(payments.checkoutSessionId, session.id));
    if (already) return { outcome: 'already-recorded', receiptEvent: null, invoiceId };
    const [invoice] = await tx.select().from(invoices).where(eq(invoices.id, invoiceId)).for('update');
    if (!invoice) return { outcome: 'unknown-session', receiptEvent: null };
    const settledBefore = !unpaidStatuses.includes(invoice.status);
    // Money the provider took is always recorded, even when the invoice was settled meanwhile (two
    // tabs, a bank transfer): the balance then shows the overpayment to refund.
    const receiptEvent = await applyPayment(tx, invoice, {
      method: 'card-online',
      amountMinor: session.amount_total ?? known.amountMinor,
      receivedAt: occurredAt,
      checkoutSessionId: session.id,
      providerPaymentId:
        typeof session.payment_intent === 'string'
          ? session.payment_intent
          : (session.payment_intent?.id ?? null),
      // The session and payment ids are kept in their own columns; the reference is for people.
      reference: '',
    });
    return { outcome: settledBefore ? 'paid-after-settled' : 'applied', receiptEvent, invoiceId };
  }
  if (type === 'checkout.session.expired') {
    if (known.status !== 'open') return { outcome: 'ignored', receiptEvent: null, invoiceId };
    await tx.update(checkoutSessions).set({ status: 'expired' }).where(eq(checkoutSessions.id, session.id));
    return { outcome: 'applied', receiptEvent: null, invoiceId };
  }
  return { outcome: 'ignored', receiptEvent: null, invoiceId };
}
