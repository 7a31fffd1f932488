import webpush from 'web-push';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { RunningPushService, StandInSubscription } from '../../../api/dev/push-service';
import type { VapidKeys } from '../../../api/lib/vapid-keys';
import {
  alertTopic,
  createPushSender,
  maxPushPayloadBytes,
  type PushMessageOptions,
  type PushSender,
} from '../../../api/lib/web-push-sender';
import { nowSeconds, startTestPushService, vapidSubject } from './push-test-kit';

const alertPush = (alertId = 'al-2041') => ({
  kind: 'alert',
  alertId,
  tankName: 'Lounge reef',
  title: 'Salinity is high',
  body: 'Salinity read 37.2 PSU at 14:10.',
  url: '/tanks/t-lounge/alerts',
});

const criticalAlert = (alertId = 'al-2041'): PushMessageOptions => ({
  ttlSeconds: 3600,
  urgency: 'high',
  topic: alertTopic(alertId),
});

describe('web push sender', () => {
  let service: RunningPushService;
  let vapid: VapidKeys;
  let sender: PushSender;
  let subscription: StandInSubscription;

  beforeAll(async () => {
    service = await startTestPushService();
    vapid = webpush.generateVAPIDKeys();
    sender = createPushSender({
      vapid: { ...vapid, subject: vapidSubject },
      trustedCaPem: service.caCertPem,
    });
  });

  beforeEach(async () => {
    service.clear();
    subscription = await service.createSubscription({ applicationServerKey: vapid.publicKey });
  });

  afterAll(async () => {
    await service.close();
  });

  describe('delivery', () => {
    it('delivers an alert the browser can decrypt back to the JSON sent', async () => {
      const result = await sender.send(subscription, alertPush(), criticalAlert());

      expect(result).toEqual({ outcome: 'delivered' });
      const push = await service.waitFor((p) => p.subscriptionId === subscription.id);
      expect(push.status).toBe(201);
      expect(push.payload).toEqual(alertPush());
    });

    it('signs a VAPID token for the push service origin that expires within 24 hours (RFC 8292 §2)', async () => {
      await sender.send(subscription, alertPush(), criticalAlert());

      const { vapid: check } = await service.waitFor((p) => p.subscriptionId === subscription.id);
      expect(check).toMatchObject({ valid: true, audience: service.origin, subject: vapidSubject });
      expect(check.reason).toBeUndefined();
      expect(check.expiresAt).toBeGreaterThan(nowSeconds());
      expect(check.expiresAt).toBeLessThanOrEqual(nowSeconds() + 24 * 60 * 60);
    });

    it('sends the TTL, Urgency and Topic it was given (RFC 8030 §5.2–5.4)', async () => {
      await sender.send(subscription, alertPush('al-7'), {
        ttlSeconds: 900,
        urgency: 'normal',
        topic: alertTopic('al-7'),
      });

      const push = await service.waitFor((p) => p.subscriptionId === subscription.id);
      expect(push).toMatchObject({ ttl: 900, urgency: 'normal', topic: alertTopic('al-7') });
    });

    it('sends urgency high for a critical alert', async () => {
      await sender.send(subscription, alertPush(), criticalAlert());

      const push = await service.waitFor((p) => p.subscriptionId === subscription.id);
      expect(push.urgency).toBe('high');
    });

    it('sends no Topic when none is given', async () => {
      await sender.send(subscription, { kind: 'subscribed' }, { ttlSeconds: 60, urgency: 'normal' });

      const push = await service.waitFor((p) => p.subscriptionId === subscription.id);
      expect(push.topic).toBeNull();
    });

    it('delivers a payload of exactly the largest size a single record holds (RFC 8291 §4)', async () => {
      const filler = 'x'.repeat(maxPushPayloadBytes - JSON.stringify({ note: '' }).length);

      const result = await sender.send(subscription, { note: filler }, criticalAlert());

      expect(result).toEqual({ outcome: 'delivered' });
    });
  });

  describe('push service answers', () => {
    it('reports gone on 410, so the caller deletes the subscription', async () => {
      service.failNext(subscription.endpoint, 410);

      expect(await sender.send(subscription, alertPush(), criticalAlert())).toEqual({
        outcome: 'gone',
        status: 410,
      });
    });

    it('reports gone on 404 for a subscription the push service does not know (RFC 8030 §7.3)', async () => {
      const unknown = { ...subscription, endpoint: `${service.origin}/push/no-such-subscription` };

      expect(await sender.send(unknown, alertPush(), criticalAlert())).toEqual({
        outcome: 'gone',
        status: 404,
      });
    });

    it('asks for a retry on 500', async () => {
      service.failNext(subscription.id, 500);

      const result = await sender.send(subscription, alertPush(), criticalAlert());

      expect(result).toMatchObject({ outcome: 'retry' });
      expect(result).not.toHaveProperty('afterMs');
    });

    it('asks for a retry after the Retry-After of a 429 (RFC 8030 §8.4, RFC 9110 §10.2.3)', async () => {
      service.failNext(subscription.id, 429, { retryAfterSeconds: 7 });

      expect(await sender.send(subscription, alertPush(), criticalAlert())).toMatchObject({
        outcome: 'retry',
        afterMs: 7000,
      });
    });

    it('delivers again once the planned failures are used up', async () => {
      service.failNext(subscription.id, 500, { times: 2 });

      const outcomes = [];
      for (let i = 0; i < 3; i += 1)
        outcomes.push((await sender.send(subscription, alertPush(), criticalAlert())).outcome);

      expect(outcomes).toEqual(['retry', 'retry', 'delivered']);
    });

    it('asks for a retry when the push service cannot be reached', async () => {
      const closed = await startTestPushService();
      const gone = await closed.createSubscription();
      await closed.close();
      const toClosed = createPushSender({
        vapid: { ...vapid, subject: vapidSubject },
        trustedCaPem: closed.caCertPem,
      });

      expect(await toClosed.send(gone, alertPush(), criticalAlert())).toMatchObject({ outcome: 'retry' });
    });

    it('does not trust the stand-in certificate unless told to', async () => {
      const publicCasOnly = createPushSender({ vapid: { ...vapid, subject: vapidSubject } });

      const result = await publicCasOnly.send(subscription, alertPush(), criticalAlert());

      expect(result).toMatchObject({ outcome: 'retry', reason: expect.stringMatching(/self.signed/i) });
      expect(service.received()).toEqual([]);
    });

    it('reports rejected, not retry, when its VAPID key pair does not match (RFC 8292 §4.2)', async () => {
      const otherPublicKey = webpush.generateVAPIDKeys().publicKey;
      const mismatched = createPushSender({
        vapid: { publicKey: otherPublicKey, privateKey: vapid.privateKey, subject: vapidSubject },
        trustedCaPem: service.caCertPem,
      });
      const unrestricted = await service.createSubscription();

      const result = await mismatched.send(unrestricted, alertPush(), criticalAlert());

      expect(result).toMatchObject({
        outcome: 'rejected',
        status: 403,
        detail: expect.stringMatching(/signature/),
      });
      const push = await service.waitFor((p) => p.subscriptionId === unrestricted.id);
      expect(push.vapid).toMatchObject({ valid: false, reason: expect.stringMatching(/signature/) });
      expect(push.payload).toBeNull();
    });

    it('reports rejected when a restricted subscription gets another server key (RFC 8292 §4.2)', async () => {
      const stranger = createPushSender({
        vapid: { ...webpush.generateVAPIDKeys(), subject: vapidSubject },
        trustedCaPem: service.caCertPem,
      });

      expect(await stranger.send(subscription, alertPush(), criticalAlert())).toMatchObject({
        outcome: 'rejected',
        status: 403,
      });
    });
  });

  describe('caller mistakes', () => {
    it('refuses a payload larger than one record holds (RFC 8291 §4)', async () => {
      const note = 'x'.repeat(maxPushPayloadBytes);

      await expect(sender.send(subscription, { note }, criticalAlert())).rejects.toThrow(RangeError);
      expect(service.received()).toEqual([]);
    });

    it('refuses a topic that is not 1–32 base64url characters (RFC 8030 §5.4)', async () => {
      await expect(
        sender.send(subscription, alertPush(), { ...criticalAlert(), topic: 'alert al-2041 / lounge' }),
      ).rejects.toThrow(/RFC 8030 §5.4/);
    });

    it('refuses a TTL that is not a whole number of seconds', async () => {
      await expect(
        sender.send(subscription, alertPush(), { ...criticalAlert(), ttlSeconds: -1 }),
      ).rejects.toThrow(RangeError);
      await expect(
        sender.send(subscription, alertPush(), { ...criticalAlert(), ttlSeconds: 1.5 }),
      ).rejects.toThrow(RangeError);
    });

    it('refuses an endpoint that is not https (RFC 8030 §3)', async () => {
      const plain = { ...subscription, endpoint: subscription.endpoint.replace('https:', 'http:') };

      await expect(sender.send(plain, alertPush(), criticalAlert())).rejects.toThrow(TypeError);
    });
  });
});

describe('alertTopic', () => {
  it('is the same for the same alert and differs between alerts', () => {
    expect(alertTopic('al-2041')).toBe(alertTopic('al-2041'));
    expect(alertTopic('al-2041')).not.toBe(alertTopic('al-2042'));
  });

  it('fits RFC 8030 §5.4: at most 32 base64url characters, whatever the id', () => {
    for (const id of ['a', 'al-2041', 'ü/€ tank #3 '.repeat(20)]) {
      expect(alertTopic(id)).toMatch(/^[A-Za-z0-9_-]{1,32}$/);
    }
  });
});
