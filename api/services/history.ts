import { sql } from 'drizzle-orm';
import { dayMs, hourMs } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { bucketOrigin, bucketWidthMs } from '@shared/readings/buckets';
import type { ReadingBucket, ReadingHistory, ReadingHistoryQuery } from '@shared/schemas/readings';
import type { Db } from '../db/client';
import type { ReadRouting } from '../db/replica';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import { parameterLimitsInForce } from './limits';
import { readingColumns, readingFromRow, type ReadingRow } from './readings';

type BucketRow = {
  start_ms: number | string;
  min: number;
  mean: number;
  max: number;
  count: number;
  device: number;
  home: number;
  visit: number;
};

/**
 * A window of one parameter's history. PostgreSQL does the summarising, so a year of 5-minute
 * device readings leaves the database as a few hundred rows: buckets of whole hours or days are
 * read from the rollups (365 rows for a year), shorter ones from the readings. A window with no
 * more readings than `points` comes back raw instead.
 */
export async function readingHistory(
  db: Db,
  reads: ReadRouting,
  actor: Actor,
  tankId: string,
  query: ReadingHistoryQuery,
): Promise<ReadingHistory> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const { parameter, from, to, points } = query;
  const bucketMs = bucketWidthMs(Date.parse(to) - Date.parse(from), points);

  const [limits, history] = await Promise.all([
    parameterLimitsInForce(db, tank, parameter),
    // The readings themselves may come from a replica a moment behind (api/db/replica.ts).
    reads.read(tank.id, (source) => windowOf(source, tank.id, query, bucketMs)),
  ]);
  return { parameter, from, to, total: history.total, limits, ...history.shape };
}

type WindowShape = Pick<ReadingHistory, 'mode' | 'bucketMs' | 'buckets' | 'readings' | 'latest'>;

async function windowOf(
  db: Db,
  tankId: string,
  query: ReadingHistoryQuery,
  bucketMs: number,
): Promise<{ total: number; shape: WindowShape }> {
  const { parameter, from, to, points } = query;
  const window = sql`r.tank_id = ${tankId} and r.parameter = ${parameter}
    and r.measured_at >= ${from}::timestamptz and r.measured_at <= ${to}::timestamptz`;
  const bucketed = await db.execute<BucketRow>(bucketQuery(tankId, parameter, from, to, bucketMs));
  const total = bucketed.rows.reduce((sum, row) => sum + row.count, 0);

  if (total <= points) {
    const raw = await db.execute<ReadingRow>(sql`
      select ${readingColumns(sql`r`)} from readings r where ${window}
      order by r.measured_at, r.id`);
    const readings = raw.rows.map(readingFromRow);
    return {
      total,
      shape: { mode: 'raw', bucketMs: null, buckets: [], readings, latest: readings.at(-1) ?? null },
    };
  }

  // The people's readings stay one by one (the newest `points` of them), so the chart can say
  // who measured what; the latest reading of any source gives the window's "latest".
  const [people, latest] = await Promise.all([
    db.execute<ReadingRow>(sql`
      select * from (
        select ${readingColumns(sql`r`)} from readings r
        where ${window} and r.source <> 'device'
        order by r.measured_at desc, r.id desc
        limit ${points}
      ) x order by x.measured_at_ms, x.id`),
    db.execute<ReadingRow>(sql`
      select ${readingColumns(sql`r`)} from readings r where ${window}
      order by r.measured_at desc, r.id desc limit 1`),
  ]);
  const buckets: ReadingBucket[] = bucketed.rows.map((row) => ({
    start: new Date(Math.round(Number(row.start_ms))).toISOString(),
    min: row.min,
    mean: row.mean,
    max: row.max,
    count: row.count,
    bySource: { device: row.device, 'home-test': row.home, visit: row.visit },
  }));
  return {
    total,
    shape: {
      mode: 'buckets',
      bucketMs,
      buckets,
      readings: people.rows.map(readingFromRow),
      latest: latest.rows[0] ? readingFromRow(latest.rows[0]) : null,
    },
  };
}

/** The rollup table whose buckets tile a bucket of this width, if any. */
function rollupFor(bucketMs: number) {
  if (bucketMs % dayMs === 0) return { table: sql.raw('reading_rollups_daily'), unit: '1 day' };
  if (bucketMs % hourMs === 0) return { table: sql.raw('reading_rollups_hourly'), unit: '1 hour' };
  return null;
}

/**
 * One row per chart bucket: min, mean, max and counts by source. With a rollup, the window's whole
 * hours or days come from it and only the partial ones at either end from the readings (at most
 * two units' worth), so the answer equals the one from the readings alone, to rounding of the mean.
 */
export function bucketQuery(
  tankId: string,
  parameter: ParameterKey,
  from: string,
  to: string,
  bucketMs: number,
) {
  const width = `${bucketMs} milliseconds`;
  const inWindow = sql`r.tank_id = ${tankId} and r.parameter = ${parameter}`;
  const rollup = rollupFor(bucketMs);
  if (!rollup) {
    return sql`
      select
        extract(epoch from date_bin(${width}::interval, r.measured_at, ${bucketOrigin}::timestamptz)) * 1000
          as start_ms,
        min(r.value) as min, avg(r.value) as mean, max(r.value) as max, count(*)::int as count,
        (count(*) filter (where r.source = 'device'))::int as device,
        (count(*) filter (where r.source = 'home-test'))::int as home,
        (count(*) filter (where r.source = 'visit'))::int as visit
      from readings r
      where ${inWindow} and r.measured_at >= ${from}::timestamptz and r.measured_at <= ${to}::timestamptz
      group by 1
      order by 1`;
  }
  // [whole_from, whole_to) are the rollup buckets wholly inside the window; when the window holds
  // none, whole_from >= whole_to and the two raw ranges below cover it all, without overlap.
  return sql`
    with bounds as (
      select
        case when date_bin(${rollup.unit}::interval, w.f, ${bucketOrigin}::timestamptz) = w.f then w.f
          else date_bin(${rollup.unit}::interval, w.f, ${bucketOrigin}::timestamptz) + ${rollup.unit}::interval
        end as whole_from,
        date_bin(${rollup.unit}::interval, w.t, ${bucketOrigin}::timestamptz) as whole_to,
        w.f, w.t
      from (select ${from}::timestamptz as f, ${to}::timestamptz as t) w
    ),
    parts as (
      select h.bucket_start as at, h.min, h.max, h.sum, h.count, h.device_count, h.home_count, h.visit_count
      from ${rollup.table} h, bounds b
      where h.tank_id = ${tankId} and h.parameter = ${parameter}
        and h.bucket_start >= b.whole_from and h.bucket_start < b.whole_to
      union all
      select r.measured_at, r.value, r.value, r.value, 1,
        (r.source = 'device')::int, (r.source = 'home-test')::int, (r.source = 'visit')::int
      from readings r, bounds b
      where ${inWindow} and r.measured_at >= b.f and r.measured_at < b.whole_from and r.measured_at <= b.t
      union all
      select r.measured_at, r.value, r.value, r.value, 1,
        (r.source = 'device')::int, (r.source = 'home-test')::int, (r.source = 'visit')::int
      from readings r, bounds b
      where ${inWindow} and r.measured_at >= greatest(b.whole_to, b.whole_from) and r.measured_at <= b.t
    )
    select
      extract(epoch from date_bin(${width}::interval, p.at, ${bucketOrigin}::timestamptz)) * 1000 as start_ms,
      min(p.min) as min, sum(p.sum) / sum(p.count) as mean, max(p.max) as max, sum(p.count)::int as count,
      sum(p.device_count)::int as device, sum(p.home_count)::int as home, sum(p.visit_count)::int as visit
    from parts p
    group by 1
    order by 1`;
}
