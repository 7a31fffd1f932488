import { createPrivateKey, sign } from 'node:crypto';
import { mkdtemp } from 'node:fs/promises';
import { request } from 'node:https';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import webpush from 'web-push';
import {
  startPushService,
  type RunningPushService,
  type StandInSubscription,
} from '../../../api/dev/push-service';
import type { VapidKeys } from '../../../api/lib/vapid-keys';

export const vapidSubject = 'mailto:alerts@brinewatch.test';

/** A stand-in with its certificate in a fresh temporary folder. */
export async function startTestPushService(): Promise<RunningPushService> {
  return startPushService({ port: 0, dir: await mkdtemp(join(tmpdir(), 'brinewatch-push-')) });
}

export const nowSeconds = () => Math.floor(Date.now() / 1000);

/**
 * An RFC 8292 `vapid` Authorization value with any claims, signed here with node:crypto rather
 * than web-push, so a test can send tokens web-push refuses to make (expired, wrong audience).
 */
export function vapidAuthorization(
  keys: VapidKeys,
  claims: Record<string, unknown>,
  publicKey = keys.publicKey,
) {
  const point = Buffer.from(keys.publicKey, 'base64url');
  const privateKey = createPrivateKey({
    key: {
      kty: 'EC',
      crv: 'P-256',
      d: keys.privateKey,
      x: point.subarray(1, 33).toString('base64url'),
      y: point.subarray(33).toString('base64url'),
    },
    format: 'jwk',
  });
  const encode = (value: object) => Buffer.from(JSON.stringify(value)).toString('base64url');
  const signingInput = `${encode({ typ: 'JWT', alg: 'ES256' })}.${encode(claims)}`;
  // RFC 7518 §3.4: ES256 signatures are the 64-octet r || s.
  const signature = sign('sha256', Buffer.from(signingInput), { key: privateKey, dsaEncoding: 'ieee-p1363' });
  return `vapid t=${signingInput}.${signature.toString('base64url')}, k=${publicKey}`;
}

export function validClaims(service: RunningPushService): Record<string, unknown> {
  return { aud: service.origin, exp: nowSeconds() + 3600, sub: vapidSubject };
}

/** An RFC 8291 aes128gcm body for the subscription. */
export function encryptFor(subscription: StandInSubscription, payload: object): Buffer {
  const { cipherText } = webpush.encrypt(
    subscription.keys.p256dh,
    subscription.keys.auth,
    JSON.stringify(payload),
    'aes128gcm',
  );
  return cipherText;
}

export interface RawAnswer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  text: string;
}

/** One HTTPS request to the stand-in, trusting its certificate. */
export function callPushService(
  service: RunningPushService,
  url: string,
  init: { method?: string; headers?: Record<string, string>; body?: Buffer } = {},
): Promise<RawAnswer> {
  return new Promise((resolve, reject) => {
    const req = request(
      url,
      { method: init.method ?? 'GET', headers: init.headers, ca: service.caCertPem },
      (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (chunk: string) => (text += chunk));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text }));
      },
    );
    req.on('error', reject);
    req.end(init.body);
  });
}

/** A well-formed push, with any header replaced or dropped (undefined). */
export function pushTo(
  service: RunningPushService,
  subscription: StandInSubscription,
  keys: VapidKeys,
  overrides: Record<string, string | undefined> = {},
  body: Buffer = encryptFor(subscription, { title: 'Nitrate rising in the lounge reef' }),
): Promise<RawAnswer> {
  const headers: Record<string, string | undefined> = {
    TTL: '600',
    'Content-Encoding': 'aes128gcm',
    'Content-Type': 'application/octet-stream',
    Authorization: vapidAuthorization(keys, validClaims(service)),
    ...overrides,
  };
  const sent = Object.fromEntries(
    Object.entries(headers).filter((entry): entry is [string, string] => entry[1] !== undefined),
  );
  return callPushService(service, subscription.endpoint, { method: 'POST', headers: sent, body });
}
