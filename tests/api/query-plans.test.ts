import { sql, type SQL } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bucketQuery } from '../../api/services/history';
import { readingColumns } from '../../api/services/readings';
import { dayMs } from '@shared/parameters/catalogue';
import { bucketWidthMs } from '@shared/readings/buckets';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { deviceFor } from './readings-kit';

/*
 * The plans PostgreSQL picks for the hot reads, over a year of one tank's 5-minute readings. Only
 * the plan's shape is asserted (which indexes, which nodes, how many rows they touch), never a
 * duration: the suite runs on a loaded machine.
 */

/** One node of `EXPLAIN (FORMAT JSON)`, as far as these checks read it. */
interface PlanNode {
  'Node Type': string;
  'Relation Name'?: string;
  'Index Name'?: string;
  'Index Cond'?: string;
  'Actual Rows'?: number;
  'Actual Loops'?: number;
  'Rows Removed by Filter'?: number;
  'Sort Space Type'?: string;
  Plans?: PlanNode[];
}

function nodesOf(node: PlanNode): PlanNode[] {
  return [node, ...(node.Plans ?? []).flatMap(nodesOf)];
}

const scans = new Set(['Index Scan', 'Index Only Scan', 'Bitmap Index Scan']);
const rowsOf = (node: PlanNode) => (node['Actual Rows'] ?? 0) * (node['Actual Loops'] ?? 1);

describe('query plans of the reading reads', () => {
  let database: TestDatabase;
  let tankId: string;
  // Not on a day boundary, so the year's window has partial days at both ends.
  const to = new Date('2026-11-30T13:17:00.000Z');
  const from = new Date(to.getTime() - 365 * dayMs);

  beforeAll(async () => {
    database = await createTestDatabase();
    const { db } = database;
    const company = await createCompany(db);
    const technician = await createPerson(db, {
      companyId: company.id,
      role: 'technician',
      issuer: 'http://idp.test',
    });
    const tank = await createTank(db, { companyId: company.id, name: 'Reef' });
    tankId = tank.id;
    const probe = await deviceFor(db, technician, tank.id);
    // The months of this fixed year, whenever the test runs (the migration makes the months around today).
    await db.execute(
      sql`select ensure_reading_partitions(${new Date(from.getTime() - dayMs).toISOString()}::timestamptz, ${to.toISOString()}::timestamptz)`,
    );
    // A year and a day of 5-minute temperatures (≈ 105,000 rows) in one statement, as a bulk
    // import would write them, and a home test about once a week.
    await db.execute(sql`
      insert into readings
        (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source, device_id)
      select ${company.id}, ${tank.id}, 'temperature', v, v, '°C', t, 'device', ${probe.id}
      from (
        select t, 25.5 + 0.4 * sin(extract(epoch from t) / 86400 * 2 * pi()) as v
        from generate_series(${new Date(from.getTime() - dayMs).toISOString()}::timestamptz,
          ${to.toISOString()}::timestamptz, interval '5 minutes') t
      ) s`);
    await db.execute(sql`
      insert into readings
        (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source, recorded_by)
      select ${company.id}, ${tank.id}, 'temperature', 25.8, 25.8, '°C', t, 'home-test', ${technician.id}
      from generate_series(${from.toISOString()}::timestamptz, ${to.toISOString()}::timestamptz,
        interval '7 days 7 hours') t`);
    await db.execute(sql`analyze readings, reading_rollups_hourly, reading_rollups_daily, latest_readings`);
  });
  afterAll(() => database.drop());

  /** The index and its copies on each month's table (readings is partitioned by month). */
  async function indexAndPartitions(index: string) {
    const { rows } = await database.db.execute<{ name: string }>(sql`
      select c.relname as name from pg_inherits i join pg_class c on c.oid = i.inhrelid
      where i.inhparent = ${index}::regclass`);
    return new Set([index, ...rows.map((row) => row.name)]);
  }
  const isReadingsTable = (name: string | undefined) =>
    name !== undefined && /^readings(_y\d{4}m\d{2}|_older)?$/.test(name);

  async function plan(query: SQL, options = sql`format json`) {
    const { rows } = await database.db.execute<{ 'QUERY PLAN': [{ Plan: PlanNode }] }>(
      sql`explain (${options}) ${query}`,
    );
    return nodesOf(rows[0]!['QUERY PLAN'][0].Plan);
  }

  it('charts a year as 500 points from the daily rollups by their key, and reads only the partial days at the ends from the readings', async () => {
    const bucketMs = bucketWidthMs(to.getTime() - from.getTime(), 500);
    const query = bucketQuery(tankId, 'temperature', from.toISOString(), to.toISOString(), bucketMs);

    // ANALYZE (with TIMING OFF) for the rows each node touched and where its sorts ran.
    const nodes = await plan(query, sql`analyze, timing off, summary off, format json`);

    expect(bucketMs).toBe(dayMs);
    expect(nodes).toContainEqual(
      expect.objectContaining({ 'Index Name': 'reading_rollups_daily_tank_id_parameter_bucket_start_pk' }),
    );
    expect(
      nodes.filter((n) => n['Relation Name'] === 'reading_rollups_daily' && n['Node Type'] === 'Seq Scan'),
    ).toEqual([]);
    // The ends' bounds are known only when the query runs, so every month is in the plan; the
    // months outside them are pruned then ("never executed") or empty. None may be read through.
    const readThrough = nodes.filter(
      (n) =>
        isReadingsTable(n['Relation Name']) &&
        n['Node Type'] === 'Seq Scan' &&
        (n['Actual Loops'] ?? 0) > 0 &&
        rowsOf(n) + (n['Rows Removed by Filter'] ?? 0) > 0,
    );
    expect(readThrough).toEqual([]);
    const onReadings = nodes.filter(
      (n) => scans.has(n['Node Type']) && n['Index Name']?.startsWith('readings_'),
    );
    expect(onReadings.length).toBeGreaterThan(0);
    for (const node of onReadings) expect(node['Index Cond']).toMatch(/measured_at/);
    // The two partial days hold at most 2 × 288 device readings and a home test or two.
    expect(onReadings.reduce((sum, n) => sum + rowsOf(n), 0)).toBeLessThanOrEqual(2 * 288 + 2);
    expect(nodes.filter((n) => n['Sort Space Type'] === 'Disk')).toEqual([]);
  });

  it("finds the readings people took in a year through readings_people_idx, not among the device's", async () => {
    // The query history.ts runs for the readings shown one by one beside the buckets.
    const nodes = await plan(sql`
      select ${readingColumns(sql`r`)} from readings r
      where r.tank_id = ${tankId} and r.parameter = 'temperature'
        and r.measured_at >= ${from.toISOString()}::timestamptz and r.measured_at <= ${to.toISOString()}::timestamptz
        and r.source <> 'device'
      order by r.measured_at desc, r.id desc
      limit 500`);

    const people = await indexAndPartitions('readings_people_idx');
    const scanned = nodes.filter((n) => isReadingsTable(n['Relation Name']));
    expect(scanned.length).toBeGreaterThan(0);
    for (const node of scanned) expect(people).toContain(node['Index Name']);
  });

  it("reads only the months a window asks for (readings' monthly partitions)", async () => {
    const month = new Date(Date.UTC(to.getUTCFullYear(), to.getUTCMonth() - 1, 10));
    const nodes = await plan(sql`
      select ${readingColumns(sql`r`)} from readings r
      where r.tank_id = ${tankId} and r.parameter = 'temperature'
        and r.measured_at >= ${month.toISOString()}::timestamptz
        and r.measured_at <= ${new Date(month.getTime() + 10 * dayMs).toISOString()}::timestamptz
      order by r.measured_at, r.id`);
    const tables = new Set(nodes.map((n) => n['Relation Name']).filter(isReadingsTable));
    expect([...tables]).toEqual([
      `readings_y${month.getUTCFullYear()}m${String(month.getUTCMonth() + 1).padStart(2, '0')}`,
    ]);
  });

  it("reads the tanks' latest readings by latest_readings' primary key", async () => {
    const nodes = await database.db.transaction(async (tx) => {
      // One tank's handful of rows fit in one page, which the planner rightly reads whole; with
      // thousands of tanks the key is what serves this. Turning sequential scans off asks whether
      // the key can serve it at all (its leading column is tank_id).
      await tx.execute(sql`set local enable_seqscan = off`);
      const { rows } = await tx.execute<{ 'QUERY PLAN': [{ Plan: PlanNode }] }>(sql`
        explain (format json)
        select * from latest_readings where tank_id = any(${sql.param([tankId])}::uuid[])`);
      return nodesOf(rows[0]!['QUERY PLAN'][0].Plan);
    });

    expect(nodes).toContainEqual(
      expect.objectContaining({ 'Index Name': 'latest_readings_tank_id_parameter_pk' }),
    );
    expect(nodes.filter((n) => n['Node Type'] === 'Seq Scan')).toEqual([]);
  });
});
