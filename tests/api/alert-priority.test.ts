import type { PgBoss } from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { queues, startJobQueue } from '../../api/lib/job-queue';
import { createLogger } from '../../api/lib/logger';
import { evaluateNewReadings } from '../../api/services/alert-engine';
import { afterAlertEvents } from '../../api/services/alerts';
import { createCompany, createPerson, createTank, insertReadings } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

/*
 * A backlog of warnings (say a whole site's devices falling silent after an outage) must not hold
 * a critical reading back: its fan-out job goes to the front of the queue. The queue here has no
 * workers, so the order jobs would be taken in is read with pg-boss's own fetch.
 */
describe('alert fan-out priority', () => {
  let stack: TestStack;
  let boss: PgBoss;

  beforeAll(async () => {
    stack = await startTestStack();
    boss = await startJobQueue(stack.database.url, createLogger('silent'));
  }, 120_000);

  afterAll(async () => {
    await boss?.stop({ graceful: false, timeout: 2000 });
    await stack?.close();
  });

  it('takes a critical alert ahead of warnings raised before it', async () => {
    const { db } = stack.database;
    const company = await createCompany(db);
    const owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer: stack.idp.issuer });
    const measuredAt = new Date(Date.now() - 10 * 60_000);
    const warned: string[] = [];
    // The mixed-reef template (shared/parameters/limit-templates.ts): warning above 27.5 °C, critical above 29.
    for (let i = 0; i < 4; i++) {
      const tank = await createTank(db, { companyId: company.id, name: `Warm tank ${i}`, owners: [owner] });
      const stored = await insertReadings(db, tank, [
        { parameter: 'temperature', value: 28, measuredAt, source: 'home-test' },
      ]);
      warned.push(...(await evaluateNewReadings(db, tank.id, stored)));
    }
    const hot = await createTank(db, { companyId: company.id, name: 'Hot tank', owners: [owner] });
    const critical = await evaluateNewReadings(
      db,
      hot.id,
      await insertReadings(db, hot, [
        { parameter: 'temperature', value: 30.5, measuredAt, source: 'home-test' },
      ]),
    );
    expect(warned).toHaveLength(4);
    expect(critical).toHaveLength(1);

    const deps = { ...stack.deps, jobs: boss };
    await afterAlertEvents(deps, warned);
    await afterAlertEvents(deps, critical);

    const order: string[] = [];
    for (let i = 0; i < 5; i++) {
      const [job] = await boss.fetch<{ eventId: string }>(queues.fanOut);
      expect(job).toBeDefined();
      order.push(job!.data.eventId);
    }
    expect(order[0]).toBe(critical[0]);
    expect(new Set(order.slice(1))).toEqual(new Set(warned));
  });
});
