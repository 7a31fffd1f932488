import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  startPaymentProvider,
  type CheckoutSession,
  type PaymentProviderOptions,
  type RunningPaymentProvider,
} from '../../../api/dev/payment-provider';
import { withDemoSecrets } from '../../../api/dev/demo-secrets';
import { startStandIns } from '../../../api/dev/stand-ins';
import { parseEnv } from '../../../api/env';
import { createPaymentProvider } from '../../../api/lib/payments';
import { createTestClock, minutes } from '../../helpers/clock';
import { freePort } from '../../helpers/free-port';

const keys = {
  STRIPE_SECRET_KEY: 'sk_test_standInSuite5e0c2b7a91d4',
  STRIPE_WEBHOOK_SECRET: 'whsec_standInSuite3a8f1e6d2c90',
};

interface ReceivedWebhook {
  raw: string;
  signature: string;
  contentType: string;
}

/** The app's side of the webhook, reduced to what a test needs: it keeps every request and answers as told. */
async function startReceiver() {
  const received: ReceivedWebhook[] = [];
  // Refusals are planned per session, so a late delivery from an earlier test never takes one.
  const planned: { status: number; sessionId: string }[] = [];
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      received.push({
        raw: Buffer.concat(chunks).toString('utf8'),
        signature: String(req.headers['stripe-signature'] ?? ''),
        contentType: String(req.headers['content-type'] ?? ''),
      });
      const raw = received.at(-1)!.raw;
      const index = planned.findIndex((plan) => raw.includes(plan.sessionId));
      const status = index === -1 ? 200 : planned.splice(index, 1)[0]!.status;
      res.writeHead(status, { 'Content-Type': 'text/plain' }).end(status < 300 ? 'received' : 'refused');
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/webhook`,
    received,
    /** The next `times` events about the session get `status`. */
    refuseNext(sessionId: string, status: number, times = 1) {
      for (let i = 0; i < times; i += 1) planned.push({ status, sessionId });
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/** Polls until `check` returns a value (not undefined/false), or fails after `timeoutMs`. */
async function until<T>(check: () => T | undefined | false, what: string, timeoutMs = 30_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = check();
    if (value !== undefined && value !== false) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
}

function sdkFor(provider: RunningPaymentProvider, secretKey = keys.STRIPE_SECRET_KEY): Stripe {
  const env = parseEnv({
    NODE_ENV: 'test',
    // Only the payment settings matter here; the app's own secrets just have to parse.
    SESSION_SECRET: 'payment-suite-session-secret-7c41d09e',
    OIDC_CLIENT_SECRET: 'payment-suite-client-2b9e',
    ...keys,
    STRIPE_SECRET_KEY: secretKey,
    STRIPE_API_URL: provider.url,
  });
  return createPaymentProvider(env)!.stripe;
}

const invoiceCheckout = (overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}) =>
  ({
    mode: 'payment',
    line_items: [
      {
        price_data: {
          currency: 'gbp',
          unit_amount: 4500,
          product_data: { name: 'Routine service, 300 l reef' },
        },
        quantity: 1,
      },
      {
        price_data: { currency: 'gbp', unit_amount: 1250, product_data: { name: 'Carbon media, 500 ml' } },
        quantity: 2,
      },
    ],
    success_url: 'http://localhost:4999/invoices/inv-7/paid?session={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://localhost:4999/invoices/inv-7',
    client_reference_id: 'inv-7',
    customer_email: 'owner@harbourview-test.test',
    metadata: { invoiceId: 'inv-7', companyId: 'co-3' },
    payment_intent_data: { metadata: { invoiceId: 'inv-7' } },
    ...overrides,
  }) satisfies Stripe.Checkout.SessionCreateParams;

const cardForm = (number: string, overrides: Record<string, string> = {}) =>
  new URLSearchParams({
    number,
    expiry: '12/40',
    cvc: '123',
    name: 'Mara Lindqvist',
    ...overrides,
  }).toString();

function postPage(provider: RunningPaymentProvider, sessionId: string, body: string) {
  return fetch(`${provider.url}/pay/${sessionId}`, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body,
    redirect: 'manual',
  });
}

const eventsFor = (provider: RunningPaymentProvider, sessionId: string) =>
  provider.events().filter((delivery) => (delivery.event.data.object as { id?: string }).id === sessionId);

describe('payment provider stand-in', () => {
  let receiver: Awaited<ReturnType<typeof startReceiver>>;
  let provider: RunningPaymentProvider;
  let stripe: Stripe;

  beforeAll(async () => {
    receiver = await startReceiver();
    provider = await startPaymentProvider({
      port: 0,
      secretKey: keys.STRIPE_SECRET_KEY,
      webhookSecret: keys.STRIPE_WEBHOOK_SECRET,
      webhookUrl: receiver.url,
      retryDelaysMs: [50, 100, 200],
    });
    stripe = sdkFor(provider);
  });

  afterAll(async () => {
    await provider.close();
    await receiver.close();
  });

  describe('checkout sessions API, through the official SDK', () => {
    it('creates a session from the SDK form body and retrieves it', async () => {
      const created = await stripe.checkout.sessions.create(invoiceCheckout());

      expect(created).toMatchObject({
        object: 'checkout.session',
        status: 'open',
        payment_status: 'unpaid',
        mode: 'payment',
        amount_subtotal: 7000,
        amount_total: 7000,
        currency: 'gbp',
        client_reference_id: 'inv-7',
        customer_email: 'owner@harbourview-test.test',
        customer_details: null,
        metadata: { invoiceId: 'inv-7', companyId: 'co-3' },
        success_url: 'http://localhost:4999/invoices/inv-7/paid?session={CHECKOUT_SESSION_ID}',
        cancel_url: 'http://localhost:4999/invoices/inv-7',
        livemode: false,
        payment_intent: null,
      });
      expect(created.id).toMatch(/^cs_test_[A-Za-z0-9]+$/);
      expect(created.url).toBe(`${provider.url}/pay/${created.id}`);
      expect(created.expires_at - created.created).toBe(24 * 60 * 60);
      expect(provider.lineItems(created.id).map((item) => [item.name, item.quantity, item.amount])).toEqual([
        ['Routine service, 300 l reef', 1, 4500],
        ['Carbon media, 500 ml', 2, 2500],
      ]);

      const retrieved = await stripe.checkout.sessions.retrieve(created.id);
      const { lastResponse: _created, ...createdFields } = created;
      const { lastResponse: _retrieved, ...retrievedFields } = retrieved;
      expect(retrievedFields).toEqual(createdFields);
    });

    it('replays a request sent again with the same Idempotency-Key', async () => {
      const before = provider.sessions().length;
      const first = await stripe.checkout.sessions.create(invoiceCheckout(), {
        idempotencyKey: 'invoice-7-try-1',
      });
      const again = await stripe.checkout.sessions.create(invoiceCheckout(), {
        idempotencyKey: 'invoice-7-try-1',
      });

      expect(again.id).toBe(first.id);
      expect(again.lastResponse.headers['idempotent-replayed']).toBe('true');
      expect(provider.sessions().length).toBe(before + 1);
    });

    it('refuses an Idempotency-Key used again with other parameters', async () => {
      await stripe.checkout.sessions.create(invoiceCheckout(), { idempotencyKey: 'invoice-8-try-1' });

      const reuse = stripe.checkout.sessions.create(invoiceCheckout({ client_reference_id: 'inv-8b' }), {
        idempotencyKey: 'invoice-8-try-1',
      });

      await expect(reuse).rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
      await expect(reuse).rejects.toMatchObject({ statusCode: 400, rawType: 'idempotency_error' });
    });

    it('refuses a wrong API key with 401, which the SDK raises as an authentication error', async () => {
      const stranger = sdkFor(provider, 'sk_test_notTheStandInsKey000');

      const attempt = stranger.checkout.sessions.create(invoiceCheckout());

      await expect(attempt).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
      await expect(attempt).rejects.toMatchObject({ statusCode: 401 });
    });

    it('answers a request without a key with the error object shape', async () => {
      const response = await fetch(`${provider.url}/v1/checkout/sessions/cs_test_anything`);
      const body = (await response.json()) as { error: { type: string; message: string } };

      expect(response.status).toBe(401);
      expect(body.error.type).toBe('invalid_request_error');
      expect(body.error.message).toMatch(/API key/);
    });

    it.each([
      ['a missing success_url', invoiceCheckout({ success_url: undefined }), 'success_url'],
      [
        'an unknown currency',
        invoiceCheckout({
          line_items: [
            {
              price_data: { currency: 'xyz', unit_amount: 100, product_data: { name: 'Filter floss' } },
              quantity: 1,
            },
          ],
        }),
        'line_items[0][price_data][currency]',
      ],
      [
        'an amount with decimals',
        invoiceCheckout({
          line_items: [
            {
              price_data: { currency: 'gbp', unit_amount: 12.5, product_data: { name: 'Filter floss' } },
              quantity: 1,
            },
          ],
        }),
        'line_items[0][price_data][unit_amount]',
      ],
      [
        'a negative amount',
        invoiceCheckout({
          line_items: [
            {
              price_data: { currency: 'gbp', unit_amount: -500, product_data: { name: 'Refund' } },
              quantity: 1,
            },
          ],
        }),
        'line_items[0][price_data][unit_amount]',
      ],
      [
        'an expiry less than 30 minutes away',
        invoiceCheckout({ expires_at: Math.floor(Date.now() / 1000) + 600 }),
        'expires_at',
      ],
    ])('refuses %s with 400 naming the parameter', async (_what, params, param) => {
      const attempt = stripe.checkout.sessions.create(params as Stripe.Checkout.SessionCreateParams);

      await expect(attempt).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
      await expect(attempt).rejects.toMatchObject({
        statusCode: 400,
        rawType: 'invalid_request_error',
        param,
      });
    });

    it('answers 404 resource_missing for a session it does not know', async () => {
      const attempt = stripe.checkout.sessions.retrieve('cs_test_noSuchSession');

      await expect(attempt).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
      await expect(attempt).rejects.toMatchObject({ statusCode: 404, code: 'resource_missing' });
    });
  });

  describe('hosted payment page', () => {
    it('shows the amount, the items and a labelled card form', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());

      const response = await fetch(session.url!);
      const html = await response.text();

      expect(response.status).toBe(200);
      expect(html).toContain('<html lang="en">');
      expect(html.match(/<h1[ >]/g)).toHaveLength(1);
      expect(html).toContain('Pay £70.00');
      expect(html).toContain('Routine service, 300 l reef');
      expect(html).toContain('Carbon media, 500 ml');
      for (const id of ['card-number', 'card-expiry', 'card-cvc', 'card-name']) {
        expect(html).toContain(`<label for="${id}">`);
        expect(html).toMatch(new RegExp(`<input id="${id}"[^>]*aria-describedby=`));
      }
      expect(html).toContain('href="http://localhost:4999/invoices/inv-7"');
      expect(html).toMatch(/no real card is charged/i);
    });

    it('takes 4242 4242 4242 4242: redirects to success_url, completes the session and sends a signed event', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());

      const response = await postPage(provider, session.id, cardForm('4242 4242 4242 4242'));

      expect(response.status).toBe(303);
      expect(response.headers.get('location')).toBe(
        `http://localhost:4999/invoices/inv-7/paid?session=${session.id}`,
      );
      const paid = await stripe.checkout.sessions.retrieve(session.id);
      expect(paid).toMatchObject({
        status: 'complete',
        payment_status: 'paid',
        customer_details: { email: 'owner@harbourview-test.test', name: 'Mara Lindqvist' },
        url: null,
      });
      expect(paid.payment_intent).toMatch(/^pi_/);

      const webhook = await until(
        () => receiver.received.find((request) => request.raw.includes(session.id)),
        'the completed event at the receiver',
      );
      const event = stripe.webhooks.constructEvent(
        webhook.raw,
        webhook.signature,
        keys.STRIPE_WEBHOOK_SECRET,
      );
      expect(webhook.contentType).toMatch(/^application\/json/);
      expect(event).toMatchObject({ object: 'event', type: 'checkout.session.completed', livemode: false });
      expect(event.id).toMatch(/^evt_/);
      expect(event.data.object).toMatchObject({
        id: session.id,
        status: 'complete',
        payment_status: 'paid',
        metadata: { invoiceId: 'inv-7', companyId: 'co-3' },
        payment_intent: paid.payment_intent,
      });
    });

    it('does not take a second payment for a complete session', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());
      expect(provider.pay(session.id).ok).toBe(true);

      const again = await postPage(provider, session.id, cardForm('4242424242424242'));
      const page = await (await fetch(session.url!)).text();

      expect(again.status).toBe(409);
      expect(await again.text()).toContain('Already paid');
      expect(page).toContain('Already paid');
      expect(eventsFor(provider, session.id).map((delivery) => delivery.event.type)).toEqual([
        'checkout.session.completed',
      ]);
    });

    it.each([
      ['4000 0000 0000 0002', 'declined'],
      ['4000 0000 0000 9995', 'not enough funds'],
      ['4000 0000 0000 0069', 'expired'],
      ['4000 0000 0000 0127', 'security code'],
    ])('declines test card %s: says why, keeps the session open, sends no event', async (number, reason) => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());

      const response = await postPage(provider, session.id, cardForm(number));
      const html = await response.text();

      expect(response.status).toBe(402);
      expect(/<div class="problem"[^>]*role="alert"[^>]*><p>([^<]*)<\/p>/.exec(html)?.[1]).toContain(reason);
      expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
      expect(eventsFor(provider, session.id)).toEqual([]);
    });

    it('asks for a test card for any other number, tying the error to the field', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());

      const response = await postPage(provider, session.id, cardForm('5105 1051 0510 5100'));
      const html = await response.text();

      expect(response.status).toBe(400);
      expect(html).toMatch(
        /<input id="card-number"[^>]*aria-describedby="card-number-hint card-number-error" aria-invalid="true"/,
      );
      expect(html).toMatch(/<p class="field-error" id="card-number-error">[^<]*test cards only/);
      expect(provider.session(session.id)!.status).toBe('open');
    });

    it('refuses an expiry date in the past', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());

      const response = await postPage(
        provider,
        session.id,
        cardForm('4242424242424242', { expiry: '01/20' }),
      );
      const html = await response.text();

      expect(response.status).toBe(400);
      expect(html).toMatch(/id="card-expiry-error">This expiry date is in the past/);
      expect(provider.session(session.id)!.status).toBe('open');
    });

    it('asks for an email address when the session has none', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout({ customer_email: undefined }));
      expect(await (await fetch(session.url!)).text()).toContain('<label for="pay-email">');

      const missing = await postPage(provider, session.id, cardForm('4242424242424242'));
      const paid = await postPage(
        provider,
        session.id,
        cardForm('4242424242424242', { email: 'payer@reef-test.test' }),
      );

      expect(missing.status).toBe(400);
      expect(paid.status).toBe(303);
      expect(provider.session(session.id)!.customer_details?.email).toBe('payer@reef-test.test');
    });
  });

  describe('webhook delivery', () => {
    it('retries an endpoint that answers 500: delivered on the third attempt', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());
      receiver.refuseNext(session.id, 500, 2);

      expect(provider.pay(session.id).ok).toBe(true);
      const delivery = await provider.waitForDelivery(
        (event) => (event.data.object as CheckoutSession).id === session.id,
        60_000,
      );

      expect(delivery.status).toBe('delivered');
      expect(delivery.attempts.map((attempt) => attempt.status)).toEqual([500, 500, 200]);
      const sent = receiver.received.filter((request) => request.raw.includes(session.id));
      expect(sent).toHaveLength(3);
      for (const request of sent) {
        expect(
          stripe.webhooks.constructEvent(request.raw, request.signature, keys.STRIPE_WEBHOOK_SECRET).id,
        ).toBe(delivery.event.id);
      }
    });

    it('marks an event failed once its retries are used up, and redelivers it on request', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());
      receiver.refuseNext(session.id, 503, 4);

      provider.pay(session.id);
      const failed = await until(
        () => eventsFor(provider, session.id).find((delivery) => delivery.status === 'failed'),
        'the event to fail',
      );
      const attempt = await provider.redeliver(failed.event.id);

      expect(failed.attempts.map((try_) => try_.status)).toEqual([503, 503, 503, 503]);
      expect(attempt).toMatchObject({ kind: 'manual', status: 200 });
      expect(eventsFor(provider, session.id)[0]!.status).toBe('delivered');
    });

    it('expires a session through the API and sends checkout.session.expired', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout(), {
        idempotencyKey: 'expire-test-create',
      });

      const expired = await stripe.checkout.sessions.expire(
        session.id,
        {},
        { idempotencyKey: 'expire-test-1' },
      );
      const delivery = await provider.waitForDelivery(
        (event) =>
          event.type === 'checkout.session.expired' &&
          (event.data.object as CheckoutSession).id === session.id,
        60_000,
      );

      expect(expired).toMatchObject({ status: 'expired', payment_status: 'unpaid', url: null });
      expect(delivery.event.request).toEqual({
        id: expect.stringMatching(/^req_/),
        idempotency_key: 'expire-test-1',
      });
      await expect(stripe.checkout.sessions.expire(session.id)).rejects.toMatchObject({ statusCode: 400 });
      const page = await fetch(`${provider.url}/pay/${session.id}`);
      expect(page.status).toBe(410);
      expect(provider.pay(session.id)).toMatchObject({ ok: false, code: 'session_closed' });
    });

    it('sends a duplicate of a delivered event, and any event a test asks for, signed', async () => {
      const session = await stripe.checkout.sessions.create(invoiceCheckout());
      provider.pay(session.id);
      const completed = await provider.waitForDelivery(
        (event) => (event.data.object as CheckoutSession).id === session.id,
        60_000,
      );

      await provider.redeliver(completed.event.id);
      const stale = provider.sendEvent(
        'checkout.session.expired',
        { ...(completed.event.data.object as CheckoutSession), status: 'expired' },
        { created: new Date(Date.now() - minutes(5)) },
      );
      await provider.waitForDelivery((event) => event.id === stale.id, 60_000);

      const verified = receiver.received
        .filter((request) => request.raw.includes(session.id))
        .map((request) =>
          stripe.webhooks.constructEvent(request.raw, request.signature, keys.STRIPE_WEBHOOK_SECRET),
        );
      expect(verified.map((event) => [event.id, event.type])).toEqual([
        [completed.event.id, 'checkout.session.completed'],
        [completed.event.id, 'checkout.session.completed'],
        [stale.id, 'checkout.session.expired'],
      ]);
      expect(verified[2]!.created).toBeLessThan(verified[0]!.created);
    });

    it('offers the event log over HTTP and keeps its controls behind the secret key', async () => {
      const log = await fetch(`${provider.url}/_stand-in/events`);
      const anonymous = await fetch(`${provider.url}/_stand-in/events`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ type: 'checkout.session.completed', object: {} }),
      });
      const overview = await fetch(`${provider.url}/`);

      expect(log.status).toBe(200);
      expect(((await log.json()) as unknown[]).length).toBe(provider.events().length);
      expect(anonymous.status).toBe(401);
      expect(overview.status).toBe(200);
      expect(await overview.text()).toContain('<h1>Payment stand-in</h1>');
    });
  });

  describe("on the provider's clock", () => {
    it('expires a session once its expires_at has passed, and the page no longer takes a payment', async () => {
      const clock = createTestClock();
      const clocked = await startPaymentProvider({
        port: 0,
        secretKey: keys.STRIPE_SECRET_KEY,
        webhookSecret: keys.STRIPE_WEBHOOK_SECRET,
        webhookUrl: receiver.url,
        clock: clock.now,
      });
      try {
        const sdk = sdkFor(clocked);
        const session = await sdk.checkout.sessions.create(
          invoiceCheckout({ expires_at: Math.floor(clock.now().getTime() / 1000) + 31 * 60 }),
        );

        clock.advance(minutes(32));
        const page = await fetch(session.url!);
        const paying = await postPage(clocked, session.id, cardForm('4242424242424242'));

        expect(page.status).toBe(410);
        expect(await page.text()).toContain('expired');
        expect(paying.status).toBe(410);
        expect((await sdk.checkout.sessions.retrieve(session.id)).status).toBe('expired');
        expect(clocked.events().map((delivery) => delivery.event.type)).toEqual(['checkout.session.expired']);
      } finally {
        await clocked.close();
      }
    });
  });

  describe('with a data file', () => {
    const dataDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-payments-'));
    afterAll(() => rmSync(dataDir, { recursive: true, force: true }));

    it('keeps sessions, idempotency keys and undelivered events across a restart', async () => {
      const options: PaymentProviderOptions = {
        port: 0,
        secretKey: keys.STRIPE_SECRET_KEY,
        webhookSecret: keys.STRIPE_WEBHOOK_SECRET,
        webhookUrl: receiver.url,
        dataFile: path.join(dataDir, 'payments', 'state.json'),
        // The first run's retry would come long after the test; the second run tries at start.
        retryDelaysMs: [10 * 60_000],
      };
      const first = await startPaymentProvider(options);
      const paidSession = await sdkFor(first).checkout.sessions.create(invoiceCheckout());
      const openSession = await sdkFor(first).checkout.sessions.create(invoiceCheckout(), {
        idempotencyKey: 'restart-create-1',
      });
      receiver.refuseNext(paidSession.id, 503);
      first.pay(paidSession.id);
      await until(() => first.events()[0]?.attempts.length === 1, 'the first, refused delivery');
      await first.close();

      const second = await startPaymentProvider({ ...options, retryDelaysMs: [50] });
      try {
        const delivery = await second.waitForDelivery(
          (event) => (event.data.object as CheckoutSession).id === paidSession.id,
          60_000,
        );
        const replayed = await sdkFor(second).checkout.sessions.create(invoiceCheckout(), {
          idempotencyKey: 'restart-create-1',
        });

        expect(delivery.attempts.map((attempt) => attempt.status)).toEqual([503, 200]);
        expect(second.session(paidSession.id)).toMatchObject({ status: 'complete', payment_status: 'paid' });
        expect(replayed.id).toBe(openSession.id);
        expect(second.session(openSession.id)!.url).toBe(`${second.url}/pay/${openSession.id}`);
        expect((await fetch(`${second.url}/pay/${openSession.id}`)).status).toBe(200);
      } finally {
        await second.close();
      }
    });
  });

  describe('in the demo', () => {
    const dataDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-payments-demo-'));
    afterAll(() => rmSync(dataDir, { recursive: true, force: true }));

    it('adds payment keys to a secrets file made before online payment, keeping the other secrets', async () => {
      const file = path.join(dataDir, 'secrets', 'secrets.json');
      mkdirSync(path.dirname(file), { recursive: true });
      const earlier = { SESSION_SECRET: 's'.repeat(43), OIDC_CLIENT_SECRET: 'c'.repeat(43) };
      writeFileSync(file, JSON.stringify(earlier), { mode: 0o600 });

      const env = parseEnv(await withDemoSecrets({ DATA_DIR: dataDir }));
      const again = parseEnv(await withDemoSecrets({ DATA_DIR: dataDir }));

      expect(env.SESSION_SECRET).toBe(earlier.SESSION_SECRET);
      expect(env.OIDC_CLIENT_SECRET).toBe(earlier.OIDC_CLIENT_SECRET);
      expect(env.STRIPE_SECRET_KEY).toMatch(/^sk_test_\w{32,}$/);
      expect(env.STRIPE_WEBHOOK_SECRET).toMatch(/^whsec_/);
      expect(again.STRIPE_SECRET_KEY).toBe(env.STRIPE_SECRET_KEY);
      expect(again.STRIPE_WEBHOOK_SECRET).toBe(env.STRIPE_WEBHOOK_SECRET);
      expect(JSON.parse(readFileSync(file, 'utf8'))).toMatchObject({
        ...earlier,
        STRIPE_SECRET_KEY: env.STRIPE_SECRET_KEY,
      });
      expect(statSync(file).mode & 0o777).toBe(0o600);
    });

    it('starts with the other stand-ins where STRIPE_API_URL points, keeping its state under DATA_DIR', async () => {
      const [idpPort, smtpPort, s3Port, paymentsPort] = await Promise.all([1, 2, 3, 4].map(() => freePort()));
      const env = parseEnv(
        await withDemoSecrets({
          NODE_ENV: 'test',
          DATA_DIR: dataDir,
          OIDC_ISSUER: `http://127.0.0.1:${idpPort}`,
          SMTP_PORT: String(smtpPort),
          S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
          STRIPE_API_URL: `http://127.0.0.1:${paymentsPort}`,
        }),
      );
      const standIns = await startStandIns(env, { mailboxPort: 0 });
      try {
        const session = await createPaymentProvider(env)!.stripe.checkout.sessions.create(invoiceCheckout());

        expect(standIns.payments?.url).toBe(`http://127.0.0.1:${paymentsPort}`);
        expect(session.url).toBe(`http://127.0.0.1:${paymentsPort}/pay/${session.id}`);
        const stateFile = path.join(dataDir, 'payments', 'state.json');
        await until(
          () => existsSync(stateFile) && readFileSync(stateFile, 'utf8').includes(session.id),
          'the state file',
        );
      } finally {
        await standIns.close();
      }
    });
  });
});
