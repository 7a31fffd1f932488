import { X509Certificate } from 'node:crypto';
import { mkdtemp, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import webpush from 'web-push';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
  startPushService,
  type ReceivedPush,
  type RunningPushService,
  type StandInSubscription,
} from '../../../api/dev/push-service';
import type { VapidKeys } from '../../../api/lib/vapid-keys';
import {
  callPushService,
  encryptFor,
  nowSeconds,
  pushTo,
  startTestPushService,
  validClaims,
  vapidAuthorization,
  vapidSubject,
} from './push-test-kit';

describe('push service stand-in', () => {
  let service: RunningPushService;
  let vapid: VapidKeys;
  let subscription: StandInSubscription;

  beforeAll(async () => {
    service = await startTestPushService();
    vapid = webpush.generateVAPIDKeys();
  });

  beforeEach(async () => {
    service.clear();
    subscription = await service.createSubscription();
  });

  afterAll(async () => {
    await service.close();
  });

  const onlyPush = async () => service.waitFor((p) => p.subscriptionId === subscription.id, 2000);

  describe('subscriptions', () => {
    it('hands out an https endpoint on its origin with a P-256 key and a 16-octet auth secret (RFC 8291 §3.2)', () => {
      expect(service.origin).toMatch(/^https:\/\/127\.0\.0\.1:\d+$/);
      expect(subscription.endpoint).toBe(`${service.origin}/push/${subscription.id}`);
      const p256dh = Buffer.from(subscription.keys.p256dh, 'base64url');
      expect(p256dh).toHaveLength(65);
      expect(p256dh[0]).toBe(0x04);
      expect(Buffer.from(subscription.keys.auth, 'base64url')).toHaveLength(16);
    });

    it('serves a self-signed certificate for IP 127.0.0.1', () => {
      const certificate = new X509Certificate(service.caCertPem);

      expect(certificate.checkIP('127.0.0.1')).toBe('127.0.0.1');
      expect(certificate.verify(certificate.publicKey)).toBe(true);
    });

    it('keeps its certificate in its folder and reuses it on the next start', async () => {
      const dir = await mkdtemp(join(tmpdir(), 'brinewatch-push-'));
      const first = await startPushService({ port: 0, dir });
      await first.close();
      const second = await startPushService({ port: 0, dir });
      await second.close();

      expect(second.caCertPem).toBe(first.caCertPem);
      expect((await stat(join(dir, 'push-service.pem'))).mode & 0o777).toBe(0o600);
    });
  });

  describe('POST /push/:subscriptionId', () => {
    it('answers 201 with a Location and the TTL kept, and keeps the decrypted payload (RFC 8030 §5)', async () => {
      const body = encryptFor(subscription, { title: 'Ammonia detected', tank: 'Quarantine' });

      const answer = await pushTo(
        service,
        subscription,
        vapid,
        { TTL: '120', Urgency: 'low', Topic: 'ammonia-qt' },
        body,
      );

      expect(answer.status).toBe(201);
      expect(answer.headers.ttl).toBe('120');
      const push = await onlyPush();
      expect(answer.headers.location).toBe(`${service.origin}/messages/${push.id}`);
      expect(push).toMatchObject<Partial<ReceivedPush>>({
        status: 201,
        problem: null,
        ttl: 120,
        urgency: 'low',
        topic: 'ammonia-qt',
        payload: { title: 'Ammonia detected', tank: 'Quarantine' },
      });
      expect(push.vapid.valid).toBe(true);
    });

    it('serves the pushed message at its Location', async () => {
      const answer = await pushTo(service, subscription, vapid);

      const message = await callPushService(service, String(answer.headers.location));

      expect(message.status).toBe(200);
      expect(JSON.parse(message.text)).toMatchObject({ subscriptionId: subscription.id, status: 201 });
    });

    it('records Urgency and Topic as null when they are not sent', async () => {
      await pushTo(service, subscription, vapid, { Urgency: undefined, Topic: undefined });

      expect(await onlyPush()).toMatchObject({ urgency: null, topic: null });
    });

    it('accepts a push without a body, as RFC 8030 §5 allows', async () => {
      const answer = await pushTo(
        service,
        subscription,
        vapid,
        { 'Content-Encoding': undefined },
        Buffer.alloc(0),
      );

      expect(answer.status).toBe(201);
      expect((await onlyPush()).payload).toBeNull();
    });

    it('answers 404 for a subscription it does not know (RFC 8030 §7.3)', async () => {
      const unknown = { ...subscription, id: 'gone', endpoint: `${service.origin}/push/gone` };

      expect((await pushTo(service, unknown, vapid, {}, encryptFor(subscription, {}))).status).toBe(404);
    });

    it('refuses a push without TTL with 400 (RFC 8030 §5.2)', async () => {
      const answer = await pushTo(service, subscription, vapid, { TTL: undefined });

      expect(answer.status).toBe(400);
      expect(answer.text).toMatch(/TTL/);
      expect(service.received()).toEqual([]);
    });

    it('refuses a TTL that is not delta-seconds with 400 (RFC 8030 §5.2)', async () => {
      expect((await pushTo(service, subscription, vapid, { TTL: '-5' })).status).toBe(400);
      expect((await pushTo(service, subscription, vapid, { TTL: '1h' })).status).toBe(400);
    });

    it('refuses an Urgency outside very-low, low, normal, high with 400 (RFC 8030 §5.3)', async () => {
      expect((await pushTo(service, subscription, vapid, { Urgency: 'urgent' })).status).toBe(400);
      expect((await pushTo(service, subscription, vapid, { Urgency: 'very-low' })).status).toBe(201);
    });

    it('refuses a Topic longer than 32 characters or outside base64url with 400 (RFC 8030 §5.4)', async () => {
      expect((await pushTo(service, subscription, vapid, { Topic: 'a'.repeat(33) })).status).toBe(400);
      expect((await pushTo(service, subscription, vapid, { Topic: 'tank:3' })).status).toBe(400);
      expect((await pushTo(service, subscription, vapid, { Topic: 'a'.repeat(32) })).status).toBe(201);
    });

    it('refuses a body over 4096 bytes with 413 (RFC 8030 §7.2)', async () => {
      expect((await pushTo(service, subscription, vapid, {}, Buffer.alloc(4097, 1))).status).toBe(413);
    });

    it('refuses a body that is not aes128gcm with 415 (RFC 8291 §4)', async () => {
      const answer = await pushTo(service, subscription, vapid, { 'Content-Encoding': 'aesgcm' });

      expect(answer.status).toBe(415);
    });

    it('refuses a body that does not decrypt for the subscription with 400', async () => {
      const other = await service.createSubscription();

      const answer = await pushTo(
        service,
        subscription,
        vapid,
        {},
        encryptFor(other, { title: 'not for you' }),
      );

      expect(answer.status).toBe(400);
      expect(await onlyPush()).toMatchObject({
        status: 400,
        payload: null,
        problem: expect.stringMatching(/decrypt/),
      });
    });

    it('refuses a body whose ECDH key is the VAPID key with 400 (RFC 8292 §3.2)', async () => {
      const body = encryptFor(subscription, { title: 'Reused key' });
      Buffer.from(vapid.publicKey, 'base64url').copy(body, 21);

      const answer = await pushTo(service, subscription, vapid, {}, body);

      expect(answer.status).toBe(400);
      expect(answer.text).toMatch(/RFC 8292 §3\.2/);
    });

    it('answers 405 to anything but POST', async () => {
      expect((await callPushService(service, subscription.endpoint)).status).toBe(405);
    });
  });

  describe('VAPID (RFC 8292)', () => {
    const refusal = async (authorization: string | undefined) => {
      const answer = await pushTo(service, subscription, vapid, { Authorization: authorization });
      return { answer, push: await onlyPush() };
    };

    it('answers 401 when no vapid credentials are sent (RFC 8292 §4.2)', async () => {
      const { answer, push } = await refusal(undefined);

      expect(answer.status).toBe(401);
      expect(push).toMatchObject({ status: 401, payload: null, vapid: { valid: false } });
    });

    it('answers 401 to another auth scheme (RFC 8292 §3)', async () => {
      expect((await refusal('Bearer abc.def.ghi')).answer.status).toBe(401);
    });

    it('accepts the scheme name in any case and unknown parameters (RFC 8292 §3)', async () => {
      const authorization = vapidAuthorization(vapid, validClaims(service)).replace(/^vapid/, 'VAPID');

      const { answer } = await refusal(`${authorization}, realm="ignored"`);

      expect(answer.status).toBe(201);
    });

    it('refuses a token signed by a different key than k with 403', async () => {
      const other = webpush.generateVAPIDKeys();

      const { answer, push } = await refusal(
        vapidAuthorization(vapid, validClaims(service), other.publicKey),
      );

      expect(answer.status).toBe(403);
      expect(push.vapid).toMatchObject({ valid: false, reason: expect.stringMatching(/signature/) });
    });

    it('refuses a token whose aud is not the push service origin with 403 (RFC 8292 §2)', async () => {
      const claims = { ...validClaims(service), aud: 'https://push.example.net' };

      const { answer, push } = await refusal(vapidAuthorization(vapid, claims));

      expect(answer.status).toBe(403);
      expect(push.vapid).toMatchObject({
        valid: false,
        audience: 'https://push.example.net',
        reason: expect.stringMatching(/aud/),
      });
    });

    it('refuses a token whose aud has the right host but another port with 403 (RFC 6454 origin)', async () => {
      const claims = { ...validClaims(service), aud: 'https://127.0.0.1:1' };

      expect((await refusal(vapidAuthorization(vapid, claims))).answer.status).toBe(403);
    });

    it('refuses an expired token with 403 (RFC 8292 §4.2)', async () => {
      const claims = { ...validClaims(service), exp: nowSeconds() - 60 };

      const { answer, push } = await refusal(vapidAuthorization(vapid, claims));

      expect(answer.status).toBe(403);
      expect(push.vapid).toMatchObject({ valid: false, reason: expect.stringMatching(/expired/) });
    });

    it('refuses a token that expires more than 24 hours ahead with 403 (RFC 8292 §2)', async () => {
      const claims = { ...validClaims(service), exp: nowSeconds() + 24 * 60 * 60 + 120 };

      const { answer, push } = await refusal(vapidAuthorization(vapid, claims));

      expect(answer.status).toBe(403);
      expect(push.vapid.reason).toMatch(/24 hours/);
    });

    it('refuses a token without exp with 403 (RFC 8292 §2)', async () => {
      const claims = { aud: service.origin, sub: vapidSubject };

      expect((await refusal(vapidAuthorization(vapid, claims))).answer.status).toBe(403);
    });

    it('refuses a sub that is neither mailto: nor https: with 403 (RFC 8292 §2.1)', async () => {
      const claims = { ...validClaims(service), sub: 'http://brinewatch.test/contact' };

      const { answer, push } = await refusal(vapidAuthorization(vapid, claims));

      expect(answer.status).toBe(403);
      expect(push.vapid.reason).toMatch(/sub/);
    });

    it('accepts an https: sub (RFC 8292 §2.1)', async () => {
      const claims = { ...validClaims(service), sub: 'https://brinewatch.test/contact' };

      expect((await refusal(vapidAuthorization(vapid, claims))).answer.status).toBe(201);
    });

    it('refuses credentials without k with 403 (RFC 8292 §4.2)', async () => {
      const withoutKey = vapidAuthorization(vapid, validClaims(service)).replace(/, k=.*$/, '');

      expect((await refusal(withoutKey)).answer.status).toBe(403);
    });

    it('refuses a k that is not a point on P-256 with 403 (RFC 8292 §3.2)', async () => {
      const point = Buffer.from(vapid.publicKey, 'base64url');
      point[64] = point[64]! ^ 1;

      const { answer } = await refusal(
        vapidAuthorization(vapid, validClaims(service), point.toString('base64url')),
      );

      expect(answer.status).toBe(403);
    });

    it('refuses an unsigned token (alg none) with 403 (RFC 8292 §2)', async () => {
      const encode = (value: object) => Buffer.from(JSON.stringify(value)).toString('base64url');
      const token = `${encode({ typ: 'JWT', alg: 'none' })}.${encode(validClaims(service))}.`;

      const { answer, push } = await refusal(`vapid t=${token}, k=${vapid.publicKey}`);

      expect(answer.status).toBe(403);
      expect(push.vapid.reason).toMatch(/ES256|JWS/);
    });

    it('refuses a subscription restricted to one key when another signs (RFC 8292 §4.2)', async () => {
      subscription = await service.createSubscription({
        applicationServerKey: webpush.generateVAPIDKeys().publicKey,
      });

      const { answer, push } = await refusal(vapidAuthorization(vapid, validClaims(service)));

      expect(answer.status).toBe(403);
      expect(push.vapid.reason).toMatch(/restricted/);
    });
  });

  describe('failNext', () => {
    it('answers the planned status the planned number of times, then delivers', async () => {
      service.failNext(subscription.endpoint, 410, { times: 2 });

      const statuses = [];
      for (let i = 0; i < 3; i += 1) statuses.push((await pushTo(service, subscription, vapid)).status);

      expect(statuses).toEqual([410, 410, 201]);
    });

    it('sends Retry-After with a 429 (RFC 8030 §8.4)', async () => {
      service.failNext(subscription.id, 429, { retryAfterSeconds: 30 });

      const answer = await pushTo(service, subscription, vapid);

      expect(answer.status).toBe(429);
      expect(answer.headers['retry-after']).toBe('30');
    });

    it('throws for a subscription it never handed out', () => {
      expect(() => service.failNext('no-such-subscription', 500)).toThrow(/no subscription/);
    });
  });

  describe('viewer', () => {
    it('lists received pushes with the payload escaped', async () => {
      const body = encryptFor(subscription, { title: '<script>alert("tank")</script>' });
      await pushTo(service, subscription, vapid, {}, body);

      const page = await callPushService(service, `${service.origin}/`);

      expect(page.status).toBe(200);
      expect(page.headers['content-type']).toMatch(/^text\/html/);
      expect(page.headers['content-security-policy']).toMatch(/default-src 'none'/);
      expect(page.text).toContain('&lt;script&gt;');
      expect(page.text).not.toContain('<script>');
    });

    it('serves the same pushes as JSON at /api/received', async () => {
      await pushTo(service, subscription, vapid);

      const list = await callPushService(service, `${service.origin}/api/received`);

      expect(list.status).toBe(200);
      expect(JSON.parse(list.text)).toEqual(service.received());
    });
  });
});
