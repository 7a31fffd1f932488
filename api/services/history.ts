import { sql } from 'drizzle-orm';
import { bucketOrigin, bucketWidthMs } from '@shared/readings/buckets';
import type { ReadingBucket, ReadingHistory, ReadingHistoryQuery } from '@shared/schemas/readings';
import type { Db } from '../db/client';
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
 * A window of one parameter's history. PostgreSQL does the summarising (date_bin over
 * readings_history_idx), so a year of 5-minute device readings leaves the database as a few
 * hundred rows. A window with no more readings than `points` comes back raw instead.
 */
export async function readingHistory(
  db: Db,
  actor: Actor,
  tankId: string,
  query: ReadingHistoryQuery,
): Promise<ReadingHistory> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const { parameter, from, to, points } = query;
  const window = sql`r.tank_id = ${tank.id} and r.parameter = ${parameter}
    and r.measured_at >= ${from}::timestamptz and r.measured_at <= ${to}::timestamptz`;
  const bucketMs = bucketWidthMs(Date.parse(to) - Date.parse(from), points);

  const [bucketed, limits] = await Promise.all([
    db.execute<BucketRow>(sql`
      select
        extract(epoch from date_bin(${`${bucketMs} milliseconds`}::interval, r.measured_at, ${bucketOrigin}::timestamptz)) * 1000
          as start_ms,
        min(r.value) as min, avg(r.value) as mean, max(r.value) as max, count(*)::int as count,
        (count(*) filter (where r.source = 'device'))::int as device,
        (count(*) filter (where r.source = 'home-test'))::int as home,
        (count(*) filter (where r.source = 'visit'))::int as visit
      from readings r
      where ${window}
      group by 1
      order by 1`),
    parameterLimitsInForce(db, tank, parameter),
  ]);
  const total = bucketed.rows.reduce((sum, row) => sum + row.count, 0);
  const base = { parameter, from, to, total, limits };

  if (total <= points) {
    const raw = await db.execute<ReadingRow>(sql`
      select ${readingColumns(sql`r`)} from readings r where ${window}
      order by r.measured_at, r.id`);
    const readings = raw.rows.map(readingFromRow);
    return { ...base, mode: 'raw', bucketMs: null, buckets: [], readings, latest: readings.at(-1) ?? null };
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
    ...base,
    mode: 'buckets',
    bucketMs,
    buckets,
    readings: people.rows.map(readingFromRow),
    latest: latest.rows[0] ? readingFromRow(latest.rows[0]) : null,
  };
}
