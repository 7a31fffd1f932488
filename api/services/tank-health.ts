import { sql } from 'drizzle-orm';
import type { ParameterHealth, TankStatus } from '@shared/parameters/health';
import { expectedIntervalsMs } from '@shared/parameters/health';
import type { ParameterKey } from '@shared/parameters/keys';
import { limitTemplates } from '@shared/parameters/limit-templates';
import type { ParameterLimits } from '@shared/parameters/limits';
import type { ParameterHealthSummary, TankHealthSummary as TankHealth } from '@shared/schemas/readings';
import type { ReadingSource } from '@shared/readings/sources';
import type { Db } from '../db/client';

export type TankHealthSummary = TankHealth;

/** The style templates as rows, so one query can fall back to them where a tank has no row. */
const templateRows = JSON.stringify(
  Object.entries(limitTemplates).flatMap(([style, byParameter]) =>
    Object.entries(byParameter).map(([parameter, limits]) => ({ style, parameter, ...limits })),
  ),
);

const intervalRows = JSON.stringify(
  Object.entries(expectedIntervalsMs).map(([parameter, { device, manual }]) => ({
    parameter,
    device,
    manual,
  })),
);

type HealthRow = {
  tank_id: string;
  status: TankStatus;
  last_reading_at: number | null;
  parameters: Array<{
    parameter: ParameterKey;
    health: ParameterHealth;
    watched: boolean;
    value: number | null;
    measured_at: number | null;
    source: ReadingSource | null;
    warn_low: number | null;
    warn_high: number | null;
    crit_low: number | null;
    crit_high: number | null;
    limits_source: 'tank' | 'template' | null;
    interval_ms: number | null;
  }> | null;
};

/**
 * Health of many tanks in ONE query, following shared/parameters/health.ts exactly:
 * - the latest reading per (tank, parameter) is one backward probe of readings_history_idx per
 *   pair (LATERAL … ORDER BY measured_at DESC LIMIT 1), so the cost follows the number of tanks,
 *   not the years of history behind them;
 * - limits follow `limitsInForce` (shared/parameters/limits-in-force.ts: the tank's own row, else
 *   its style's template), tested against it; a parameter is watched when its limits have at least
 *   one bound, and only watched parameters decide the status;
 * - rule 1: strictly beyond a bound, critical before warning; rule 2: out-of-limits readings keep
 *   their severity at any age; rule 3: stale when now − measured_at > the interval for the
 *   reading's source (null interval: never), or with no reading at all; rule 4: the tank status.
 */
export async function healthForTanks(
  db: Db,
  tankIds: string[],
  now: Date,
): Promise<Map<string, TankHealthSummary>> {
  if (tankIds.length === 0) return new Map();
  const result = await db.execute<HealthRow>(sql`
    with wanted as (
      select t.id, t.style::text as style from tanks t where t.id = any(${sql.param(tankIds)}::uuid[])
    ),
    templates as (
      select * from jsonb_to_recordset(${templateRows}::jsonb)
        as x(style text, parameter text, "warnLow" float8, "warnHigh" float8, "critLow" float8, "critHigh" float8)
    ),
    intervals as (
      select * from jsonb_to_recordset(${intervalRows}::jsonb) as x(parameter text, device float8, manual float8)
    ),
    pairs as (
      select
        w.id as tank_id,
        p.parameter,
        case when l.tank_id is not null then 'tank' when tp.parameter is not null then 'template' end
          as limits_source,
        case when l.tank_id is not null then l.warn_low else tp."warnLow" end as warn_low,
        case when l.tank_id is not null then l.warn_high else tp."warnHigh" end as warn_high,
        case when l.tank_id is not null then l.crit_low else tp."critLow" end as crit_low,
        case when l.tank_id is not null then l.crit_high else tp."critHigh" end as crit_high,
        lr.value,
        lr.measured_at,
        lr.source,
        case when lr.source = 'device' then iv.device else iv.manual end as interval_ms
      from wanted w
      cross join unnest(enum_range(null::parameter_key)) as p(parameter)
      left join tank_limits l on l.tank_id = w.id and l.parameter = p.parameter
      left join templates tp on tp.style = w.style and tp.parameter = p.parameter::text
      left join intervals iv on iv.parameter = p.parameter::text
      left join lateral (
        select r.value, r.measured_at, r.source
        from readings r
        where r.tank_id = w.id and r.parameter = p.parameter
        order by r.measured_at desc, r.id desc
        limit 1
      ) lr on true
    ),
    judged as (
      select
        pairs.*,
        coalesce(warn_low, warn_high, crit_low, crit_high) is not null as watched,
        case
          when value is null then 'stale'
          when crit_high is not null and value > crit_high then 'critical'
          when crit_low is not null and value < crit_low then 'critical'
          when warn_high is not null and value > warn_high then 'warning'
          when warn_low is not null and value < warn_low then 'warning'
          when interval_ms is not null
            and ${now.toISOString()}::timestamptz - measured_at > interval_ms * interval '1 millisecond'
            then 'stale'
          else 'in-range'
        end as health
      from pairs
    )
    select
      w.id as tank_id,
      case
        when coalesce(bool_or(j.health = 'critical') filter (where j.watched), false) then 'alert'
        when coalesce(bool_or(j.health = 'warning') filter (where j.watched), false) then 'watch'
        when coalesce(bool_and(j.health = 'stale') filter (where j.watched), true) then 'no-data'
        when bool_or(j.health = 'stale') filter (where j.watched) then 'watch'
        else 'healthy'
      end as status,
      extract(epoch from max(j.measured_at)) * 1000 as last_reading_at,
      json_agg(
        json_build_object(
          'parameter', j.parameter,
          'health', j.health,
          'watched', j.watched,
          'value', j.value,
          'measured_at', extract(epoch from j.measured_at) * 1000,
          'source', j.source,
          'warn_low', j.warn_low,
          'warn_high', j.warn_high,
          'crit_low', j.crit_low,
          'crit_high', j.crit_high,
          'limits_source', j.limits_source,
          'interval_ms', j.interval_ms
        )
        order by j.parameter
      ) filter (where j.watched or j.measured_at is not null) as parameters
    from wanted w
    left join judged j on j.tank_id = w.id
    group by w.id
  `);
  const health = new Map<string, TankHealthSummary>();
  for (const row of result.rows) {
    health.set(row.tank_id, {
      status: row.status,
      lastReadingAt:
        row.last_reading_at === null ? null : new Date(Number(row.last_reading_at)).toISOString(),
      parameters: (row.parameters ?? []).map(summaryOf),
    });
  }
  return health;
}

function summaryOf(p: NonNullable<HealthRow['parameters']>[number]): ParameterHealthSummary {
  const limits: ParameterLimits | null =
    p.limits_source === null
      ? null
      : { warnLow: p.warn_low, warnHigh: p.warn_high, critLow: p.crit_low, critHigh: p.crit_high };
  return {
    parameter: p.parameter,
    health: p.health,
    watched: p.watched,
    latest:
      p.value === null || p.measured_at === null || p.source === null
        ? null
        : { value: p.value, measuredAt: new Date(p.measured_at).toISOString(), source: p.source },
    limits,
    limitsSource: p.limits_source,
    expectedIntervalMs: p.interval_ms,
  };
}
