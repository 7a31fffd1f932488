import { createHash } from 'node:crypto';
import type { IncomingHttpHeaders } from 'node:http';
import { request } from 'node:https';
import webpush, { type RequestDetails } from 'web-push';
import type { VapidKeys } from './vapid-keys';

/** What a browser's `PushSubscription.toJSON()` gives, as stored for a user. */
export interface PushSubscriptionDetails {
  endpoint: string;
  keys: { p256dh: string; auth: string };
}

export interface PushSenderConfig {
  /** `subject` is the operator's contact, mailto: or https: (RFC 8292 §2.1). */
  vapid: VapidKeys & { subject: string };
  /** Trust this certificate instead of the public CAs: the local push stand-in's own. */
  trustedCaPem?: string;
  /** Gives up on a silent push service after this long; 10 s when omitted. */
  timeoutMs?: number;
}

export interface PushMessageOptions {
  /** How long the push service may hold the message for an offline browser (RFC 8030 §5.2). */
  ttlSeconds: number;
  /** 'high' for critical alerts so a sleeping phone wakes for them (RFC 8030 §5.3). */
  urgency: 'normal' | 'high';
  /**
   * A newer message with the same topic replaces an undelivered older one (RFC 8030 §5.4). At most
   * 32 base64url characters; use `alertTopic(alertId)`.
   */
  topic?: string;
}

export type PushOutcome =
  | { outcome: 'delivered' }
  /** The subscription is dead: delete it. */
  | { outcome: 'gone'; status: 404 | 410 }
  /** Worth sending again later; `afterMs` is the push service's own Retry-After when it gave one. */
  | { outcome: 'retry'; afterMs?: number; reason: string }
  /** Refused for something on our side (keys, headers, size): sending again would fail again. */
  | { outcome: 'rejected'; status: number; detail: string };

export interface PushSender {
  send(
    subscription: PushSubscriptionDetails,
    payload: object,
    options: PushMessageOptions,
  ): Promise<PushOutcome>;
}

/**
 * RFC 8291 §4: one record in at most 4096 octets of body, less the 86-octet header, the 16-octet
 * tag and 1 octet of padding delimiter.
 */
export const maxPushPayloadBytes = 3993;

const topicPattern = /^[A-Za-z0-9_-]{1,32}$/; // RFC 8030 §5.4
const defaultTimeoutMs = 10_000;
const maxDetailChars = 500;

/** A Topic for an alert: stable per alert id, inside RFC 8030 §5.4's 32 base64url characters. */
export function alertTopic(alertId: string): string {
  return createHash('sha256').update(`alert:${alertId}`).digest('base64url').slice(0, 32);
}

export function createPushSender(config: PushSenderConfig): PushSender {
  const vapidDetails = { ...config.vapid };
  const timeoutMs = config.timeoutMs ?? defaultTimeoutMs;

  return {
    async send(subscription, payload, options) {
      checkOptions(options);
      const body = JSON.stringify(payload);
      if (Buffer.byteLength(body) > maxPushPayloadBytes) {
        throw new RangeError(
          `A push payload is at most ${maxPushPayloadBytes} bytes of JSON (RFC 8291 §4); this one is ${Buffer.byteLength(body)}.`,
        );
      }
      if (new URL(subscription.endpoint).protocol !== 'https:') {
        // RFC 8030 §3: push services are reached over TLS only.
        throw new TypeError('A push endpoint must be an https: URL.');
      }
      // web-push sends with https.request and the default CAs; it is used here only to encrypt
      // (RFC 8291) and sign (RFC 8292), and the request goes out below so the stand-in's CA can be trusted.
      const details = webpush.generateRequestDetails(subscription, body, {
        vapidDetails,
        contentEncoding: 'aes128gcm',
        TTL: options.ttlSeconds,
        urgency: options.urgency,
        ...(options.topic === undefined ? {} : { topic: options.topic }),
      });
      const response = await post(details, config.trustedCaPem, timeoutMs);
      return 'networkError' in response
        ? { outcome: 'retry', reason: response.networkError }
        : outcomeOf(response.status, response.headers, response.text);
    },
  };
}

function checkOptions(options: PushMessageOptions): void {
  // web-push would fall back to four weeks for a missing TTL; every caller must choose one.
  if (!Number.isSafeInteger(options.ttlSeconds) || options.ttlSeconds < 0) {
    throw new RangeError(
      `ttlSeconds must be a whole number of seconds, 0 or more; got ${options.ttlSeconds}.`,
    );
  }
  if (options.topic !== undefined && !topicPattern.test(options.topic)) {
    throw new RangeError(
      'A push topic is 1–32 base64url characters (RFC 8030 §5.4); use alertTopic(alertId).',
    );
  }
}

interface PushResponse {
  status: number;
  headers: IncomingHttpHeaders;
  text: string;
}

function post(
  details: RequestDetails,
  trustedCaPem: string | undefined,
  timeoutMs: number,
): Promise<PushResponse | { networkError: string }> {
  return new Promise((resolve) => {
    const req = request(
      details.endpoint,
      {
        method: details.method,
        headers: details.headers,
        timeout: timeoutMs,
        ...(trustedCaPem === undefined ? {} : { ca: trustedCaPem }),
      },
      (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (chunk: string) => {
          if (text.length < maxDetailChars) text += chunk;
        });
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text }));
        res.on('error', (error) => resolve({ networkError: error.message }));
      },
    );
    req.on('timeout', () => req.destroy(new Error(`no answer within ${timeoutMs} ms`)));
    // Refused connections, resets, TLS failures and timeouts all land here.
    req.on('error', (error) => resolve({ networkError: error.message }));
    req.end(details.body ?? undefined);
  });
}

function outcomeOf(status: number, headers: IncomingHttpHeaders, text: string): PushOutcome {
  if (status >= 200 && status < 300) return { outcome: 'delivered' };
  // RFC 8030 §7.3: 404 for an expired subscription. 410 is what push services answer once the
  // browser has unsubscribed (common practice; RFC 9110 §15.5.11 "no longer available").
  if (status === 404 || status === 410) return { outcome: 'gone', status };
  // RFC 8030 §8.4: 429 when over the rate limit, with Retry-After; 5xx are the service's own
  // trouble and pass once it recovers (common practice), with Retry-After honoured when given.
  if (status === 429 || status >= 500) {
    const afterMs = retryAfterMs(headers['retry-after']);
    const reason = `push service answered ${status}`;
    return afterMs === undefined ? { outcome: 'retry', reason } : { outcome: 'retry', afterMs, reason };
  }
  const detail = text.trim().slice(0, maxDetailChars) || `push service answered ${status}`;
  return { outcome: 'rejected', status, detail };
}

/** Retry-After is either delay-seconds or an HTTP-date (RFC 9110 §10.2.3). */
function retryAfterMs(value: string | undefined): number | undefined {
  if (value === undefined) return undefined;
  const trimmed = value.trim();
  if (/^\d+$/.test(trimmed)) return Number(trimmed) * 1000;
  const at = Date.parse(trimmed);
  return Number.isNaN(at) ? undefined : Math.max(0, at - Date.now());
}
