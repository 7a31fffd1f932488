import { randomBytes, timingSafeEqual } from 'node:crypto';
import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { dirname } from 'node:path';
import Stripe from 'stripe';
import { currencies, formatMoney, isCurrency } from '@shared/billing/money';
import { systemClock, type Clock } from '../lib/clock';
import {
  checkoutPage,
  closedPage,
  overviewPage,
  pageHeaders,
  type CardField,
  type CheckoutForm,
  type CheckoutView,
} from './payment-provider-views';

/**
 * Stand-in for the payment provider on loopback: the part of its public API the official SDK calls
 * for hosted checkout (create, retrieve and expire a checkout session; retrieve an event), a hosted
 * payment page of our own that takes the provider's published test cards, and signed webhook
 * events with retries. The app reaches it through the SDK's own host/port/protocol settings
 * (api/lib/payments.ts), so the same code runs against the real provider.
 *
 * Shapes follow the provider's public API reference (docs.stripe.com/api): the checkout session
 * object, the event object, errors as `{ error: { type, code?, message, param? } }`, idempotent
 * requests (docs.stripe.com/api/idempotent_requests) and the `Stripe-Signature` scheme
 * (docs.stripe.com/webhooks#verify-manually). Only what Brinewatch uses is modelled: mode=payment
 * with price_data line items, one webhook endpoint, no customers, prices, taxes or discounts.
 *
 * Control for tests and the demo: the methods of RunningPaymentProvider in-process; over HTTP,
 * `GET /` (an overview page), `GET /_stand-in/sessions`, `GET /_stand-in/events` (JSON), and with
 * the secret key as Bearer token `POST /_stand-in/events` (JSON `{type, object}`: send an event)
 * and `POST /_stand-in/events/:id/redeliver`.
 */

export interface PaymentProviderOptions {
  /** Loopback only; 127.0.0.1 by default. */
  host?: string;
  /** 0 picks a free port. */
  port: number;
  /** The API key callers must send (`Authorization: Bearer sk_test_…`). */
  secretKey: string;
  /** Signs webhook events (`whsec_…`). */
  webhookSecret: string;
  /** Where events are POSTed, e.g. `${appOrigin}/api/payments/webhook`. */
  webhookUrl: string;
  /**
   * Waits after the 1st, 2nd, … failed delivery of an event before the next try; once used up the
   * event is marked failed (redeliver() still works). Default 1 s, 5 s, 30 s, 2 min, 10 min.
   */
  retryDelaysMs?: readonly number[];
  /** Sessions, events still to deliver and idempotency keys are kept here (JSON) and read at start. */
  dataFile?: string;
  /**
   * The provider's time: sessions' `created` and `expires_at`, events' `created` and the signature's
   * `t`. Tests pass the app's test clock so both agree. Retry waits are real time.
   */
  clock?: Clock;
  /** How long a webhook delivery may take before it counts as failed; 10 s by default. */
  webhookTimeoutMs?: number;
}

export interface LineItemSummary {
  name: string;
  description: string | null;
  quantity: number;
  unitAmount: number;
  /** unitAmount × quantity, in the currency's minor unit. */
  amount: number;
}

/** The provider's `checkout.session` object, as far as the stand-in fills it in. */
export interface CheckoutSession {
  id: string;
  object: 'checkout.session';
  amount_subtotal: number;
  amount_total: number;
  cancel_url: string | null;
  client_reference_id: string | null;
  /** Seconds since the epoch. */
  created: number;
  /** Lowercase ISO 4217. */
  currency: string;
  customer: null;
  customer_details: { email: string | null; name: string | null; address: null; phone: null } | null;
  customer_email: string | null;
  /** Seconds since the epoch. */
  expires_at: number;
  livemode: false;
  metadata: Record<string, string>;
  mode: 'payment';
  /** `pi_…` once paid. */
  payment_intent: string | null;
  payment_method_types: ['card'];
  payment_status: 'paid' | 'unpaid';
  status: 'open' | 'complete' | 'expired';
  success_url: string;
  total_details: { amount_discount: number; amount_shipping: number; amount_tax: number };
  ui_mode: 'hosted';
  /** The hosted payment page while the session is open; null after. */
  url: string | null;
}

/** The provider's `event` object, as POSTed to the webhook. */
export interface ProviderEvent {
  id: string;
  object: 'event';
  api_version: string;
  /** Seconds since the epoch. */
  created: number;
  data: { object: unknown };
  livemode: false;
  pending_webhooks: number;
  /** The API request that caused the event; ids are null for a payment made on the page. */
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}

export interface DeliveryAttempt {
  /** ISO 8601, real time. */
  at: string;
  /** `scheduled`: the first try or a retry; `manual`: redeliver(). */
  kind: 'scheduled' | 'manual';
  /** The endpoint's HTTP status; null when it could not be reached or timed out. */
  status: number | null;
  /** Why it failed without a status (connection refused, timeout). */
  error: string | null;
  /** The start of the endpoint's answer, for reading why it refused an event. */
  responseText: string;
  durationMs: number;
}

export interface EventDelivery {
  event: ProviderEvent;
  /** `pending`: a try is scheduled; `delivered`: some try got a 2xx; `failed`: retries used up. */
  status: 'pending' | 'delivered' | 'failed';
  attempts: DeliveryAttempt[];
  /** ISO 8601 of the next scheduled try, while pending. */
  nextAttemptAt: string | null;
}

/** Card details as typed on the payment page. */
export interface TestCardDetails {
  number: string;
  /** MM/YY. */
  expiry: string;
  cvc: string;
  name: string;
  /** Needed when the session has no customer_email. */
  email?: string;
}

export type PaymentOutcome =
  | { ok: true; session: CheckoutSession; redirectTo: string }
  | {
      ok: false;
      /** `invalid_details` for a form that could not be read; else the provider's error code. */
      code: 'invalid_details' | 'card_declined' | 'expired_card' | 'incorrect_cvc' | 'session_closed';
      declineCode: string | null;
      message: string;
      fieldErrors: Partial<Record<CardField, string>>;
    };

export interface RunningPaymentProvider {
  /** `http://127.0.0.1:PORT`: STRIPE_API_URL, and the origin of the payment pages. */
  url: string;
  port: number;
  /** Every session, oldest first (copies). */
  sessions(): CheckoutSession[];
  session(id: string): CheckoutSession | undefined;
  lineItems(sessionId: string): LineItemSummary[];
  /** Every event with its delivery attempts, oldest first (copies). */
  events(): EventDelivery[];
  /** Resolves with the first event, delivered already or later, that matches and got a 2xx. */
  waitForDelivery(predicate: (event: ProviderEvent) => boolean, timeoutMs?: number): Promise<EventDelivery>;
  /**
   * Makes and delivers (with retries) an event of any type around `object`, as the provider would:
   * for duplicate, stale or out-of-order events. `created` back-dates it.
   */
  sendEvent(type: string, object: unknown, options?: { created?: Date }): ProviderEvent;
  /** One more delivery of an event now, outside its schedule (a duplicate when already delivered). */
  redeliver(eventId: string): Promise<DeliveryAttempt>;
  /** Pays a session as the payment page does, with a test card (4242… by default). */
  pay(sessionId: string, card?: Partial<TestCardDetails>): PaymentOutcome;
  /** Expires open sessions whose expires_at has passed (also done every second and on every read). */
  expireDue(): CheckoutSession[];
  close(): Promise<void>;
}

/**
 * The provider's published test cards (docs.stripe.com/testing, "Declined payments"): any future
 * expiry, any CVC. Every other number is refused here, as a live number would be in test mode.
 */
const testCards: Readonly<
  Record<
    string,
    { outcome: string } & (
      | { declines: false }
      | {
          declines: true;
          code: 'card_declined' | 'expired_card' | 'incorrect_cvc';
          declineCode: string;
          message: string;
        }
    )
  >
> = {
  '4242424242424242': { outcome: 'Succeeds', declines: false },
  '4000000000000002': {
    outcome: 'Declined (card_declined)',
    declines: true,
    code: 'card_declined',
    declineCode: 'generic_decline',
    message: 'The card was declined. Try another card.',
  },
  '4000000000009995': {
    outcome: 'Declined: insufficient funds',
    declines: true,
    code: 'card_declined',
    declineCode: 'insufficient_funds',
    message: 'The card was declined: there are not enough funds on it. Try another card.',
  },
  '4000000000000069': {
    outcome: 'Declined: the card has expired',
    declines: true,
    code: 'expired_card',
    declineCode: 'expired_card',
    message: 'The card was declined because it has expired. Try another card.',
  },
  '4000000000000127': {
    outcome: 'Declined: wrong security code',
    declines: true,
    code: 'incorrect_cvc',
    declineCode: 'incorrect_cvc',
    message: 'The card was declined: the security code is not right. Check it and try again.',
  },
};
const testCardRows = Object.entries(testCards).map(([number, card]) => ({
  number: number.replace(/(\d{4})(?=\d)/g, '$1 '),
  outcome: card.outcome,
}));
const successCard = '4242424242424242';

const defaultRetryDelaysMs = [1_000, 5_000, 30_000, 120_000, 600_000];
const loopbackHosts = new Set(['127.0.0.1', '::1', 'localhost']);
const maxApiBodyBytes = 256 * 1024;
const maxPageBodyBytes = 16 * 1024;
// docs.stripe.com/payments/checkout/managing-limited-inventory: expires_at is 30 minutes to 24
// hours after creation, and 24 hours when not given.
const minLifetimeS = 30 * 60;
const maxLifetimeS = 24 * 60 * 60;
// docs.stripe.com/api/idempotent_requests: keys are up to 255 characters and may be pruned after 24 hours.
const maxIdempotencyKeyLength = 255;
const idempotencyKeptMs = 24 * 60 * 60 * 1000;
// docs.stripe.com/metadata: up to 50 keys, names up to 40 characters, values up to 500.
const maxMetadataKeys = 50;
const maxMetadataKeyLength = 40;
const maxMetadataValueLength = 500;
// From memory: the provider's amounts have at most eight digits (99,999,999 in the minor unit).
const maxAmount = 99_999_999;
const maxClientReferenceLength = 200;
const maxLineItems = 100;

// ---------------------------------------------------------------------------------------------
// Form bodies with bracket keys, as the SDK writes them: `line_items[0][price_data][currency]=gbp`.

type Param = string | Param[] | { [key: string]: Param };
type Params = { [key: string]: Param };

class ApiFailure extends Error {
  constructor(
    readonly status: number,
    readonly type: 'invalid_request_error' | 'idempotency_error' | 'api_error',
    message: string,
    readonly param?: string,
    readonly code?: string,
  ) {
    super(message);
  }

  body() {
    return {
      error: {
        ...(this.code && { code: this.code }),
        message: this.message,
        ...(this.param && { param: this.param }),
        type: this.type,
      },
    };
  }
}

const invalid = (message: string, param?: string, code?: string) =>
  new ApiFailure(400, 'invalid_request_error', message, param, code);

const missing = (object: string, id: string, param: string) =>
  new ApiFailure(404, 'invalid_request_error', `No such ${object}: '${id}'`, param, 'resource_missing');

function parseFormBody(text: string): Params {
  const root: Params = Object.create(null) as Params;
  for (const [rawKey, value] of new URLSearchParams(text)) {
    const match = /^([^[\]]+)((?:\[[^[\]]*\])*)$/.exec(rawKey);
    if (!match) throw invalid(`Invalid parameter name: ${rawKey}`, rawKey);
    const segments = [match[1]!, ...[...match[2]!.matchAll(/\[([^[\]]*)\]/g)].map((m) => m[1]!)];
    let container: { [key: string]: Param } = root;
    for (let i = 0; i < segments.length; i += 1) {
      let segment = segments[i]!;
      // `a[]=x` appends, as qs reads it.
      if (segment === '') segment = String(Object.keys(container).length);
      const last = i === segments.length - 1;
      const existing = container[segment];
      if (last) {
        if (existing !== undefined && typeof existing !== 'string') {
          throw invalid(`Invalid value for ${rawKey}: it is also used as a hash`, rawKey);
        }
        container[segment] = value;
      } else {
        if (typeof existing === 'string')
          throw invalid(`Invalid hash: ${segments.slice(0, i + 1).join('.')}`, rawKey);
        const next = (existing ?? Object.create(null)) as { [key: string]: Param };
        container[segment] = next;
        container = next;
      }
    }
  }
  return listsFromIndexes(root) as Params;
}

/** `{0: a, 1: b}` → `[a, b]`, recursively; other objects stay (with a null prototype). */
function listsFromIndexes(value: Param): Param {
  if (typeof value === 'string') return value;
  const entries = Object.entries(value).map(([key, inner]) => [key, listsFromIndexes(inner)] as const);
  if (entries.length > 0 && entries.every(([key]) => /^(0|[1-9]\d{0,3})$/.test(key))) {
    return entries.sort(([a], [b]) => Number(a) - Number(b)).map(([, inner]) => inner);
  }
  const object = Object.create(null) as { [key: string]: Param };
  for (const [key, inner] of entries) object[key] = inner;
  return object;
}

/** Sorted-key JSON: two requests carry the same parameters when these are equal. */
function fingerprint(value: Param): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map(fingerprint).join(',')}]`;
  return `{${Object.keys(value)
    .sort()
    .map((key) => `${JSON.stringify(key)}:${fingerprint(value[key]!)}`)
    .join(',')}}`;
}

// ---------------------------------------------------------------------------------------------
// Reading parameters

function hashParam(value: Param | undefined, name: string): Params | undefined {
  if (value === undefined) return undefined;
  if (typeof value === 'string' || Array.isArray(value))
    throw invalid(`Invalid object: ${name} must be a hash`, name);
  return value;
}

function listParam(value: Param | undefined, name: string): Param[] | undefined {
  if (value === undefined) return undefined;
  if (!Array.isArray(value)) throw invalid(`Invalid array: ${name} must be a list`, name);
  return value;
}

function stringParam(value: Param | undefined, name: string): string | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string') throw invalid(`Invalid string: ${name} must be a string`, name);
  return value;
}

function integerParam(value: Param | undefined, name: string): number | undefined {
  const text = stringParam(value, name);
  if (text === undefined) return undefined;
  if (!/^-?\d{1,15}$/.test(text)) throw invalid(`Invalid integer: ${text}`, name);
  return Number(text);
}

function refuseUnknown(params: Params, known: readonly string[], prefix: string | null) {
  for (const key of Object.keys(params)) {
    if (!known.includes(key)) {
      const name = prefix ? `${prefix}[${key}]` : key;
      throw invalid(
        `Received unknown parameter: ${name}. The local stand-in reads only ${known.join(', ')}${prefix ? ` in ${prefix}` : ''}.`,
        name,
      );
    }
  }
}

function metadataParam(value: Param | undefined, name: string): Record<string, string> {
  const hash = hashParam(value, name);
  const metadata: Record<string, string> = {};
  if (!hash) return metadata;
  const entries = Object.entries(hash);
  if (entries.length > maxMetadataKeys)
    throw invalid(`Metadata can have at most ${maxMetadataKeys} keys.`, name);
  for (const [key, inner] of entries) {
    const text = stringParam(inner, `${name}[${key}]`)!;
    if (key.length > maxMetadataKeyLength) {
      throw invalid(`Metadata keys can be at most ${maxMetadataKeyLength} characters.`, `${name}[${key}]`);
    }
    if (text.length > maxMetadataValueLength) {
      throw invalid(
        `Metadata values can be at most ${maxMetadataValueLength} characters.`,
        `${name}[${key}]`,
      );
    }
    // An empty value unsets a key (docs.stripe.com/metadata); on create it is simply left out.
    if (text !== '') metadata[key] = text;
  }
  return metadata;
}

function urlParam(value: Param | undefined, name: string, required: boolean): string | null {
  const text = stringParam(value, name);
  if (text === undefined || text === '') {
    if (required) throw invalid(`Missing required param: ${name}.`, name);
    return null;
  }
  // `{CHECKOUT_SESSION_ID}` is not a valid URL character sequence on its own; check the rest.
  const checked = text.replaceAll('{CHECKOUT_SESSION_ID}', 'cs_test_placeholder');
  if (text.length > 5000 || !URL.canParse(checked) || !/^https?:$/.test(new URL(checked).protocol)) {
    throw invalid(`Not a valid URL: ${name} must be an absolute http(s) URL.`, name, 'url_invalid');
  }
  return text;
}

const emailPattern = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

interface NewSession {
  lineItems: LineItemSummary[];
  currency: string;
  successUrl: string;
  cancelUrl: string | null;
  clientReferenceId: string | null;
  customerEmail: string | null;
  metadata: Record<string, string>;
  expiresAt: number | null;
  paymentIntentMetadata: Record<string, string>;
  paymentIntentDescription: string | null;
}

const createParams = [
  'mode',
  'line_items',
  'success_url',
  'cancel_url',
  'client_reference_id',
  'customer_email',
  'metadata',
  'expires_at',
  'payment_intent_data',
  'payment_method_types',
  'locale',
  'submit_type',
  'expand',
] as const;

function readCreateSession(params: Params): NewSession {
  refuseUnknown(params, createParams, null);
  const mode = stringParam(params.mode, 'mode');
  if (mode === undefined) throw invalid('Missing required param: mode.', 'mode');
  if (mode !== 'payment') {
    throw invalid(`Invalid mode: ${mode}. The local stand-in handles mode=payment only.`, 'mode');
  }
  const methods = listParam(params.payment_method_types, 'payment_method_types');
  if (methods && methods.some((method) => method !== 'card')) {
    throw invalid('The local stand-in takes card payments only.', 'payment_method_types');
  }
  const items = listParam(params.line_items, 'line_items');
  if (!items || items.length === 0) {
    throw invalid('line_items is required in payment mode.', 'line_items');
  }
  if (items.length > maxLineItems) throw invalid(`At most ${maxLineItems} line items.`, 'line_items');
  const lineItems: LineItemSummary[] = [];
  let currency: string | null = null;
  items.forEach((raw, index) => {
    const name = `line_items[${index}]`;
    const item = hashParam(raw, name)!;
    if (item.price !== undefined) {
      throw invalid(`${name}[price]: the local stand-in has no prices; send price_data.`, `${name}[price]`);
    }
    refuseUnknown(item, ['price_data', 'quantity'], name);
    const priceData = hashParam(item.price_data, `${name}[price_data]`);
    if (!priceData) throw invalid(`Missing required param: ${name}[price_data].`, `${name}[price_data]`);
    refuseUnknown(
      priceData,
      ['currency', 'unit_amount', 'product_data', 'tax_behavior'],
      `${name}[price_data]`,
    );
    const currencyName = `${name}[price_data][currency]`;
    const itemCurrency = stringParam(priceData.currency, currencyName)?.toLowerCase();
    if (!itemCurrency) throw invalid(`Missing required param: ${currencyName}.`, currencyName);
    if (!isCurrency(itemCurrency.toUpperCase())) {
      throw invalid(
        `Invalid currency: ${itemCurrency}. The local stand-in accepts the currencies Brinewatch bills in: ${currencies
          .map((code) => code.toLowerCase())
          .join(', ')}.`,
        currencyName,
      );
    }
    if (currency !== null && currency !== itemCurrency) {
      throw invalid('All line items must have the same currency.', currencyName);
    }
    currency = itemCurrency;
    const amountName = `${name}[price_data][unit_amount]`;
    const unitAmount = integerParam(priceData.unit_amount, amountName);
    if (unitAmount === undefined) throw invalid(`Missing required param: ${amountName}.`, amountName);
    if (unitAmount < 0) throw invalid('This value must be greater than or equal to 0.', amountName);
    if (unitAmount > maxAmount) throw invalid(`This value must be at most ${maxAmount}.`, amountName);
    const productName = `${name}[price_data][product_data]`;
    const product = hashParam(priceData.product_data, productName);
    if (!product) throw invalid(`Missing required param: ${productName}.`, productName);
    refuseUnknown(product, ['name', 'description', 'metadata'], productName);
    const productTitle = stringParam(product.name, `${productName}[name]`)?.trim();
    if (!productTitle) throw invalid(`Missing required param: ${productName}[name].`, `${productName}[name]`);
    const description = stringParam(product.description, `${productName}[description]`) || null;
    metadataParam(product.metadata, `${productName}[metadata]`);
    const quantityName = `${name}[quantity]`;
    const quantity = integerParam(item.quantity, quantityName);
    if (quantity === undefined) throw invalid(`Missing required param: ${quantityName}.`, quantityName);
    if (quantity < 1) throw invalid('This value must be greater than or equal to 1.', quantityName);
    lineItems.push({ name: productTitle, description, quantity, unitAmount, amount: unitAmount * quantity });
  });
  const total = lineItems.reduce((sum, item) => sum + item.amount, 0);
  if (total < 1) throw invalid('The total must be more than 0 in payment mode.', 'line_items');
  if (total > maxAmount) throw invalid(`The total must be at most ${maxAmount}.`, 'line_items');

  const customerEmail = stringParam(params.customer_email, 'customer_email') || null;
  if (customerEmail !== null && (customerEmail.length > 800 || !emailPattern.test(customerEmail))) {
    throw invalid(`Invalid email address: ${customerEmail}`, 'customer_email', 'email_invalid');
  }
  const clientReferenceId = stringParam(params.client_reference_id, 'client_reference_id') || null;
  if (clientReferenceId !== null && clientReferenceId.length > maxClientReferenceLength) {
    throw invalid(
      `client_reference_id can be at most ${maxClientReferenceLength} characters.`,
      'client_reference_id',
    );
  }
  const intent = hashParam(params.payment_intent_data, 'payment_intent_data') ?? {};
  refuseUnknown(intent, ['metadata', 'description'], 'payment_intent_data');
  return {
    lineItems,
    currency: currency!,
    successUrl: urlParam(params.success_url, 'success_url', true)!,
    cancelUrl: urlParam(params.cancel_url, 'cancel_url', false),
    clientReferenceId,
    customerEmail,
    metadata: metadataParam(params.metadata, 'metadata'),
    expiresAt: integerParam(params.expires_at, 'expires_at') ?? null,
    paymentIntentMetadata: metadataParam(intent.metadata, 'payment_intent_data[metadata]'),
    paymentIntentDescription: stringParam(intent.description, 'payment_intent_data[description]') || null,
  };
}

// ---------------------------------------------------------------------------------------------
// State

interface StoredSession {
  session: CheckoutSession;
  lineItems: LineItemSummary[];
  paymentIntentMetadata: Record<string, string>;
  paymentIntentDescription: string | null;
}

interface StoredEvent {
  event: ProviderEvent;
  status: EventDelivery['status'];
  attempts: DeliveryAttempt[];
  /** Real time, ms; null unless pending. */
  nextAttemptAt: number | null;
  /** Scheduled tries that failed, which picks the next wait. */
  failedTries: number;
}

interface IdempotentResult {
  key: string;
  method: string;
  path: string;
  fingerprint: string;
  status: number;
  body: unknown;
  /** Real time, ms. */
  savedAt: number;
}

interface SavedState {
  version: 1;
  sessions: StoredSession[];
  events: StoredEvent[];
  idempotency: IdempotentResult[];
}

async function loadState(file: string): Promise<SavedState | null> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw error;
  }
  try {
    const state = JSON.parse(text) as Partial<SavedState>;
    if (state.version !== 1 || !Array.isArray(state.sessions) || !Array.isArray(state.events)) {
      throw new Error('unknown layout');
    }
    return {
      version: 1,
      sessions: state.sessions,
      events: state.events,
      idempotency: state.idempotency ?? [],
    };
  } catch (error) {
    throw new Error(
      `The payment stand-in cannot read ${file} (${(error as Error).message}). Delete it to start with no sessions.`,
    );
  }
}

const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

function newId(prefix: string, length: number): string {
  let id = prefix;
  for (const byte of randomBytes(length)) id += alphabet[byte % alphabet.length];
  return id;
}

const seconds = (date: Date) => Math.floor(date.getTime() / 1000);

function money(minor: number, currency: string): string {
  return formatMoney(minor, currency.toUpperCase());
}

function utcText(epochSeconds: number): string {
  return `${new Date(epochSeconds * 1000).toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

// ---------------------------------------------------------------------------------------------

export async function startPaymentProvider(options: PaymentProviderOptions): Promise<RunningPaymentProvider> {
  const host = options.host ?? '127.0.0.1';
  if (!loopbackHosts.has(host))
    throw new Error(`The payment stand-in listens on loopback only, not on ${host}.`);
  if (!options.secretKey || !options.webhookSecret) {
    throw new Error('The payment stand-in needs a secret key and a webhook signing secret.');
  }
  const clock = options.clock ?? systemClock;
  const retryDelaysMs = options.retryDelaysMs ?? defaultRetryDelaysMs;
  const webhookTimeoutMs = options.webhookTimeoutMs ?? 10_000;
  const dataFile = options.dataFile ?? null;
  const apiVersion = Stripe.API_VERSION;

  const sessions = new Map<string, StoredSession>();
  const events = new Map<string, StoredEvent>();
  const idempotency = new Map<string, IdempotentResult>();
  const saved = dataFile ? await loadState(dataFile) : null;
  for (const stored of saved?.sessions ?? []) sessions.set(stored.session.id, stored);
  for (const stored of saved?.events ?? []) events.set(stored.event.id, stored);
  for (const result of saved?.idempotency ?? []) idempotency.set(result.key, result);

  let origin = '';
  let closing = false;
  const closed = new AbortController();
  const timers = new Map<string, NodeJS.Timeout>();
  const inFlight = new Map<string, Promise<DeliveryAttempt | null>>();
  const deliveryWaiters = new Set<(delivery: StoredEvent) => void>();

  // ---- persistence: the whole state, written whole and renamed into place, one write at a time.
  let saving: Promise<void> = Promise.resolve();
  let writeQueued = false;
  function save(): void {
    if (!dataFile || writeQueued) return;
    writeQueued = true;
    saving = saving
      .then(async () => {
        writeQueued = false;
        const now = Date.now();
        for (const [key, result] of idempotency)
          if (now - result.savedAt > idempotencyKeptMs) idempotency.delete(key);
        const state: SavedState = {
          version: 1,
          sessions: [...sessions.values()],
          events: [...events.values()],
          idempotency: [...idempotency.values()],
        };
        await mkdir(dirname(dataFile), { recursive: true });
        const scratch = `${dataFile}.${process.pid}.tmp`;
        await writeFile(scratch, `${JSON.stringify(state)}\n`, { mode: 0o600 });
        await rename(scratch, dataFile);
      })
      .catch((error: unknown) =>
        console.error('Brinewatch payment stand-in: could not save its state', error),
      );
  }

  // ---- events and their delivery

  function makeEvent(
    type: string,
    object: unknown,
    request: ProviderEvent['request'] = { id: null, idempotency_key: null },
    created = clock(),
  ): ProviderEvent {
    const stored: StoredEvent = {
      event: {
        id: newId('evt_', 24),
        object: 'event',
        api_version: apiVersion,
        created: seconds(created),
        data: { object: structuredClone(object) },
        livemode: false,
        pending_webhooks: 1,
        request,
        type,
      },
      status: 'pending',
      attempts: [],
      nextAttemptAt: null,
      failedTries: 0,
    };
    events.set(stored.event.id, stored);
    schedule(stored, 0);
    save();
    return stored.event;
  }

  function schedule(stored: StoredEvent, delayMs: number): void {
    if (closing) return;
    clearTimeout(timers.get(stored.event.id));
    stored.nextAttemptAt = Date.now() + delayMs;
    const timer = setTimeout(() => {
      timers.delete(stored.event.id);
      void attempt(stored, 'scheduled');
    }, delayMs);
    timers.set(stored.event.id, timer);
  }

  /** One try at a time per event; a manual try waits for a scheduled one under way. */
  function attempt(stored: StoredEvent, kind: DeliveryAttempt['kind']): Promise<DeliveryAttempt | null> {
    const id = stored.event.id;
    const before = inFlight.get(id) ?? Promise.resolve(null);
    const run = before.then(() => post(stored, kind));
    const settled = run.catch(() => null);
    inFlight.set(id, settled);
    void settled.then(() => {
      if (inFlight.get(id) === settled) inFlight.delete(id);
    });
    return run;
  }

  async function post(stored: StoredEvent, kind: DeliveryAttempt['kind']): Promise<DeliveryAttempt | null> {
    if (closing) return null;
    const payload = JSON.stringify(
      { ...stored.event, pending_webhooks: stored.status === 'delivered' ? 0 : 1 },
      null,
      2,
    );
    const signature = Stripe.webhooks.generateTestHeaderString({
      payload,
      secret: options.webhookSecret,
      timestamp: seconds(clock()),
    });
    const at = new Date();
    const started = performance.now();
    let status: number | null = null;
    let error: string | null = null;
    let responseText = '';
    try {
      const response = await fetch(options.webhookUrl, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/json; charset=utf-8',
          'Stripe-Signature': signature,
          'User-Agent': 'Brinewatch-payment-stand-in/1 (webhooks)',
        },
        body: payload,
        // A redirect is a failed delivery, as for the provider: the endpoint URL must be the final one.
        redirect: 'manual',
        signal: AbortSignal.any([closed.signal, AbortSignal.timeout(webhookTimeoutMs)]),
      });
      status = response.status;
      responseText = (await response.text().catch(() => '')).slice(0, 300);
    } catch (caught) {
      if (closing) return null;
      const reason = caught as Error & { cause?: { code?: string; message?: string } };
      error =
        reason.name === 'TimeoutError'
          ? `no answer within ${webhookTimeoutMs} ms`
          : (reason.cause?.code ?? reason.cause?.message ?? reason.message);
    }
    const record: DeliveryAttempt = {
      at: at.toISOString(),
      kind,
      status,
      error,
      responseText,
      durationMs: Math.round(performance.now() - started),
    };
    stored.attempts.push(record);
    const ok = status !== null && status >= 200 && status < 300;
    if (ok) {
      stored.status = 'delivered';
      stored.nextAttemptAt = null;
      clearTimeout(timers.get(stored.event.id));
      timers.delete(stored.event.id);
      for (const waiter of deliveryWaiters) waiter(stored);
    } else if (kind === 'scheduled' && stored.status === 'pending') {
      stored.failedTries += 1;
      const wait = retryDelaysMs[stored.failedTries - 1];
      if (wait === undefined) {
        stored.status = 'failed';
        stored.nextAttemptAt = null;
      } else {
        schedule(stored, wait);
      }
    }
    save();
    return record;
  }

  // ---- sessions

  function sessionUrl(id: string) {
    return `${origin}/pay/${id}`;
  }

  function expire(stored: StoredSession, request?: ProviderEvent['request']): void {
    stored.session.status = 'expired';
    stored.session.url = null;
    makeEvent('checkout.session.expired', stored.session, request);
  }

  /** Sessions past expires_at expire when next looked at, and within a second anyway. */
  function refresh(stored: StoredSession): StoredSession {
    if (stored.session.status === 'open' && seconds(clock()) >= stored.session.expires_at) expire(stored);
    return stored;
  }

  function expireDue(): CheckoutSession[] {
    const expired: CheckoutSession[] = [];
    for (const stored of sessions.values()) {
      if (stored.session.status !== 'open') continue;
      if (refresh(stored).session.status === 'expired') expired.push(structuredClone(stored.session));
    }
    return expired;
  }

  function createSession(input: NewSession): CheckoutSession {
    const now = seconds(clock());
    if (input.expiresAt !== null) {
      const lifetime = input.expiresAt - now;
      if (lifetime < minLifetimeS || lifetime > maxLifetimeS) {
        throw invalid(
          'expires_at must be between 30 minutes and 24 hours after the session is created.',
          'expires_at',
        );
      }
    }
    const id = newId('cs_test_', 56);
    const amount = input.lineItems.reduce((sum, item) => sum + item.amount, 0);
    const session: CheckoutSession = {
      id,
      object: 'checkout.session',
      amount_subtotal: amount,
      amount_total: amount,
      cancel_url: input.cancelUrl,
      client_reference_id: input.clientReferenceId,
      created: now,
      currency: input.currency,
      customer: null,
      customer_details: null,
      customer_email: input.customerEmail,
      expires_at: input.expiresAt ?? now + maxLifetimeS,
      livemode: false,
      metadata: input.metadata,
      mode: 'payment',
      payment_intent: null,
      payment_method_types: ['card'],
      payment_status: 'unpaid',
      status: 'open',
      success_url: input.successUrl,
      total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
      ui_mode: 'hosted',
      url: sessionUrl(id),
    };
    sessions.set(id, {
      session,
      lineItems: input.lineItems,
      paymentIntentMetadata: input.paymentIntentMetadata,
      paymentIntentDescription: input.paymentIntentDescription,
    });
    return session;
  }

  function findSession(id: string): StoredSession {
    const stored = sessions.get(id);
    if (!stored) throw missing('checkout.session', id, 'session');
    return refresh(stored);
  }

  function pay(stored: StoredSession, details: Partial<TestCardDetails>): PaymentOutcome {
    const session = refresh(stored).session;
    if (session.status !== 'open') {
      return {
        ok: false,
        code: 'session_closed',
        declineCode: null,
        message:
          session.status === 'complete'
            ? 'This payment has already been made.'
            : 'This payment page has expired.',
        fieldErrors: {},
      };
    }
    const fieldErrors: Partial<Record<CardField, string>> = {};
    const email = (details.email ?? '').trim();
    if (session.customer_email === null) {
      if (email === '') fieldErrors.email = 'Enter an email address for the receipt.';
      else if (!emailPattern.test(email))
        fieldErrors.email = 'Enter an email address such as name@example.com.';
    }
    const number = (details.number ?? '').replace(/[\s-]/g, '');
    const card = testCards[number];
    if (number === '') fieldErrors.number = 'Enter the card number.';
    else if (!card) {
      fieldErrors.number =
        'This test page takes test cards only: use 4242 4242 4242 4242, or another number from the list of test cards.';
    }
    const expiry = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(details.expiry ?? '');
    if (!expiry) fieldErrors.expiry = 'Enter the expiry date as MM/YY, for example 04/29.';
    else {
      const month = Number(expiry[1]);
      const year = expiry[2]!.length === 2 ? 2000 + Number(expiry[2]) : Number(expiry[2]);
      const now = clock();
      // A card is good through the last day of its expiry month (common practice).
      if (month < 1 || month > 12) fieldErrors.expiry = 'The month is 01 to 12.';
      else if (year * 12 + month < now.getUTCFullYear() * 12 + now.getUTCMonth() + 1) {
        fieldErrors.expiry = 'This expiry date is in the past. Check the card or use another one.';
      }
    }
    if (!/^\d{3,4}$/.test((details.cvc ?? '').trim()))
      fieldErrors.cvc = 'Enter the three or four digit security code.';
    const name = (details.name ?? '').trim();
    if (name === '') fieldErrors.name = 'Enter the name as it is on the card.';
    else if (name.length > 200) fieldErrors.name = 'At most 200 characters.';
    if (Object.keys(fieldErrors).length > 0) {
      return {
        ok: false,
        code: 'invalid_details',
        declineCode: null,
        message: 'Check the highlighted details.',
        fieldErrors,
      };
    }
    if (card!.declines) {
      return {
        ok: false,
        code: card!.code,
        declineCode: card!.declineCode,
        message: card!.message,
        fieldErrors: {},
      };
    }
    session.status = 'complete';
    session.payment_status = 'paid';
    session.payment_intent = newId('pi_', 24);
    session.customer_details = {
      email: session.customer_email ?? email,
      name,
      address: null,
      phone: null,
    };
    session.url = null;
    makeEvent('checkout.session.completed', session);
    return {
      ok: true,
      session: structuredClone(session),
      redirectTo: session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id),
    };
  }

  // ---- HTTP

  const server = createServer((req, res) => {
    handle(req, res).catch((error: unknown) => {
      if (error instanceof ApiFailure) {
        if (!res.headersSent) sendJson(res, error.status, error.body());
        else res.end();
        return;
      }
      console.error('Brinewatch payment stand-in: request failed', error);
      if (!res.headersSent) {
        sendJson(
          res,
          500,
          new ApiFailure(500, 'api_error', 'The local stand-in failed; see its log.').body(),
        );
      } else res.end();
    });
  });

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', origin);
    const path = url.pathname;
    const method = req.method ?? 'GET';
    if (path.startsWith('/v1/')) return handleApi(req, res, url);
    const payMatch = /^\/pay\/([A-Za-z0-9_]+)$/.exec(path);
    if (payMatch) {
      if (method === 'GET' || method === 'HEAD') return showPaymentPage(res, payMatch[1]!);
      if (method === 'POST') return submitPaymentPage(req, res, payMatch[1]!);
      return sendText(res, 405, 'Use GET or POST.', { Allow: 'GET, POST' });
    }
    if (path.startsWith('/_stand-in/')) return handleControl(req, res, path);
    if (path === '/' && (method === 'GET' || method === 'HEAD')) return sendHtml(res, 200, overview());
    return sendHtml(
      res,
      404,
      closedPage({
        title: 'Page not found',
        message: 'There is no page at this address on the payment stand-in.',
      }),
    );
  }

  function checkApiKey(authorization: string | undefined): ApiFailure | null {
    const bearer = /^Bearer\s+(\S+)$/i.exec(authorization ?? '')?.[1];
    // The provider also takes the key as the Basic user name (`curl -u sk_test_…:`).
    const basic = /^Basic\s+(\S+)$/i.exec(authorization ?? '')?.[1];
    const key = bearer ?? (basic ? Buffer.from(basic, 'base64').toString('utf8').split(':')[0] : undefined);
    if (!key) {
      return new ApiFailure(
        401,
        'invalid_request_error',
        'You did not provide an API key. Send it as a Bearer token in the Authorization header.',
      );
    }
    const expected = Buffer.from(options.secretKey);
    const given = Buffer.from(key);
    if (given.length === expected.length && timingSafeEqual(given, expected)) return null;
    const shown = key.length > 12 ? `${key.slice(0, 8)}${'*'.repeat(8)}${key.slice(-4)}` : '********';
    return new ApiFailure(401, 'invalid_request_error', `Invalid API Key provided: ${shown}`);
  }

  async function handleApi(req: IncomingMessage, res: ServerResponse, url: URL): Promise<void> {
    const requestId = newId('req_', 14);
    const method = req.method ?? 'GET';
    const send = (status: number, body: unknown, extra: Record<string, string> = {}) =>
      sendJson(res, status, body, { 'Request-Id': requestId, ...extra });
    const fail = (failure: ApiFailure, extra: Record<string, string> = {}) =>
      send(failure.status, failure.body(), extra);

    const authFailure = checkApiKey(req.headers.authorization);
    if (authFailure) {
      req.resume();
      return fail(authFailure, { 'WWW-Authenticate': 'Bearer realm="payment stand-in"' });
    }
    const body = await readBody(req, maxApiBodyBytes);
    if (body === null) return fail(invalid(`The request body is larger than ${maxApiBodyBytes} bytes.`));
    const contentType = (req.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
    if (body.length > 0 && contentType !== 'application/x-www-form-urlencoded') {
      return fail(invalid('Send parameters as application/x-www-form-urlencoded, as the SDK does.'));
    }
    let params: Params;
    try {
      params = parseFormBody(method === 'GET' ? url.search.slice(1) : body.toString('utf8'));
    } catch (error) {
      if (error instanceof ApiFailure) return fail(error);
      throw error;
    }

    const route = apiRoute(method, url.pathname);
    if (!route) {
      return fail(
        new ApiFailure(
          404,
          'invalid_request_error',
          `Unrecognized request URL (${method}: ${url.pathname}). The local stand-in serves POST /v1/checkout/sessions, GET /v1/checkout/sessions/:id, POST /v1/checkout/sessions/:id/expire and GET /v1/events/:id.`,
        ),
      );
    }

    // docs.stripe.com/api/idempotent_requests: POSTs only; a replay returns the saved result; the
    // same key with other parameters is an error; results are saved only once the endpoint ran, so
    // a refused request can be sent again with the same key.
    const key = method === 'POST' ? headerValue(req, 'idempotency-key') : null;
    const print = fingerprint(params);
    if (key !== null) {
      if (key.length > maxIdempotencyKeyLength) {
        return fail(invalid(`Idempotency keys can be at most ${maxIdempotencyKeyLength} characters.`));
      }
      const earlier = idempotency.get(key);
      if (earlier && Date.now() - earlier.savedAt <= idempotencyKeptMs) {
        if (earlier.method !== method || earlier.path !== url.pathname || earlier.fingerprint !== print) {
          return fail(
            new ApiFailure(
              400,
              'idempotency_error',
              `Keys for idempotent requests can only be used with the same parameters they were first used with. Use a key other than '${key}' for a different request.`,
            ),
          );
        }
        return send(earlier.status, earlier.body, { 'Idempotent-Replayed': 'true' });
      }
    }

    let result: unknown;
    try {
      result = route({ params, requestId, idempotencyKey: key });
    } catch (error) {
      if (error instanceof ApiFailure) return fail(error);
      throw error;
    }
    if (key !== null) {
      idempotency.set(key, {
        key,
        method,
        path: url.pathname,
        fingerprint: print,
        status: 200,
        body: result,
        savedAt: Date.now(),
      });
    }
    if (method === 'POST') save();
    return send(200, result);
  }

  type ApiHandler = (call: { params: Params; requestId: string; idempotencyKey: string | null }) => unknown;

  function apiRoute(method: string, path: string): ApiHandler | null {
    if (path === '/v1/checkout/sessions' && method === 'POST') {
      return ({ params }) => structuredClone(createSession(readCreateSession(params)));
    }
    const sessionMatch = /^\/v1\/checkout\/sessions\/([^/]+)$/.exec(path);
    if (sessionMatch && method === 'GET') {
      return ({ params }) => {
        refuseUnknown(params, ['expand'], null);
        return structuredClone(findSession(decodeURIComponent(sessionMatch[1]!)).session);
      };
    }
    const expireMatch = /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/.exec(path);
    if (expireMatch && method === 'POST') {
      return ({ params, requestId, idempotencyKey }) => {
        refuseUnknown(params, ['expand'], null);
        const stored = findSession(decodeURIComponent(expireMatch[1]!));
        if (stored.session.status !== 'open') {
          throw invalid(
            `Only Checkout Sessions with status "open" can be expired; this one is "${stored.session.status}".`,
          );
        }
        expire(stored, { id: requestId, idempotency_key: idempotencyKey });
        return structuredClone(stored.session);
      };
    }
    const eventMatch = /^\/v1\/events\/([^/]+)$/.exec(path);
    if (eventMatch && method === 'GET') {
      return () => {
        const id = decodeURIComponent(eventMatch[1]!);
        const stored = events.get(id);
        if (!stored) throw missing('event', id, 'id');
        return { ...structuredClone(stored.event), pending_webhooks: stored.status === 'delivered' ? 0 : 1 };
      };
    }
    return null;
  }

  // ---- the hosted payment page

  function checkoutView(stored: StoredSession): CheckoutView {
    const { session } = stored;
    return {
      action: `/pay/${session.id}`,
      amountText: money(session.amount_total, session.currency),
      lineItems: stored.lineItems.map((item) => ({
        name: item.name,
        description: item.description,
        quantity: item.quantity,
        amountText: money(item.amount, session.currency),
      })),
      customerEmail: session.customer_email,
      cancelUrl: session.cancel_url,
      expiresAtText: utcText(session.expires_at),
    };
  }

  function closedPageFor(stored: StoredSession | undefined): { status: number; html: string } | null {
    if (!stored) {
      return {
        status: 404,
        html: closedPage({
          title: 'Payment not found',
          message: 'There is no payment at this address. Go back to the app and start the payment again.',
        }),
      };
    }
    const { session } = stored;
    if (session.status === 'complete') {
      return {
        status: 409,
        html: closedPage({
          title: 'Already paid',
          message: `This payment of ${money(session.amount_total, session.currency)} has been made. Nothing more is charged.`,
          link: {
            href: session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id),
            text: 'Back to the app',
          },
        }),
      };
    }
    if (session.status === 'expired') {
      return {
        status: 410,
        html: closedPage({
          title: 'This payment page has expired',
          message: 'Nothing was charged. Go back to the app to start the payment again.',
          link: session.cancel_url ? { href: session.cancel_url, text: 'Back to the app' } : null,
        }),
      };
    }
    return null;
  }

  function showPaymentPage(res: ServerResponse, id: string): void {
    const stored = sessions.get(id);
    if (stored) refresh(stored);
    const closedOne = closedPageFor(stored);
    if (closedOne) return sendHtml(res, closedOne.status === 409 ? 200 : closedOne.status, closedOne.html);
    sendHtml(
      res,
      200,
      checkoutPage(checkoutView(stored!), { values: {}, errors: {}, problem: null }, testCardRows),
    );
  }

  async function submitPaymentPage(req: IncomingMessage, res: ServerResponse, id: string): Promise<void> {
    const body = await readBody(req, maxPageBodyBytes);
    const stored = sessions.get(id);
    if (stored) refresh(stored);
    const closedOne = closedPageFor(stored);
    if (closedOne) return sendHtml(res, closedOne.status, closedOne.html);
    if (body === null) return sendText(res, 413, 'The form is larger than it can be.');
    const form = new URLSearchParams(body.toString('utf8'));
    const details: TestCardDetails = {
      number: form.get('number') ?? '',
      expiry: form.get('expiry') ?? '',
      cvc: form.get('cvc') ?? '',
      name: form.get('name') ?? '',
      email: form.get('email') ?? '',
    };
    const outcome = pay(stored!, details);
    if (outcome.ok) {
      // The webhook goes out on its own; the client is not kept waiting for it.
      res.writeHead(303, { ...pageHeaders, Location: outcome.redirectTo, 'Content-Length': '0' });
      res.end();
      return;
    }
    const formState: CheckoutForm = {
      // The security code is never shown again; the rest is kept so only the wrong part is retyped.
      values: { number: details.number, expiry: details.expiry, name: details.name, email: details.email },
      errors: outcome.fieldErrors,
      problem: outcome.code === 'invalid_details' ? null : outcome.message,
    };
    sendHtml(
      res,
      outcome.code === 'invalid_details' ? 400 : 402,
      checkoutPage(checkoutView(stored!), formState, testCardRows),
    );
  }

  function overview(): string {
    const sessionRows = [...sessions.values()].reverse().map(({ session }) => ({
      id: session.id,
      amountText: money(session.amount_total, session.currency),
      status: session.status === 'complete' ? 'complete, paid' : session.status,
      createdText: utcText(session.created),
      payUrl: session.url,
    }));
    const eventRows = [...events.values()].reverse().map((stored) => ({
      id: stored.event.id,
      type: stored.event.type,
      createdText: utcText(stored.event.created),
      status: stored.status,
      attempts:
        stored.attempts.length === 0
          ? 'none yet'
          : stored.attempts
              .map((attemptRecord) => attemptRecord.status ?? attemptRecord.error ?? '?')
              .join(', '),
    }));
    return overviewPage(sessionRows, eventRows);
  }

  // ---- control over HTTP (for browser tests, which run in other processes)

  async function handleControl(req: IncomingMessage, res: ServerResponse, path: string): Promise<void> {
    const method = req.method ?? 'GET';
    if (method === 'GET' && path === '/_stand-in/sessions') return sendJson(res, 200, publicSessions());
    if (method === 'GET' && path === '/_stand-in/events') return sendJson(res, 200, publicEvents());
    if (method !== 'POST') return sendJson(res, 404, invalid(`Nothing at ${method} ${path}.`).body());
    const authFailure = checkApiKey(req.headers.authorization);
    if (authFailure) {
      req.resume();
      return sendJson(res, 401, authFailure.body());
    }
    const body = await readBody(req, maxApiBodyBytes);
    const redeliverMatch = /^\/_stand-in\/events\/([A-Za-z0-9_]+)\/redeliver$/.exec(path);
    if (redeliverMatch) {
      if (!events.has(redeliverMatch[1]!)) {
        return sendJson(res, 404, missing('event', redeliverMatch[1]!, 'id').body());
      }
      return sendJson(res, 200, await redeliver(redeliverMatch[1]!));
    }
    if (path === '/_stand-in/events') {
      let input: { type?: unknown; object?: unknown };
      try {
        input = JSON.parse(body?.toString('utf8') ?? '') as typeof input;
      } catch {
        return sendJson(res, 400, invalid('Send JSON: {"type": "…", "object": {…}}.').body());
      }
      if (typeof input.type !== 'string' || input.type === '' || typeof input.object !== 'object') {
        return sendJson(res, 400, invalid('Send JSON: {"type": "…", "object": {…}}.').body());
      }
      return sendJson(res, 200, structuredClone(makeEvent(input.type, input.object)));
    }
    return sendJson(res, 404, invalid(`Nothing at ${method} ${path}.`).body());
  }

  async function redeliver(eventId: string): Promise<DeliveryAttempt> {
    const stored = events.get(eventId);
    if (!stored) throw new Error(`The payment stand-in has no event ${eventId}.`);
    const record = await attempt(stored, 'manual');
    if (!record) throw new Error('The payment stand-in is closing.');
    return structuredClone(record);
  }

  function publicSessions(): CheckoutSession[] {
    return [...sessions.values()].map((stored) => structuredClone(refresh(stored).session));
  }

  function publicEvents(): EventDelivery[] {
    return [...events.values()].map(publicEvent);
  }

  function publicEvent(stored: StoredEvent): EventDelivery {
    return {
      event: structuredClone(stored.event),
      status: stored.status,
      attempts: structuredClone(stored.attempts),
      nextAttemptAt: stored.nextAttemptAt === null ? null : new Date(stored.nextAttemptAt).toISOString(),
    };
  }

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (error) => console.error('Brinewatch payment stand-in: server error', error));
  const { port } = server.address() as AddressInfo;
  origin = `http://${host.includes(':') ? `[${host}]` : host}:${port}`;
  // Sessions saved by an earlier run on another port point at this one now.
  for (const stored of sessions.values()) {
    if (stored.session.status === 'open') stored.session.url = sessionUrl(stored.session.id);
  }
  // Deliveries an earlier run left pending are tried again at once: the demo restarts the app with
  // its stand-ins, and whatever kept them from the app may be gone. A refusal carries on with the
  // schedule where it was.
  for (const stored of events.values()) {
    if (stored.status === 'pending') schedule(stored, 0);
  }
  const sweep = setInterval(expireDue, 1000);
  sweep.unref();

  const running: RunningPaymentProvider = {
    url: origin,
    port,
    sessions: publicSessions,
    session(id) {
      const stored = sessions.get(id);
      return stored ? structuredClone(refresh(stored).session) : undefined;
    },
    lineItems(sessionId) {
      return structuredClone(sessions.get(sessionId)?.lineItems ?? []);
    },
    events: publicEvents,
    waitForDelivery(predicate, timeoutMs = 15_000) {
      const matches = (stored: StoredEvent) => stored.status === 'delivered' && predicate(stored.event);
      const already = [...events.values()].find(matches);
      if (already) return Promise.resolve(publicEvent(already));
      return new Promise((resolve, reject) => {
        const waiter = (stored: StoredEvent) => {
          if (!matches(stored)) return;
          clearTimeout(timer);
          deliveryWaiters.delete(waiter);
          resolve(publicEvent(stored));
        };
        const timer = setTimeout(() => {
          deliveryWaiters.delete(waiter);
          const seen = [...events.values()].map(
            (stored) =>
              `${stored.event.type} ${stored.status} (${stored.attempts.map((a) => a.status ?? a.error).join(', ') || 'no try yet'})`,
          );
          reject(
            new Error(
              `No matching event delivered within ${timeoutMs} ms. Events: ${seen.length ? seen.join('; ') : 'none'}.`,
            ),
          );
        }, timeoutMs);
        deliveryWaiters.add(waiter);
      });
    },
    sendEvent(type, object, sendOptions = {}) {
      return structuredClone(makeEvent(type, object, undefined, sendOptions.created ?? clock()));
    },
    redeliver,
    pay(sessionId, card = {}) {
      const stored = sessions.get(sessionId);
      if (!stored) throw new Error(`The payment stand-in has no session ${sessionId}.`);
      const outcome = pay(stored, {
        number: successCard,
        expiry: `12/${String((clock().getUTCFullYear() + 3) % 100).padStart(2, '0')}`,
        cvc: '123',
        name: 'Test Payer',
        email: 'payer@example.test',
        ...card,
      });
      return structuredClone(outcome);
    },
    expireDue,
    async close() {
      if (closing) return;
      closing = true;
      clearInterval(sweep);
      for (const timer of timers.values()) clearTimeout(timer);
      timers.clear();
      closed.abort();
      await Promise.all([...inFlight.values()]);
      await new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        server.closeAllConnections();
      });
      save();
      await saving;
    },
  };
  return running;
}

function headerValue(req: IncomingMessage, name: string): string | null {
  const value = req.headers[name];
  return typeof value === 'string' ? value : null;
}

/** The body, or null once it passes `limit` bytes. */
async function readBody(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req as AsyncIterable<Buffer>) {
    size += chunk.length;
    if (size > limit) {
      req.resume();
      return null;
    }
    chunks.push(chunk);
  }
  return Buffer.concat(chunks);
}

function sendJson(
  res: ServerResponse,
  status: number,
  value: unknown,
  headers: Record<string, string> = {},
): void {
  res.writeHead(status, {
    ...headers,
    'Content-Type': 'application/json; charset=utf-8',
    'X-Content-Type-Options': 'nosniff',
    'Cache-Control': 'no-store',
  });
  res.end(JSON.stringify(value, null, 2));
}

function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, { ...pageHeaders, 'Content-Type': 'text/html; charset=utf-8' });
  res.end(html);
}

function sendText(
  res: ServerResponse,
  status: number,
  text: string,
  headers: Record<string, string> = {},
): void {
  res.writeHead(status, {
    ...headers,
    'Content-Type': 'text/plain; charset=utf-8',
    'Cache-Control': 'no-store',
  });
  res.end(text);
}
