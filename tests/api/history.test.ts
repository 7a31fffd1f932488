import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoId, demoTanks, seedDemo } from '../../api/dev/seed/index';
import { seedDemoReadings } from '../../api/dev/seed/readings';
import { healthForTanks } from '../../api/services/tank-health';
import { readings } from '../../api/db/schema/index';
import { bucketOrigin } from '@shared/readings/buckets';
import { limitTemplates } from '@shared/parameters/limit-templates';
import type { ReadingBucket, ReadingHistory } from '@shared/schemas/readings';
import { days, minutes } from '../helpers/clock';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { startTestStack, type TestStack } from '../helpers/stack';
import { deviceFor, readingsWorld } from './readings-kit';

describe('GET /api/tanks/:tankId/readings (history)', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;
  const end = new Date('2026-11-30T00:00:00.000Z');
  const start = new Date(end.getTime() - days(3));
  const raw: { at: number; value: number }[] = [];

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack, { signIn: ['owner', 'otherOwner', 'technician', 'stranger'] });
    const device = await deviceFor(stack.database.db, world.people.technician, world.tank.id);
    // Three days of 5-minute temperatures with a daily swing and some scatter.
    for (let at = start.getTime(); at < end.getTime(); at += minutes(5)) {
      const value =
        25.5 + 0.4 * Math.sin((2 * Math.PI * (at % days(1))) / days(1)) + ((at / minutes(5)) % 7) / 100;
      raw.push({ at, value });
    }
    await stack.database.db.insert(readings).values(
      raw.map(({ at, value }) => ({
        companyId: world.company.id,
        tankId: world.tank.id,
        parameter: 'temperature' as const,
        value,
        enteredValue: value,
        enteredUnit: '°C',
        measuredAt: new Date(at),
        source: 'device' as const,
        deviceId: device.id,
      })),
    );
    await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/readings`, {
      readings: [
        {
          parameter: 'temperature',
          value: 25.9,
          unit: '°C',
          measuredAt: new Date(end.getTime() - days(1)).toISOString(),
        },
      ],
    });
    await world.call('owner', 'POST', `/api/tanks/${world.tank.id}/readings`, {
      readings: [
        {
          parameter: 'temperature',
          value: 78,
          unit: '°F',
          measuredAt: new Date(end.getTime() - days(2)).toISOString(),
        },
      ],
    });
    raw.push(
      { at: end.getTime() - days(1), value: 25.9 },
      { at: end.getTime() - days(2), value: (78 - 32) / 1.8 },
    );
  });
  afterAll(() => stack.close());

  const history = async (
    query: Record<string, string | number>,
    who: 'owner' | 'otherOwner' | 'stranger' = 'owner',
  ) => {
    const search = new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]));
    return world.call(who, 'GET', `/api/tanks/${world.tank.id}/readings?${search}`);
  };

  it('summarises a window into at most `points` buckets whose min, mean and max match the raw readings', async () => {
    const res = await history({
      parameter: 'temperature',
      from: start.toISOString(),
      to: end.toISOString(),
      points: 100,
    });
    const body = res.body as ReadingHistory;

    expect(res.status).toBe(200);
    expect(body.mode).toBe('buckets');
    expect(body.buckets.length).toBeLessThanOrEqual(100);
    expect(body.total).toBe(raw.length);
    const width = body.bucketMs!;
    const origin = Date.parse(bucketOrigin);
    const expected = new Map<number, number[]>();
    for (const { at, value } of raw) {
      const bucket = origin + Math.floor((at - origin) / width) * width;
      expected.set(bucket, [...(expected.get(bucket) ?? []), value]);
    }
    expect(body.buckets.map((b: ReadingBucket) => Date.parse(b.start))).toEqual(
      [...expected.keys()].sort((a, b) => a - b),
    );
    for (const bucket of body.buckets) {
      const values = expected.get(Date.parse(bucket.start))!;
      expect(bucket.count).toBe(values.length);
      expect(bucket.min).toBeCloseTo(Math.min(...values), 10);
      expect(bucket.max).toBeCloseTo(Math.max(...values), 10);
      expect(bucket.mean).toBeCloseTo(values.reduce((a, b) => a + b, 0) / values.length, 10);
    }
  });

  it('keeps visit and home-test readings one by one beside the buckets, and counts sources per bucket', async () => {
    const res = await history({
      parameter: 'temperature',
      from: start.toISOString(),
      to: end.toISOString(),
      points: 100,
    });
    const body = res.body as ReadingHistory;

    expect(body.readings.map((r) => [r.source, r.enteredUnit])).toEqual([
      ['home-test', '°F'],
      ['visit', '°C'],
    ]);
    expect(body.readings[0]!.recordedBy).toBe(world.people.owner.name);
    const sources = body.buckets.reduce(
      (sum, b) => ({
        device: sum.device + b.bySource.device,
        home: sum.home + b.bySource['home-test'],
        visit: sum.visit + b.bySource.visit,
      }),
      { device: 0, home: 0, visit: 0 },
    );
    expect(sources).toEqual({ device: raw.length - 2, home: 1, visit: 1 });
    expect(body.latest!.measuredAt).toBe(new Date(end.getTime() - minutes(5)).toISOString());
  });

  it('gives the raw readings when there are no more than `points`', async () => {
    const from = new Date(end.getTime() - minutes(60));
    const res = await history({
      parameter: 'temperature',
      from: from.toISOString(),
      to: end.toISOString(),
      points: 20,
    });
    const body = res.body as ReadingHistory;

    expect(body.mode).toBe('raw');
    expect(body.buckets).toEqual([]);
    expect(body.readings).toHaveLength(12);
    expect(body.readings[0]).toMatchObject({
      source: 'device',
      recordedBy: 'Probe',
      measuredAt: from.toISOString(),
    });
  });

  it('brings the limits in force, the template until the tank has its own', async () => {
    const query = { parameter: 'temperature', from: start.toISOString(), to: end.toISOString() };
    const before = await history(query);
    const own = { warnLow: 25, warnHigh: 26.5, critLow: 23, critHigh: 28 };
    await world.call('technician', 'PUT', `/api/tanks/${world.tank.id}/limits`, {
      limits: { temperature: own },
    });
    const after = await history(query);

    expect(before.body.limits).toEqual({
      limits: limitTemplates['mixed-reef'].temperature,
      source: 'template',
    });
    expect(after.body.limits).toEqual({ limits: own, source: 'tank' });
  });

  it('refuses a window that ends before it starts, and too few points', async () => {
    const backwards = await history({
      parameter: 'temperature',
      from: end.toISOString(),
      to: start.toISOString(),
    });
    const tiny = await history({
      parameter: 'temperature',
      from: start.toISOString(),
      to: end.toISOString(),
      points: 2,
    });

    expect(backwards.status).toBe(400);
    expect(backwards.body.error.issues[0].path).toBe('query.to');
    expect(tiny.status).toBe(400);
  });

  it("answers another owner's and another company's tank with 404", async () => {
    const query = { parameter: 'temperature', from: start.toISOString(), to: end.toISOString() };
    expect((await history(query, 'otherOwner')).status).toBe(404);
    expect((await history(query, 'stranger')).status).toBe(404);
  });
});

describe('seedDemoReadings', () => {
  let database: TestDatabase;
  beforeAll(async () => {
    database = await createTestDatabase();
    await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001' });
  });
  afterAll(() => database.drop());

  it('writes a year of demo history once, with the stories it tells', async () => {
    const now = new Date();
    await seedDemoReadings(database.db, now);
    const count = async () =>
      (await database.db.execute<{ n: number }>(sql`select count(*)::int as n from readings`)).rows[0]!.n;
    const first = await count();
    await seedDemoReadings(database.db, now);

    expect(await count()).toBe(first);
    // A device on two tanks: temperature, salinity, pH and ORP every 5 minutes for a year.
    const perDevice = await database.db.execute<{ n: number }>(
      sql`select count(*)::int as n from readings where source = 'device' group by device_id, parameter`,
    );
    expect(perDevice.rows.map((r) => r.n)).toEqual(Array(8).fill(365 * 288 + 1));
    const health = await healthForTanks(
      database.db,
      demoTanks.map((t) => demoId(t.key)),
      now,
    );
    expect(Object.fromEntries(demoTanks.map((t) => [t.key, health.get(demoId(t.key))!.status]))).toEqual({
      'ashdown-reef': 'healthy',
      // Readings inside the limits but outside what its livestock tolerate, with the alerts they
      // raised: watch, no longer "healthy" beside open alerts (shared/tanks/status.ts).
      'ashdown-river': 'watch',
      'quayside-reef': 'healthy',
      // Salinity creeping up from evaporation, still going on.
      'saltfig-lagoon': 'watch',
      'ferrous-planted': 'watch',
    });
    for (const key of ['ashdown-river', 'ferrous-planted', 'saltfig-lagoon']) {
      expect([key, health.get(demoId(key))!.statusReason]).toEqual([key, expect.stringMatching(/\S/)]);
    }
    const extremes = await database.db.execute<{
      key: string;
      parameter: string;
      low: number;
      high: number;
    }>(sql`
      select tank_id as key, parameter, min(value) as low, max(value) as high from readings
      where (tank_id = ${demoId('quayside-reef')} and parameter = 'temperature')
         or (tank_id = ${demoId('ashdown-reef')} and parameter = 'alkalinity')
      group by 1, 2`);
    const byParameter = Object.fromEntries(extremes.rows.map((r) => [r.parameter, r]));
    // The heater failing: below the critical 22.5 °C of a mixed reef.
    expect(byParameter.temperature!.low).toBeLessThan(22.5);
    // The alkalinity swing: down past the warning band and back over it.
    expect(byParameter.alkalinity!.low).toBeLessThan(7);
    expect(byParameter.alkalinity!.high).toBeGreaterThan(11);
    const limits = await database.db.execute<{ n: number }>(sql`select count(*)::int as n from tank_limits`);
    expect(limits.rows[0]!.n).toBeGreaterThan(0);
  }, 240_000);
});
