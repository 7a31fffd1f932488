import type { LivestockInhabitant } from '@shared/alerts/livestock';
import { reportingGaps } from '@shared/alerts/stale-device';
import { findSpecies } from '@shared/livestock/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { limitTemplates } from '@shared/parameters/limit-templates';
import type { ParameterLimits } from '@shared/parameters/limits';
import type { ParameterHealthSummary, TankHealthSummary as TankHealth } from '@shared/schemas/readings';
import type { ReadingSource } from '@shared/readings/sources';
import { presentStatuses } from '@shared/schemas/livestock-status';
import { judgeTank, type OpenAlertFact } from '@shared/tanks/status';
import type { Db } from '../db/client';
import { preparedStatement } from '../db/prepared';

export type TankHealthSummary = TankHealth;

/** The style templates as rows, so one query can fall back to them where a tank has no row. */
const templateRows = JSON.stringify(
  Object.entries(limitTemplates).flatMap(([style, byParameter]) =>
    Object.entries(byParameter).map(([parameter, limits]) => ({ style, parameter, ...limits })),
  ),
);

type HealthRow = {
  tank_id: string;
  species: string[] | null;
  open_alerts: OpenAlertFact[] | null;
  parameters: Array<{
    parameter: ParameterKey;
    value: number | null;
    measured_at: number | null;
    source: ReadingSource | null;
    /** Recent report times (epoch ms) of the device behind the latest reading. */
    device_moments: number[] | null;
    warn_low: number | null;
    warn_high: number | null;
    crit_low: number | null;
    crit_high: number | null;
    limits_source: 'tank' | 'template' | null;
  }> | null;
};

/** The statement behind `healthForTanks`, sent by name (a hot path: every list and overview page). */
const healthStatement = preparedStatement<
  HealthRow,
  [tankIds: string[], templates: string, present: string[]]
>(
  'tank_health',
  `
    with wanted as (
      select t.id, t.style::text as style from tanks t where t.id = any($1::uuid[])
    ),
    templates as (
      select * from jsonb_to_recordset($2::jsonb)
        as x(style text, parameter text, "warnLow" float8, "warnHigh" float8, "critLow" float8, "critHigh" float8)
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
        (select array_agg(extract(epoch from m) * 1000) from unnest(lr.device_moments) m) as device_moments
      from wanted w
      cross join unnest(enum_range(null::parameter_key)) as p(parameter)
      left join tank_limits l on l.tank_id = w.id and l.parameter = p.parameter
      left join templates tp on tp.style = w.style and tp.parameter = p.parameter::text
      left join latest_readings lr on lr.tank_id = w.id and lr.parameter = p.parameter
    )
    select
      w.id as tank_id,
      (
        select array_agg(lv.catalogue_species_id order by lv.created_at, lv.id)
        from livestock lv
        where lv.tank_id = w.id and lv.catalogue_species_id is not null
          and lv.status::text = any($3::text[])
      ) as species,
      (
        select json_agg(
          json_build_object('kind', a.kind, 'severity', a.severity, 'parameter', a.parameter, 'title', a.title)
          order by a.opened_at, a.id
        )
        from alerts a
        where a.tank_id = w.id and a.status <> 'resolved'
      ) as open_alerts,
      json_agg(
        json_build_object(
          'parameter', j.parameter,
          'value', j.value,
          'measured_at', extract(epoch from j.measured_at) * 1000,
          'source', j.source,
          'device_moments', j.device_moments,
          'warn_low', j.warn_low,
          'warn_high', j.warn_high,
          'crit_low', j.crit_low,
          'crit_high', j.crit_high,
          'limits_source', j.limits_source
        )
        order by j.parameter
      ) as parameters
    from wanted w
    left join pairs j on j.tank_id = w.id
    group by w.id
`,
);

/**
 * Health of many tanks in ONE query that gathers the facts, decided by `judgeTank`
 * (shared/tanks/status.ts), so every screen that shows a status says the same thing:
 * - the latest reading per (tank, parameter) is a row of latest_readings, kept by a trigger in the
 *   statement that stores readings, so the cost follows the number of tanks, not the years of
 *   history behind them; a device's latest reading carries that device's last reports of the
 *   parameter, which set its freshness window;
 * - limits follow `limitsInForce` (shared/parameters/limits-in-force.ts: the tank's own row, else
 *   its style's template), tested against it;
 * - the present livestock (their care ranges make the comfort range) and the alerts not resolved.
 */
export async function healthForTanks(
  db: Db,
  tankIds: string[],
  now: Date,
): Promise<Map<string, TankHealthSummary>> {
  if (tankIds.length === 0) return new Map();
  const rows = await healthStatement(db, tankIds, templateRows, [...presentStatuses]);
  const health = new Map<string, TankHealthSummary>();
  for (const row of rows) health.set(row.tank_id, summaryOf(row, now));
  return health;
}

function inhabitantsOf(speciesIds: readonly string[]): LivestockInhabitant[] {
  return speciesIds.flatMap((id) => {
    const species = findSpecies(id);
    return species
      ? [
          {
            speciesId: species.id,
            commonName: species.commonName,
            scientificName: species.scientificName,
            ranges: species.profile.ranges,
          },
        ]
      : [];
  });
}

function summaryOf(row: HealthRow, now: Date): TankHealthSummary {
  const gathered = (row.parameters ?? []).map((p) => {
    const limits: ParameterLimits | null =
      p.limits_source === null
        ? null
        : { warnLow: p.warn_low, warnHigh: p.warn_high, critLow: p.crit_low, critHigh: p.crit_high };
    const latest =
      p.value === null || p.measured_at === null || p.source === null
        ? null
        : { value: p.value, measuredAt: new Date(Number(p.measured_at)), source: p.source };
    const deviceGapsMs = reportingGaps((p.device_moments ?? []).map((at) => new Date(Number(at))));
    return { facts: { parameter: p.parameter, limits, latest, deviceGapsMs }, limitsSource: p.limits_source };
  });
  const verdict = judgeTank(
    {
      parameters: gathered.map((g) => g.facts),
      inhabitants: inhabitantsOf(row.species ?? []),
      openAlerts: row.open_alerts ?? [],
    },
    now,
  );
  const parameters: ParameterHealthSummary[] = [];
  let lastReadingAt: number | null = null;
  verdict.parameters.forEach((judged, index) => {
    const { facts, limitsSource } = gathered[index]!;
    const { latest } = facts;
    if (latest && (lastReadingAt === null || latest.measuredAt.getTime() > lastReadingAt))
      lastReadingAt = latest.measuredAt.getTime();
    // Listed: what the tank is watched for, and anything else it has readings of.
    if (!judged.watched && latest === null) return;
    parameters.push({
      parameter: judged.parameter,
      health: judged.health,
      watched: judged.watched,
      reason: judged.reason,
      latest:
        latest === null
          ? null
          : { value: latest.value, measuredAt: latest.measuredAt.toISOString(), source: latest.source },
      limits: facts.limits,
      limitsSource,
      expectedIntervalMs: judged.freshForMs,
    });
  });
  return {
    status: verdict.status,
    statusReason: verdict.reason,
    lastReadingAt: lastReadingAt === null ? null : new Date(lastReadingAt).toISOString(),
    parameters,
  };
}
