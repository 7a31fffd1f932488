import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'drizzle-orm';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { migrationsFolder } from '../../api/db/migrations';
import { maintainReadingPartitions } from '../../api/services/reading-partitions';
import { createDatabaseFrom } from '../helpers/db';
import { days } from '../helpers/clock';
import { startTestStack, type TestStack } from '../helpers/stack';
import { deviceFor, readingsWorld } from './readings-kit';

/**
 * `readings` is partitioned by month (drizzle/0020): the months ahead are made by the daily job,
 * device readings past the retention setting go while people's readings and the summaries stay,
 * and a device's batch stays idempotent across months.
 */
describe('readings by month', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack, { signIn: ['owner'] });
  });
  afterAll(() => stack.close());

  const partitions = async () =>
    (
      await stack.database.db.execute<{ name: string }>(sql`
        select c.relname as name from pg_inherits i join pg_class c on c.oid = i.inhrelid
        where i.inhparent = 'readings'::regclass order by 1`)
    ).rows.map((row) => row.name);
  const monthName = (date: Date) =>
    `readings_y${date.getUTCFullYear()}m${String(date.getUTCMonth() + 1).padStart(2, '0')}`;

  it('makes the months ahead, once', async () => {
    stack.clock.advance(days(200));
    try {
      const later = stack.clock.now();
      const first = await maintainReadingPartitions(stack.deps);
      expect(first.made).toBeGreaterThan(0);
      const names = await partitions();
      for (let ahead = 0; ahead <= 3; ahead += 1) {
        expect(names).toContain(
          monthName(new Date(Date.UTC(later.getUTCFullYear(), later.getUTCMonth() + ahead, 1))),
        );
      }
      expect(names).toContain('readings_older');
      expect((await maintainReadingPartitions(stack.deps)).made).toBe(0);
    } finally {
      stack.clock.reset();
    }
  });

  it('keeps a device batch idempotent across a month boundary', async () => {
    const device = await deviceFor(stack.database.db, world.people.technician, world.tank.id, 'Month probe');
    const now = stack.clock.now();
    const boundary = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), 1);
    const batch = [-10, -5, 0, 5].map((minutes) => ({
      parameter: 'temperature',
      value: 25.4,
      unit: '°C',
      measuredAt: new Date(boundary + minutes * 60_000).toISOString(),
    }));
    const send = () =>
      fetch(`${stack.origin}/api/ingest/readings`, {
        method: 'POST',
        headers: { authorization: `Bearer ${device.token}`, 'content-type': 'application/json' },
        body: JSON.stringify({ readings: batch }),
      }).then(async (res) => ({ status: res.status, body: await res.json() }));
    expect((await send()).body).toMatchObject({ accepted: 4, duplicate: 0 });
    expect((await send()).body).toMatchObject({ accepted: 0, duplicate: 4 });
    const stored = await stack.database.db.execute<{ month: string; n: number }>(sql`
      select c.relname as month, count(*)::int as n from readings r join pg_class c on c.oid = r.tableoid
      where r.device_id = ${device.id} group by 1 order by 1`);
    expect(stored.rows.map((row) => row.n)).toEqual([2, 2]);
  });

  it('drops device readings past the retention, keeping people’s readings and the summaries', async () => {
    const { db } = stack.database;
    const device = await deviceFor(db, world.people.technician, world.tank.id, 'Old probe');
    const now = stack.clock.now();
    const old = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - 8, 12, 6));
    const recent = new Date(now.getTime() - days(2));
    await db.execute(
      sql`select ensure_reading_partitions(${old.toISOString()}::timestamptz, ${old.toISOString()}::timestamptz)`,
    );
    for (const [at, source, deviceId] of [
      [old, 'device', device.id],
      [new Date(old.getTime() + 300_000), 'device', device.id],
      [new Date(old.getTime() + 600_000), 'home-test', null],
      [recent, 'device', device.id],
    ] as const) {
      await db.execute(sql`
        insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source, device_id)
        values (${world.company.id}, ${world.tank.id}, 'ph', 8.1, 8.1, 'pH', ${at.toISOString()}::timestamptz, ${source}, ${deviceId})`);
    }
    const dailyBefore = await db.execute<{ count: number }>(sql`
      select count from reading_rollups_daily
      where tank_id = ${world.tank.id} and parameter = 'ph' and bucket_start = date_trunc('day', ${old.toISOString()}::timestamptz at time zone 'UTC') at time zone 'UTC'`);
    expect(dailyBefore.rows[0]?.count).toBe(3);

    const result = await maintainReadingPartitions({
      ...stack.deps,
      env: { ...stack.deps.env, READINGS_DEVICE_RETENTION_MONTHS: 6 },
    });
    expect(result.trimmed).toBe(2);
    const left = await db.execute<{ source: string; at: string }>(sql`
      select source, measured_at::text as at from readings
      where tank_id = ${world.tank.id} and parameter = 'ph' order by measured_at`);
    expect(left.rows.map((row) => row.source)).toEqual(['home-test', 'device']);
    const dailyAfter = await db.execute<{ count: number }>(sql`
      select count from reading_rollups_daily
      where tank_id = ${world.tank.id} and parameter = 'ph' and bucket_start = date_trunc('day', ${old.toISOString()}::timestamptz at time zone 'UTC') at time zone 'UTC'`);
    expect(dailyAfter.rows[0]?.count).toBe(3);
  });

  it('takes an old import into readings_older and still charts it', async () => {
    const measuredAt = '2021-03-04T09:00:00.000Z';
    const res = await world.call('owner', 'POST', `/api/tanks/${world.tank.id}/readings`, {
      readings: [{ parameter: 'calcium', value: 420, unit: 'mg/L', measuredAt }],
    });
    expect(res.status).toBe(201);
    const where = await stack.database.db.execute<{ month: string }>(sql`
      select c.relname as month from readings r join pg_class c on c.oid = r.tableoid
      where r.tank_id = ${world.tank.id} and r.parameter = 'calcium'`);
    expect(where.rows).toEqual([{ month: 'readings_older' }]);
    const history = await world.call(
      'owner',
      'GET',
      `/api/tanks/${world.tank.id}/readings?parameter=calcium&from=2021-03-01T00:00:00.000Z&to=2021-03-31T00:00:00.000Z&points=100`,
    );
    expect(history.body.readings.map((r: { value: number }) => r.value)).toEqual([420]);
  });
});

describe('the migration to monthly partitions', () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-migrations-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('moves every reading across with its id, and ids continue after them', async () => {
    // The migrations up to the one before partitioning, then the rest.
    cpSync(migrationsFolder, dir, { recursive: true });
    const journalFile = path.join(dir, 'meta', '_journal.json');
    const journal = JSON.parse(readFileSync(journalFile, 'utf8')) as { entries: { tag: string }[] };
    const cut = journal.entries.findIndex((entry) => entry.tag.endsWith('_readings-by-month'));
    expect(cut).toBeGreaterThan(0);
    writeFileSync(journalFile, JSON.stringify({ ...journal, entries: journal.entries.slice(0, cut) }));

    const database = await createDatabaseFrom(inject('postgresBaseUrl'), { template: 'template0' });
    try {
      const { db } = database;
      await migrate(db, { migrationsFolder: dir });
      const [company] = (
        await db.execute<{ id: string }>(
          sql`insert into companies (slug, name, time_zone) values ('m', 'Moved Aquatics', 'Europe/London') returning id`,
        )
      ).rows;
      const [tank] = (
        await db.execute<{ id: string }>(
          sql`insert into tanks (company_id, name) values (${company!.id}, 'Moved reef') returning id`,
        )
      ).rows;
      await db.execute(sql`
        insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source)
        select ${company!.id}, ${tank!.id}, 'temperature', 25 + n / 100.0, 25 + n / 100.0, '°C',
          now() - n * interval '1 day', 'home-test'
        from generate_series(1, 500) n`);
      const before = await db.execute<{ id: number; at: string }>(
        sql`select id, measured_at::text as at from readings order by id`,
      );

      await migrate(db, { migrationsFolder });
      const after = await db.execute<{ id: number; at: string }>(
        sql`select id, measured_at::text as at from readings order by id`,
      );
      expect(after.rows).toEqual(before.rows);
      const kind = await db.execute<{ kind: string }>(
        sql`select relkind::text as kind from pg_class where relname = 'readings'`,
      );
      expect(kind.rows[0]?.kind).toBe('p');
      const next = await db.execute<{ id: number }>(sql`
        insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source)
        values (${company!.id}, ${tank!.id}, 'ph', 8.2, 8.2, 'pH', now(), 'home-test') returning id`);
      expect(Number(next.rows[0]!.id)).toBe(Math.max(...before.rows.map((row) => Number(row.id))) + 1);
      const latest = await db.execute<{ n: number }>(
        sql`select count(*)::int as n from latest_readings where tank_id = ${tank!.id}`,
      );
      expect(latest.rows[0]?.n).toBe(2);
    } finally {
      await database.drop();
    }
  });
});
