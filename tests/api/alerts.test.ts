import { and, eq, ne } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { alerts, notifications } from '../../api/db/schema/index';
import { freeAmmoniaCompanionMaxAgeMs } from '@shared/alerts/free-ammonia';
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
import { minutes } from '../helpers/clock';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';

/** Mixed-reef template (common practice): temperature warning above 27.5 °C, critical above 29 °C. */
describe('alerts from readings', () => {
  let stack: TestStack;
  let owner: TestPerson;
  let technician: TestPerson;
  let otherOwner: TestPerson;
  let tank: { id: string; companyId: string };
  let ownerBrowser: HttpBrowser;
  let techBrowser: HttpBrowser;
  let otherBrowser: HttpBrowser;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const company = await createCompany(db);
    owner = await createPerson(db, {
      companyId: company.id,
      role: 'owner',
      issuer: stack.idp.issuer,
      name: 'Opal Owner',
    });
    otherOwner = await createPerson(db, { companyId: company.id, role: 'owner', issuer: stack.idp.issuer });
    technician = await createPerson(db, {
      companyId: company.id,
      role: 'technician',
      issuer: stack.idp.issuer,
    });
    tank = await createTank(db, { companyId: company.id, name: 'Surgery reef', owners: [owner] });
    ownerBrowser = new HttpBrowser();
    techBrowser = new HttpBrowser();
    otherBrowser = new HttpBrowser();
    await signIn(stack, ownerBrowser, owner);
    await signIn(stack, techBrowser, technician);
    await signIn(stack, otherBrowser, otherOwner);
  });
  afterAll(() => stack.close());
  afterEach(async () => {
    await stack.database.pool.query(
      'delete from alerts; delete from alert_rule_states; delete from readings',
    );
  });

  async function record(list: Parameters<typeof insertReadings>[2]) {
    const stored = await insertReadings(stack.database.db, tank, list);
    const events = await evaluateNewReadings(stack.database.db, tank.id, stored);
    await afterAlertEvents(stack.deps, events);
    return events;
  }

  const get = async (browser: HttpBrowser, path: string) => {
    const res = await browser.visit(`${stack.origin}${path}`);
    return { status: res.status, body: (await res.json()) as never };
  };
  const post = async (browser: HttpBrowser, path: string, body: unknown) => {
    const res = await browser.visit(`${stack.origin}${path}`, {
      method: 'POST',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
    return { status: res.status, body: (await res.json()) as Record<string, unknown> };
  };

  it('opens one critical alert for a manual reading above the critical limit, and tells the owner in the app', async () => {
    await record([{ parameter: 'temperature', value: 29.4, measuredAt: new Date(), source: 'home-test' }]);

    const board = await get(techBrowser, '/api/alerts');
    expect(board.body).toEqual([
      expect.objectContaining({
        kind: 'limit',
        parameter: 'temperature',
        severity: 'critical',
        status: 'open',
        value: 29.4,
      }),
    ]);
    const inbox = await get(ownerBrowser, '/api/notifications');
    expect(inbox.body).toMatchObject({
      unread: 1,
      items: [{ severity: 'critical', link: `/tanks/${tank.id}` }],
    });
    expect((inbox.body as { items: { title: string }[] }).items[0]!.title).toMatch(/Temperature/);
  });

  it("hides another owner's alerts: a 404 for the alert and an empty board", async () => {
    await record([{ parameter: 'temperature', value: 29.4, measuredAt: new Date(), source: 'home-test' }]);
    const [alert] = await stack.database.db.select().from(alerts);

    expect((await get(otherBrowser, '/api/alerts')).body).toEqual([]);
    expect((await get(otherBrowser, `/api/alerts/${alert!.id}`)).status).toBe(404);
    expect((await post(otherBrowser, `/api/alerts/${alert!.id}/acknowledge`, {})).status).toBe(403);
  });

  it('escalates the same alert from warning to critical, and records each step', async () => {
    const t0 = Date.now() - minutes(30);
    await record([{ parameter: 'temperature', value: 27.8, measuredAt: new Date(t0), source: 'home-test' }]);
    await record([
      { parameter: 'temperature', value: 29.3, measuredAt: new Date(t0 + minutes(10)), source: 'home-test' },
    ]);

    const rows = await stack.database.db.select().from(alerts).where(eq(alerts.kind, 'limit'));
    expect(rows).toHaveLength(1);
    expect(rows[0]!.severity).toBe('critical');
    const detail = await get(techBrowser, `/api/alerts/${rows[0]!.id}`);
    expect((detail.body as { events: { type: string }[] }).events.map((e) => e.type)).toEqual([
      'opened',
      'escalated',
    ]);
  });

  it('opens at most one alert for 100 device readings wobbling ±0.05 around the warning limit', async () => {
    const start = Date.now() - minutes(500);
    const series = Array.from({ length: 100 }, (_, i) => ({
      parameter: 'temperature' as const,
      value: 27.5 + (i % 2 === 0 ? 0.05 : -0.05),
      measuredAt: new Date(start + i * minutes(5)),
    }));
    for (let i = 0; i < series.length; i += 10) await record(series.slice(i, i + 10));

    const rows = await stack.database.db.select().from(alerts);
    expect(rows.length).toBeLessThanOrEqual(1);
  });

  it('resolves the alert by itself once the water is back inside the limit by the deadband', async () => {
    const t0 = Date.now() - minutes(30);
    await record([{ parameter: 'temperature', value: 28.0, measuredAt: new Date(t0), source: 'home-test' }]);
    await record([
      { parameter: 'temperature', value: 27.4, measuredAt: new Date(t0 + minutes(5)), source: 'home-test' },
    ]);
    expect((await stack.database.db.select().from(alerts))[0]!.status).toBe('open');

    await record([
      { parameter: 'temperature', value: 27.0, measuredAt: new Date(t0 + minutes(10)), source: 'home-test' },
    ]);

    expect((await stack.database.db.select().from(alerts))[0]!.status).toBe('resolved');
  });

  it('lets staff acknowledge with a note and resolve with a note; owners see the timeline', async () => {
    await record([{ parameter: 'temperature', value: 29.4, measuredAt: new Date(), source: 'home-test' }]);
    const [alert] = await stack.database.db.select().from(alerts);

    const acked = await post(techBrowser, `/api/alerts/${alert!.id}/acknowledge`, {
      note: 'Calling the client',
    });
    expect(acked.status).toBe(200);
    expect(acked.body).toMatchObject({ status: 'acknowledged', acknowledgedBy: technician.name });
    expect((await post(techBrowser, `/api/alerts/${alert!.id}/acknowledge`, {})).status).toBe(409);
    expect((await post(techBrowser, `/api/alerts/${alert!.id}/resolve`, {})).status).toBe(400);
    const resolved = await post(techBrowser, `/api/alerts/${alert!.id}/resolve`, { note: 'Heater replaced' });
    expect(resolved.body).toMatchObject({ status: 'resolved' });

    const timeline = await get(ownerBrowser, `/api/alerts/${alert!.id}`);
    expect((timeline.body as { events: { type: string; note: string | null }[] }).events).toEqual([
      expect.objectContaining({ type: 'opened' }),
      expect.objectContaining({ type: 'acknowledged', note: 'Calling the client' }),
      expect.objectContaining({ type: 'resolved', note: 'Heater replaced' }),
    ]);
  });

  it('waits out the dwell for device data before opening', async () => {
    const start = Date.now() - minutes(60);
    await record([{ parameter: 'temperature', value: 29.2, measuredAt: new Date(start) }]);
    expect(await stack.database.db.select().from(alerts)).toHaveLength(0);
    await record([
      { parameter: 'temperature', value: 29.3, measuredAt: new Date(start + minutes(5)) },
      { parameter: 'temperature', value: 29.3, measuredAt: new Date(start + minutes(10)) },
    ]);
    expect(await stack.database.db.select().from(alerts)).toHaveLength(1);
  });

  it('opens one alert for a reading beyond a limit and outside what the livestock tolerate, naming both', async () => {
    // Nine inhabitants that all tolerate at most 27–28 °C; the tank warns above 27.5 °C.
    const species = [
      'hammer-coral',
      'ocellaris-clownfish',
      'green-chromis',
      'yellow-tang',
      'zoanthids',
      'firefish',
      'royal-gramma',
      'six-line-wrasse',
      'montipora',
    ];
    await stack.database.pool.query(
      `insert into livestock (company_id, tank_id, catalogue_species_id, status)
       select $1, $2, unnest($3::text[]), 'stable'`,
      [tank.companyId, tank.id, species],
    );
    try {
      await record([{ parameter: 'temperature', value: 28.6, measuredAt: new Date(), source: 'home-test' }]);

      const all = await stack.database.db.select().from(alerts);
      expect(all).toHaveLength(1);
      expect(all[0]).toMatchObject({ kind: 'limit', parameter: 'temperature', severity: 'warning' });
      expect(all[0]!.body).toMatch(/^Temperature 28\.6 °C is above the warning limit of 27\.5 °C\. /);
      // The tightest end of their ranges is the yellow tang's 27 °C; two are named, the rest counted.
      expect(all[0]!.body).toMatch(
        /It is also above what the [a-z -]+, [a-z -]+ and 7 more tolerate \(max 27 °C\)\. Measured /,
      );
    } finally {
      await stack.database.pool.query('delete from livestock where tank_id = $1', [tank.id]);
    }
  });

  it('names the inhabitant a reading inside the limits does not suit, in one livestock alert', async () => {
    await stack.database.pool.query(
      `insert into livestock (company_id, tank_id, catalogue_species_id, status) values ($1, $2, 'yellow-tang', 'stable')`,
      [tank.companyId, tank.id],
    );
    try {
      await record([{ parameter: 'temperature', value: 27.3, measuredAt: new Date(), source: 'home-test' }]);

      const all = await stack.database.db.select().from(alerts);
      expect(all).toHaveLength(1);
      expect(all[0]).toMatchObject({ kind: 'livestock', parameter: 'temperature', severity: 'warning' });
      expect(all[0]!.body).toMatch(
        /^Temperature 27\.3 °C is above what the yellow tang \(Zebrasoma flavescens\) tolerates \(max 27 °C\)\./,
      );
    } finally {
      await stack.database.pool.query('delete from livestock where tank_id = $1', [tank.id]);
    }
  });

  it('hands a livestock alert over to the limit alert once the limit is crossed too', async () => {
    await stack.database.pool.query(
      `insert into livestock (company_id, tank_id, catalogue_species_id, status) values ($1, $2, 'yellow-tang', 'stable')`,
      [tank.companyId, tank.id],
    );
    try {
      const at = Date.now() - minutes(30);
      await record([
        { parameter: 'temperature', value: 27.3, measuredAt: new Date(at), source: 'home-test' },
      ]);
      await record([
        {
          parameter: 'temperature',
          value: 27.9,
          measuredAt: new Date(at + minutes(20)),
          source: 'home-test',
        },
      ]);

      const open = await stack.database.db.select().from(alerts).where(ne(alerts.status, 'resolved'));
      expect(open).toHaveLength(1);
      expect(open[0]).toMatchObject({ kind: 'limit', parameter: 'temperature' });
      expect(open[0]!.body).toMatch(/yellow tang/);
      const [livestockAlert] = await stack.database.db
        .select()
        .from(alerts)
        .where(eq(alerts.kind, 'livestock'));
      expect(livestockAlert?.status).toBe('resolved');
    } finally {
      await stack.database.pool.query('delete from livestock where tank_id = $1', [tank.id]);
    }
  });

  it('warns about free ammonia worked out from total ammonia, pH and temperature', async () => {
    const at = Date.now() - minutes(10);
    await record([
      { parameter: 'ph', value: 8.3, measuredAt: new Date(at), source: 'home-test' },
      { parameter: 'temperature', value: 26, measuredAt: new Date(at), source: 'home-test' },
      { parameter: 'salinity', value: 35, measuredAt: new Date(at), source: 'home-test' },
    ]);
    await record([
      { parameter: 'ammonia', value: 1, measuredAt: new Date(at + minutes(1)), source: 'home-test' },
    ]);

    const rows = await stack.database.db.select().from(alerts).where(eq(alerts.kind, 'free-ammonia'));
    expect(rows).toEqual([expect.objectContaining({ severity: 'critical', status: 'open' })]);
  });

  it('draws no free-ammonia verdict from a pH and temperature older than a week', async () => {
    const at = Date.now() - minutes(10);
    const older = at - freeAmmoniaCompanionMaxAgeMs - minutes(1);
    await record([
      { parameter: 'ph', value: 8.3, measuredAt: new Date(older), source: 'home-test' },
      { parameter: 'temperature', value: 26, measuredAt: new Date(older), source: 'home-test' },
    ]);
    await record([{ parameter: 'ammonia', value: 1, measuredAt: new Date(at), source: 'home-test' }]);
    expect(await stack.database.db.select().from(alerts).where(eq(alerts.kind, 'free-ammonia'))).toEqual([]);

    // The same pair a minute inside the week counts.
    const inside = at - freeAmmoniaCompanionMaxAgeMs + minutes(1);
    await record([
      { parameter: 'ph', value: 8.3, measuredAt: new Date(inside), source: 'home-test' },
      { parameter: 'temperature', value: 26, measuredAt: new Date(inside), source: 'home-test' },
    ]);
    await record([
      { parameter: 'ammonia', value: 1, measuredAt: new Date(at + minutes(1)), source: 'home-test' },
    ]);
    const rows = await stack.database.db.select().from(alerts).where(eq(alerts.kind, 'free-ammonia'));
    expect(rows).toEqual([expect.objectContaining({ severity: 'critical', status: 'open' })]);
  });

  it('opens a rate alert when temperature climbs more than 1 °C within an hour', async () => {
    const at = Date.now() - minutes(40);
    await record([
      { parameter: 'temperature', value: 25.0, measuredAt: new Date(at), source: 'home-test' },
      { parameter: 'temperature', value: 26.4, measuredAt: new Date(at + minutes(30)), source: 'home-test' },
    ]);
    const rows = await stack.database.db
      .select()
      .from(alerts)
      .where(and(eq(alerts.kind, 'rate')));
    expect(rows).toEqual([expect.objectContaining({ parameter: 'temperature', status: 'open' })]);
    const sent = await stack.database.db.select().from(notifications);
    expect(sent.length).toBeGreaterThan(0);
  });

  it('opens a rate alert on a tank’s own rule of 0.5 °C within an hour, where the default rule would not', async () => {
    const { db } = stack.database;
    const strict = await createTank(db, { companyId: tank.companyId, name: 'Nursery reef', owners: [owner] });
    const ruleSet = await techBrowser.visit(`${stack.origin}/api/tanks/${strict.id}/limits`, {
      method: 'PUT',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify({ rates: { temperature: { maxChange: 0.5, perHours: 1 } } }),
    });
    expect(ruleSet.status).toBe(200);
    const at = Date.now() - minutes(40);
    const climb = [
      {
        parameter: 'temperature' as const,
        value: 25.0,
        measuredAt: new Date(at),
        source: 'home-test' as const,
      },
      {
        parameter: 'temperature' as const,
        value: 25.7,
        measuredAt: new Date(at + minutes(30)),
        source: 'home-test' as const,
      },
    ];

    // The same climb on a tank under the default rule (1 °C per hour) and on the strict tank.
    for (const target of [tank, strict]) {
      const stored = await insertReadings(db, target, climb);
      await afterAlertEvents(stack.deps, await evaluateNewReadings(db, target.id, stored));
    }

    const rows = await db.select().from(alerts).where(eq(alerts.kind, 'rate'));
    expect(rows).toEqual([
      expect.objectContaining({
        tankId: strict.id,
        parameter: 'temperature',
        status: 'open',
        limitValue: 0.5,
      }),
    ]);
    expect(rows[0]!.body).toMatch(/limit of 0\.5 °C an hour/);
  });
});
