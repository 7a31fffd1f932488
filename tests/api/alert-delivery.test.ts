import { once } from 'node:events';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { eq } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { DeliveryView } from '@shared/schemas/on-call';
import { createApp } from '../../api/app';
import { deliveries, pushSubscriptions } from '../../api/db/schema/index';
import { createDeps } from '../../api/deps';
import { listenForEvents } from '../../api/lib/event-bus';
import { queues } from '../../api/lib/job-queue';
import { createLogger } from '../../api/lib/logger';
import { afterAlertEvents } from '../../api/services/alerts';
import { evaluateNewReadings } from '../../api/services/alert-engine';
import {
  createCompany,
  createPerson,
  createTank,
  insertReadings,
  type TestPerson,
} from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';

/** Notification delivery end to end, against the real SMTP and push stand-ins (RFC 8030/8291/8292). */
describe('alert notifications', () => {
  let stack: TestStack;
  let owner: TestPerson;
  let ownerBrowser: HttpBrowser;
  let tank: { id: string; companyId: string; name: string };
  let minute = 0;

  beforeAll(async () => {
    stack = await startTestStack({ background: true });
    const { db } = stack.database;
    const company = await createCompany(db);
    owner = await createPerson(db, {
      companyId: company.id,
      role: 'owner',
      issuer: stack.idp.issuer,
      name: 'Nadia Owner',
    });
    tank = await createTank(db, { companyId: company.id, name: 'Lobby reef', owners: [owner] });
    ownerBrowser = new HttpBrowser();
    await signIn(stack, ownerBrowser, owner);
    // Critical alerts by e-mail and push, any hour (quiet hours do not hold critical alerts back anyway).
    await ownerBrowser.visit(`${stack.origin}/api/notifications/preferences`, {
      method: 'PUT',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify({
        push: ['warning', 'critical'],
        email: ['critical'],
        inApp: ['notice', 'warning', 'critical'],
        quietHours: null,
        timeZone: 'Europe/London',
      }),
    });
  });
  afterAll(() => stack.close());
  afterEach(async () => {
    await stack.database.pool.query(
      'delete from alerts; delete from alert_rule_states; delete from readings; delete from push_subscriptions',
    );
    stack.mail.clear();
    stack.push!.clear();
  });

  /** A critical temperature (the mixed-reef template's critical limit is 29 °C), as the readings API would record it. */
  async function raiseCriticalAlert() {
    minute += 1;
    const stored = await insertReadings(stack.database.db, tank, [
      {
        parameter: 'temperature',
        value: 30.2,
        measuredAt: new Date(Date.now() - 60 * 60_000 + minute * 1000),
        source: 'home-test',
      },
    ]);
    const events = await evaluateNewReadings(stack.database.db, tank.id, stored);
    await afterAlertEvents(stack.deps, events);
    return events;
  }

  async function subscribeOwnerToPush() {
    const subscription = await stack.push!.createSubscription();
    const res = await ownerBrowser.visit(`${stack.origin}/api/push/subscriptions`, {
      method: 'POST',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify({ endpoint: subscription.endpoint, keys: subscription.keys }),
    });
    expect(res.status).toBe(201);
    return subscription;
  }

  it('e-mails a critical alert with plain-text and HTML bodies, first steps and a List-Unsubscribe header', async () => {
    await raiseCriticalAlert();
    const mail = await stack.mail.waitFor((m) => m.to.includes(owner.email), 60_000);

    expect(mail.subject).toBe('Critical: Temperature critically high in Lobby reef');
    expect(mail.text).toContain('30.2 °C');
    expect(mail.text).toMatch(/First steps/);
    expect(mail.text).toMatch(/licensed electrician/i);
    expect(mail.html).toContain(`/tanks/${tank.id}`);
    expect(mail.headers['list-unsubscribe']).toBe(`<${stack.origin}/settings/notifications>`);
  });

  it('sends the e-mail exactly once after the mail server comes back', async () => {
    await stack.mail.pause();
    await raiseCriticalAlert();
    // Wait for a failed attempt however long a loaded machine takes (the test's timeout bounds it).
    let pending: typeof deliveries.$inferSelect | undefined;
    while (!pending?.attempts) {
      await new Promise((resolve) => setTimeout(resolve, 250));
      [pending] = await stack.database.db.select().from(deliveries).where(eq(deliveries.channel, 'email'));
    }
    expect(pending).toMatchObject({ status: 'pending' });
    expect(pending!.attempts).toBeGreaterThan(0);

    await stack.mail.resume();
    await stack.mail.waitFor((m) => m.to.includes(owner.email), 60_000);
    await new Promise((resolve) => setTimeout(resolve, 3000));

    expect(stack.mail.messages().filter((m) => m.to.includes(owner.email))).toHaveLength(1);
    const [sent] = await stack.database.db.select().from(deliveries).where(eq(deliveries.id, pending!.id));
    expect(sent!.status).toBe('sent');
  }, 120_000);

  it('pushes an encrypted payload the push service can decrypt, with valid VAPID, TTL, urgency and topic', async () => {
    const subscription = await subscribeOwnerToPush();
    await raiseCriticalAlert();
    const push = await stack.push!.waitFor(
      (p) => p.subscriptionId === subscription.id && p.status === 201,
      10_000,
    );

    expect(push.vapid.valid).toBe(true);
    expect(push.urgency).toBe('high');
    expect(push.ttl).toBeGreaterThan(0);
    expect(push.topic).toMatch(/^[\w-]{1,32}$/);
    expect(push.payload).toMatchObject({
      tankId: tank.id,
      severity: 'critical',
      status: 'open',
      title: 'Temperature critically high in Lobby reef',
      url: `/tanks/${tank.id}`,
    });
  });

  it('forgets a subscription the push service says is gone (410)', async () => {
    const subscription = await subscribeOwnerToPush();
    stack.push!.failNext(subscription.id, 410);
    await raiseCriticalAlert();

    await expect
      .poll(async () => (await stack.database.db.select().from(pushSubscriptions)).length, {
        timeout: 10_000,
      })
      .toBe(0);
  });

  it('retries a push the service could not take (500) until it is delivered', async () => {
    const subscription = await subscribeOwnerToPush();
    stack.push!.failNext(subscription.id, 500, { times: 2 });
    await raiseCriticalAlert();

    const delivered = await stack.push!.waitFor(
      (p) => p.subscriptionId === subscription.id && p.status === 201,
      30_000,
    );
    expect(delivered.payload).toMatchObject({ severity: 'critical' });
    // The push service keeps the message before it answers; the worker records it just after.
    await expect
      .poll(
        async () =>
          (await stack.database.db.select().from(deliveries).where(eq(deliveries.channel, 'push')))[0],
        {
          timeout: 5000,
        },
      )
      .toMatchObject({ status: 'sent', attempts: 3 });
  }, 120_000);

  it('marks a delivery that ran out of retries as failed and lists it for staff', async () => {
    await stack.mail.pause();
    try {
      await raiseCriticalAlert();
      await expect
        .poll(
          async () =>
            (await stack.database.db.select().from(deliveries).where(eq(deliveries.channel, 'email'))).length,
          {
            timeout: 10_000,
          },
        )
        .toBe(1);
      const [stuck] = await stack.database.db
        .select()
        .from(deliveries)
        .where(eq(deliveries.channel, 'email'));
      // pg-boss copies a job that exhausted its retries into the dead-letter queue; do that directly.
      await stack.deps.jobs!.send(queues.dead, { deliveryId: stuck!.id });
      await expect
        .poll(
          async () =>
            (await stack.database.db.select().from(deliveries).where(eq(deliveries.id, stuck!.id)))[0]
              ?.status,
          {
            timeout: 10_000,
          },
        )
        .toBe('failed');

      const technician = await createPerson(stack.database.db, {
        companyId: tank.companyId,
        role: 'technician',
        issuer: stack.idp.issuer,
      });
      const staffBrowser = new HttpBrowser();
      await signIn(stack, staffBrowser, technician);
      const listed = (await (
        await staffBrowser.visit(`${stack.origin}/api/deliveries/failed`)
      ).json()) as DeliveryView[];
      expect(listed.map((d) => d.id)).toContain(stuck!.id);
      expect(listed.find((d) => d.id === stuck!.id)).toMatchObject({
        channel: 'email',
        status: 'failed',
        recipient: 'Nadia Owner',
        kind: 'alert',
        about: expect.stringMatching(/^Alert: Temperature/),
        tankName: 'Lobby reef',
        link: `/tanks/${tank.id}`,
      });
      expect((await ownerBrowser.visit(`${stack.origin}/api/deliveries/failed`)).status).toBe(403);
    } finally {
      await stack.mail.resume();
    }
  }, 120_000);

  it('reaches a live-event client connected to a second API instance on the same database', async () => {
    const logger = createLogger('silent');
    const events = listenForEvents(stack.database.url, logger);
    await events.ready;
    const secondDeps = createDeps({
      env: stack.deps.env,
      database: stack.database,
      logger,
      clock: stack.clock.now,
      events,
    });
    const second = http.createServer(createApp(secondDeps));
    second.listen(0, '127.0.0.1');
    await once(second, 'listening');
    const secondUrl = `http://127.0.0.1:${(second.address() as AddressInfo).port}`;
    try {
      const controller = new AbortController();
      const stream = await fetch(`${secondUrl}/api/events`, {
        headers: { cookie: ownerBrowser.cookieHeader(stack.origin) },
        signal: controller.signal,
      });
      expect(stream.status).toBe(200);
      const reader = stream.body!.getReader();
      let text = '';
      const seen = (async () => {
        while (!text.includes('event: alert')) {
          const { value, done } = await reader.read();
          if (done) break;
          text += new TextDecoder().decode(value);
        }
      })();
      while (!text.includes('event: ready')) await new Promise((resolve) => setTimeout(resolve, 20));

      await raiseCriticalAlert();
      await seen;
      controller.abort();

      expect(text).toContain('event: alert');
      expect(text).toContain(tank.id);
    } finally {
      second.closeAllConnections();
      second.close();
      await events.close();
    }
  });
});
