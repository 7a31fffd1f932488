import { randomBytes } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BillingSettingsView, CheckoutStarted, InvoiceDetail } from '@shared/schemas/billing';
import { wallTimeOf } from '@shared/visits/recurrence';
import type { CheckoutSession } from '../../api/dev/payment-provider';
import {
  checkoutSessions,
  deliveries,
  invoiceEvents,
  invoices,
  paymentEvents,
  payments,
  type tanks,
} from '../../api/db/schema/index';
import { createTestApp } from '../helpers/app';
import { signedIn, type ApiAnswer, type ApiSession } from '../helpers/api-session';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { startTestStack, testPaymentKeys, type TestStack } from '../helpers/stack';

/*
 * The payment provider's webhook (POST /api/payments/webhook). Checkout sessions are made the way
 * the app makes them, through "Pay now" against the provider stand-in; the events are then signed
 * here with the SDK's own test helper (the provider's published `Stripe-Signature` scheme,
 * docs.stripe.com/webhooks#verify-manually) and posted with the exact bytes signed, so each test
 * decides what arrives, twice, late or out of order. One test goes the whole way through the
 * stand-in's payment page and its own delivery.
 */

type Tank = typeof tanks.$inferSelect;
type ErrorBody = { error: { code: string; message: string } };
type Outcome = { received: true; outcome: string };

const london = 'Europe/London';
const today = () => wallTimeOf(new Date(), london).day;
const sdk = new Stripe(testPaymentKeys.STRIPE_SECRET_KEY);
const newId = (prefix: string) => `${prefix}${randomBytes(12).toString('hex')}`;

describe('POST /api/payments/webhook', () => {
  let stack: TestStack;
  let companyId: string;
  let admin: ApiSession;
  let owner: ApiSession;
  let ownerPerson: TestPerson;
  let reef: Tank;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db, { timeZone: london })).id;
    ownerPerson = await createPerson(db, { companyId, role: 'owner', issuer, name: 'Olive Owner' });
    admin = await signedIn(
      stack,
      await createPerson(db, { companyId, role: 'admin', issuer, name: 'Ada Admin' }),
    );
    owner = await signedIn(stack, ownerPerson);
    reef = await createTank(db, { companyId, name: 'Lobby reef', timeZone: london, owners: [ownerPerson] });
    const settings = await admin.put<BillingSettingsView>('/api/billing/settings', {
      currency: 'GBP',
      taxRate: '20',
      taxLabel: 'VAT',
      pricesIncludeTax: true,
      paymentTermsDays: 14,
      hourlyRate: '60.00',
      callOutFee: null,
      sellerName: '',
      sellerAddress: '',
      sellerTaxId: '',
      invoiceFooter: '',
    });
    expect(settings.status, JSON.stringify(settings.body)).toBe(200);
  });
  afterAll(() => stack?.close());

  async function ok<T = unknown>(answer: Promise<ApiAnswer>, status = 200): Promise<T> {
    const res = await answer;
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    return res.body as T;
  }

  /** An issued invoice of 193.99 (20 % VAT included) addressed to the owner. */
  async function issuedInvoice() {
    const blank = await ok<InvoiceDetail>(admin.post('/api/invoices', { tankId: reef.id }), 201);
    const draft = await ok<InvoiceDetail>(
      admin.put(`/api/invoices/${blank.id}`, {
        version: blank.version,
        billToUserId: ownerPerson.id,
        note: '',
        lines: [
          {
            kind: 'service',
            description: 'Routine service',
            quantity: '1',
            unit: 'visit',
            unitPrice: '193.99',
          },
        ],
      }),
    );
    return ok<InvoiceDetail>(admin.post(`/api/invoices/${draft.id}/issue`, { version: draft.version }));
  }

  /** "Pay now" as the owner: the provider's session for what is owed. */
  async function checkout(invoice: InvoiceDetail): Promise<CheckoutSession> {
    const started = await ok<CheckoutStarted>(owner.post(`/api/invoices/${invoice.id}/checkout`));
    const session = stack.payments.sessions().find((s) => s.url === started.url);
    expect(session, `no session at the stand-in for ${started.url}`).toBeDefined();
    return session!;
  }

  /** The session as the provider describes it once paid by card. */
  const paid = (session: CheckoutSession): CheckoutSession => ({
    ...session,
    status: 'complete',
    payment_status: 'paid',
    payment_intent: newId('pi_test_'),
    url: null,
  });

  /** An event as the provider sends it, with the header the provider would sign it with. */
  function signed(
    type: string,
    object: unknown,
    options: { id?: string; created?: Date; secret?: string; signedAt?: Date } = {},
  ) {
    const event = {
      id: options.id ?? newId('evt_test_'),
      object: 'event',
      api_version: Stripe.API_VERSION,
      created: Math.floor((options.created ?? new Date()).getTime() / 1000),
      data: { object },
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type,
    };
    const raw = JSON.stringify(event);
    const header = sdk.webhooks.generateTestHeaderString({
      payload: raw,
      secret: options.secret ?? testPaymentKeys.STRIPE_WEBHOOK_SECRET,
      ...(options.signedAt && { timestamp: Math.floor(options.signedAt.getTime() / 1000) }),
    });
    return { event, raw, header };
  }

  function deliver(raw: string, header?: string) {
    const call = request(stack.app).post('/api/payments/webhook').set('Content-Type', 'application/json');
    return (header === undefined ? call : call.set('Stripe-Signature', header)).send(raw);
  }

  async function delivered(message: { raw: string; header: string }, outcome: string) {
    const res = await deliver(message.raw, message.header);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body as Outcome).toEqual({ received: true, outcome });
  }

  const invoiceRow = async (id: string) =>
    (await stack.database.db.select().from(invoices).where(eq(invoices.id, id)))[0]!;
  const paymentsOf = (invoiceId: string) =>
    stack.database.db.select().from(payments).where(eq(payments.invoiceId, invoiceId));
  const receiptEvents = (invoiceId: string) =>
    stack.database.db
      .select()
      .from(invoiceEvents)
      .where(and(eq(invoiceEvents.invoiceId, invoiceId), eq(invoiceEvents.type, 'paid')));
  async function receiptDeliveries(invoiceId: string) {
    const [event] = await receiptEvents(invoiceId);
    if (!event) return [];
    return stack.database.db.select().from(deliveries).where(eq(deliveries.invoiceEventId, event.id));
  }
  const receiptMails = (invoice: InvoiceDetail) =>
    stack.mail.messages().filter((mail) => mail.subject === `Receipt for invoice ${invoice.number}`);
  const storedEvent = async (id: string) =>
    (await stack.database.db.select().from(paymentEvents).where(eq(paymentEvents.id, id)))[0];
  const sessionRow = async (id: string) =>
    (await stack.database.db.select().from(checkoutSessions).where(eq(checkoutSessions.id, id)))[0]!;

  describe('checkout (POST /api/invoices/:invoiceId/checkout)', () => {
    it('opens the provider’s hosted page for what is owed, and offers the same open session again', async () => {
      const invoice = await issuedInvoice();

      const first = await ok<CheckoutStarted>(owner.post(`/api/invoices/${invoice.id}/checkout`));
      const again = await ok<CheckoutStarted>(owner.post(`/api/invoices/${invoice.id}/checkout`));

      expect(first.url.startsWith(`${stack.payments.url}/`)).toBe(true);
      expect(again.url).toBe(first.url);
      const sessions = stack.payments.sessions().filter((s) => s.client_reference_id === invoice.id);
      expect(sessions).toHaveLength(1);
      expect(sessions[0]).toMatchObject({
        amount_total: 19399,
        currency: 'gbp',
        status: 'open',
        payment_status: 'unpaid',
      });
      expect(await sessionRow(sessions[0]!.id)).toMatchObject({
        invoiceId: invoice.id,
        amountMinor: 19399,
        currency: 'GBP',
        status: 'open',
        url: first.url,
      });
    });
  });

  describe('a completed payment', () => {
    it('marks the invoice paid, with the event stored in the same transaction, one payment and one receipt', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      const completed = signed('checkout.session.completed', paid(session));

      await delivered(completed, 'applied');

      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'paid', paidMinor: 19399 });
      const [payment, ...more] = await paymentsOf(invoice.id);
      expect(more).toEqual([]);
      expect(payment).toMatchObject({
        method: 'card-online',
        amountMinor: 19399,
        currency: 'GBP',
        checkoutSessionId: session.id,
        providerPaymentId: (completed.event.data.object as CheckoutSession).payment_intent,
        receivedAt: new Date(completed.event.created * 1000),
      });
      expect(await storedEvent(completed.event.id)).toMatchObject({
        type: 'checkout.session.completed',
        checkoutSessionId: session.id,
        invoiceId: invoice.id,
        outcome: 'applied',
      });
      expect((await sessionRow(session.id)).status).toBe('complete');
      // Rows written in one transaction share its start time (now()), to the microsecond.
      const { rows } = await stack.database.pool.query<{ same: boolean }>(
        `select e.created_at = p.created_at and p.created_at = r.created_at as same
         from payment_events e, payments p, invoice_events r
         where e.id = $1 and p.checkout_session_id = $2 and r.invoice_id = $3 and r.type = 'paid'`,
        [completed.event.id, session.id, invoice.id],
      );
      expect(rows).toEqual([{ same: true }]);
      expect(await receiptEvents(invoice.id)).toHaveLength(1);
      expect((await receiptDeliveries(invoice.id)).map((d) => [d.destination, d.status])).toEqual([
        [ownerPerson.email, 'sent'],
      ]);
      expect(receiptMails(invoice)).toHaveLength(1);
      const seen = await ok<InvoiceDetail>(owner.get(`/api/invoices/${invoice.id}`));
      expect(seen).toMatchObject({ status: 'paid', balanceMinor: 0, payable: false });
    });

    it('stores nothing when applying the event fails, so the provider’s retry applies it later', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      const completed = signed('checkout.session.completed', paid(session));
      const { pool } = stack.database;
      await pool.query(`create function refuse_payment() returns trigger language plpgsql as $$
        begin raise exception 'refused by the webhook test'; end $$`);
      await pool.query(
        'create trigger refuse_payment before insert on payments for each row execute function refuse_payment()',
      );
      let failed: request.Response;
      try {
        failed = await deliver(completed.raw, completed.header);
      } finally {
        await pool.query('drop trigger refuse_payment on payments');
        await pool.query('drop function refuse_payment()');
      }

      expect(failed.status).toBe(500);
      expect(await storedEvent(completed.event.id)).toBeUndefined();
      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'issued', paidMinor: 0 });
      expect((await sessionRow(session.id)).status).toBe('open');

      await delivered(completed, 'applied');
      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'paid', paidMinor: 19399 });
    });

    it('goes the whole way through the provider’s payment page and its own signed delivery', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);

      const outcome = stack.payments.pay(session.id);
      expect(outcome.ok).toBe(true);
      const delivery = await stack.payments.waitForDelivery(
        (event) =>
          event.type === 'checkout.session.completed' &&
          (event.data.object as CheckoutSession).id === session.id,
        60_000,
      );

      expect(delivery.attempts.at(-1)?.status).toBe(200);
      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'paid', paidMinor: 19399 });
      expect(await storedEvent(delivery.event.id)).toMatchObject({
        outcome: 'applied',
        invoiceId: invoice.id,
      });
    });
  });

  describe('signatures', () => {
    it('refuses an event signed with another secret, a body changed after signing, an old signature or none (400), storing nothing', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      const genuine = signed('checkout.session.completed', paid(session));
      const forged = signed('checkout.session.completed', paid(session), {
        secret: 'whsec_notTheAppsSecret0000',
      });
      const tampered = genuine.raw.replace('"amount_total":19399', '"amount_total":1');
      // The SDK's default tolerance is 300 s (docs.stripe.com/webhooks#replay-attacks, from memory).
      const stale = signed('checkout.session.completed', paid(session), {
        signedAt: new Date(Date.now() - 10 * 60_000),
      });

      const answers = [
        await deliver(forged.raw, forged.header),
        await deliver(tampered, genuine.header),
        await deliver(stale.raw, stale.header),
        await deliver(genuine.raw),
        await deliver(genuine.raw, 'not a signature'),
      ];

      expect(tampered).not.toBe(genuine.raw);
      expect(answers.map((res) => [res.status, (res.body as ErrorBody).error.code])).toEqual(
        answers.map(() => [400, 'invalid_signature']),
      );
      for (const id of [genuine.event.id, forged.event.id, stale.event.id])
        expect(await storedEvent(id)).toBeUndefined();
      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'issued', paidMinor: 0 });
      expect(await paymentsOf(invoice.id)).toEqual([]);
    });
  });

  describe('duplicates, replays and order', () => {
    it('answers a replayed event as a duplicate: still one payment and one receipt', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      const completed = signed('checkout.session.completed', paid(session));
      await delivered(completed, 'applied');

      await delivered(completed, 'duplicate');
      await delivered(
        {
          raw: completed.raw,
          header: sdk.webhooks.generateTestHeaderString({
            payload: completed.raw,
            secret: testPaymentKeys.STRIPE_WEBHOOK_SECRET,
          }),
        },
        'duplicate',
      );

      expect(await paymentsOf(invoice.id)).toHaveLength(1);
      expect(await receiptEvents(invoice.id)).toHaveLength(1);
      expect(await receiptDeliveries(invoice.id)).toHaveLength(1);
      expect(receiptMails(invoice)).toHaveLength(1);
      expect(await storedEvent(completed.event.id)).toMatchObject({ outcome: 'applied' });
    });

    it('records a second event for the same session (a new id) as already recorded: no second payment or receipt', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      const paidSession = paid(session);
      await delivered(signed('checkout.session.completed', paidSession), 'applied');

      const second = signed('checkout.session.completed', paidSession);
      await delivered(second, 'already-recorded');

      expect(await paymentsOf(invoice.id)).toHaveLength(1);
      expect(await receiptEvents(invoice.id)).toHaveLength(1);
      expect(receiptMails(invoice)).toHaveLength(1);
      expect(await storedEvent(second.event.id)).toMatchObject({
        outcome: 'already-recorded',
        invoiceId: invoice.id,
      });
    });

    it('still records the payment when the session’s expiry (made later) arrives before its completion', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      const completedAt = new Date(Date.now() - 60_000);
      const completed = signed('checkout.session.completed', paid(session), { created: completedAt });
      const expired = signed(
        'checkout.session.expired',
        { ...session, status: 'expired', url: null },
        { created: new Date(completedAt.getTime() + 30_000) },
      );

      await delivered(expired, 'applied');
      expect((await sessionRow(session.id)).status).toBe('expired');
      expect((await invoiceRow(invoice.id)).status).toBe('issued');

      await delivered(completed, 'applied');
      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'paid', paidMinor: 19399 });
      expect((await sessionRow(session.id)).status).toBe('complete');
      expect(await paymentsOf(invoice.id)).toHaveLength(1);
    });

    it('ignores an expiry that arrives after the payment: the invoice stays paid', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      await delivered(signed('checkout.session.completed', paid(session)), 'applied');

      await delivered(
        signed('checkout.session.expired', { ...session, status: 'expired', url: null }),
        'ignored',
      );

      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'paid', paidMinor: 19399 });
      expect((await sessionRow(session.id)).status).toBe('complete');
    });

    it('waits for a delayed payment method: completed unpaid changes nothing, async_payment_succeeded pays', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);

      await delivered(
        signed('checkout.session.completed', { ...session, status: 'complete', payment_status: 'unpaid' }),
        'ignored',
      );
      expect((await invoiceRow(invoice.id)).status).toBe('issued');

      await delivered(signed('checkout.session.async_payment_succeeded', paid(session)), 'applied');
      expect(await invoiceRow(invoice.id)).toMatchObject({ status: 'paid', paidMinor: 19399 });
    });
  });

  describe('events that change nothing, or less than they would', () => {
    it('answers an event for a session it never made with 200 unknown-session, and changes nothing', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      const stranger = { ...paid(session), id: newId('cs_test_'), client_reference_id: invoice.id };
      const counts = () =>
        stack.database.pool.query(
          `select (select count(*) from payments) as payments, (select count(*) from invoice_events) as events,
             (select md5(string_agg(i::text, '|' order by i.id)) from invoices i) as invoices,
             (select md5(string_agg(s::text, '|' order by s.id)) from checkout_sessions s) as sessions`,
        );
      const before = (await counts()).rows;

      const event = signed('checkout.session.completed', stranger);
      await delivered(event, 'unknown-session');

      expect((await counts()).rows).toEqual(before);
      expect(await storedEvent(event.event.id)).toMatchObject({
        outcome: 'unknown-session',
        invoiceId: null,
      });
    });

    it('ignores events of other types', async () => {
      const event = signed('payment_intent.succeeded', {
        id: newId('pi_test_'),
        object: 'payment_intent',
        amount: 100,
      });

      await delivered(event, 'ignored');

      expect(await storedEvent(event.event.id)).toMatchObject({
        outcome: 'ignored',
        checkoutSessionId: null,
      });
    });

    it('records a card payment for an invoice already paid by bank transfer as paid-after-settled, without a second receipt', async () => {
      const invoice = await issuedInvoice();
      const session = await checkout(invoice);
      await ok(
        admin.post(`/api/invoices/${invoice.id}/payments`, {
          method: 'bank-transfer',
          amount: '193.99',
          receivedOn: today(),
          reference: 'BACS 7731',
        }),
      );
      expect(receiptMails(invoice)).toHaveLength(1);

      await delivered(signed('checkout.session.completed', paid(session)), 'paid-after-settled');

      const detail = await ok<InvoiceDetail>(admin.get(`/api/invoices/${invoice.id}`));
      expect(detail).toMatchObject({ status: 'paid', paidMinor: 2 * 19399, balanceMinor: -19399 });
      expect(detail.payments.map((p) => p.method).sort()).toEqual(['bank-transfer', 'card-online']);
      expect(await receiptEvents(invoice.id)).toHaveLength(1);
      expect(receiptMails(invoice)).toHaveLength(1);
    });
  });

  it('answers 409 payments_off where online payment is not configured', async () => {
    const bare = await createTestApp();
    try {
      const res = await request(bare.app)
        .post('/api/payments/webhook')
        .set('Content-Type', 'application/json')
        .set('Stripe-Signature', 't=1,v1=00')
        .send('{}');

      expect(res.status).toBe(409);
      expect((res.body as ErrorBody).error.code).toBe('payments_off');
    } finally {
      await bare.close();
    }
  });
});
