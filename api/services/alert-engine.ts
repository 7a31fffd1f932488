import { and, desc, eq, gte, lte, sql, type SQL } from 'drizzle-orm';
import { describeAlert, type AlertFacts } from '@shared/alerts/describe-alert';
import { evaluateFreeAmmonia, freeAmmoniaCompanionMaxAgeMs } from '@shared/alerts/free-ammonia';
import type { AlertKind, AlertSeverity } from '@shared/alerts/kinds';
import { evaluateLivestock, type LivestockInhabitant } from '@shared/alerts/livestock';
import { evaluateRate } from '@shared/alerts/rate';
import {
  evaluateThreshold,
  initialThresholdState,
  thresholdState,
  type ThresholdState,
} from '@shared/alerts/threshold';
import { findSpecies } from '@shared/livestock/catalogue';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { limitBreach } from '@shared/parameters/health';
import type { ParameterKey } from '@shared/parameters/keys';
import { limitsInForce } from '@shared/parameters/limits-in-force';
import { rateRuleFromHours } from '@shared/schemas/limits';
import type { ParameterLimits, RateRule } from '@shared/parameters/limits';
import type { TankStyle } from '@shared/parameters/limit-templates';
import { bucketOrigin } from '@shared/readings/buckets';
import type { ReadingSource } from '@shared/readings/sources';
import { presentStatuses } from '@shared/schemas/livestock-status';
import type { Db } from '../db/client';
import { readings } from '../db/schema/index';
import {
  withTankAlerts,
  withTanksAlerts,
  type AlertChange,
  type TankAlertStore,
  type Tx,
} from './alert-store';

export interface NewReading {
  parameter: ParameterKey;
  value: number;
  measuredAt: Date;
  source: ReadingSource;
}

/** Device data must stay out of range this long before it opens or escalates an alert (common practice). */
export const deviceDwell = { readings: 3, minutes: 10 } as const;

interface TankContext {
  id: string;
  companyId: string;
  name: string;
  timeZone: string;
  limits: Partial<Record<ParameterKey, ParameterLimits>>;
  /** The tank's own rate rules; a parameter without one uses the catalogue default. */
  rates: Partial<Record<ParameterKey, RateRule>>;
  inhabitants: LivestockInhabitant[];
}

interface ContextRow {
  id: string;
  companyId: string;
  name: string;
  style: TankStyle;
  timeZone: string;
  limits: OwnLimitRow[];
  species: (string | null)[];
  states: Record<string, unknown>;
}

interface OwnLimitRow {
  parameter: ParameterKey;
  warnLow: number | null;
  warnHigh: number | null;
  critLow: number | null;
  critHigh: number | null;
  rateMaxChange: number | null;
  ratePerHours: number | null;
}

/** The rule states a pass reads once and writes back once, by rule key. */
type RuleStates = Map<string, ThresholdState>;

/**
 * Everything the rules need about each tank, in one statement: the tank and its zone, its own
 * limits and rate rules, the species living in it, and the rule states of its `ruleKeys`. A tank
 * that no longer exists is missing from the answer.
 */
async function loadTanks(
  tx: Tx,
  ruleKeysByTank: ReadonlyMap<string, readonly string[]>,
): Promise<Map<string, { tank: TankContext; states: RuleStates }>> {
  const allKeys = [...new Set([...ruleKeysByTank.values()].flat())];
  const { rows } = await tx.execute<ContextRow & Record<string, unknown>>(sql`
    select t.id, t.company_id as "companyId", t.name, t.style,
      coalesce(t.time_zone, c.time_zone) as "timeZone",
      coalesce((select json_agg(json_build_object(
          'parameter', l.parameter, 'warnLow', l.warn_low, 'warnHigh', l.warn_high,
          'critLow', l.crit_low, 'critHigh', l.crit_high,
          'rateMaxChange', l.rate_max_change, 'ratePerHours', l.rate_per_hours))
        from tank_limits l where l.tank_id = t.id), '[]') as limits,
      coalesce((select json_agg(a.catalogue_species_id) from livestock a
        where a.tank_id = t.id and a.status = any(${sql.param([...presentStatuses])}::livestock_status[])), '[]') as species,
      coalesce((select json_object_agg(s.rule_key, s.state) from alert_rule_states s
        where s.tank_id = t.id and s.rule_key = any(${sql.param(allKeys)}::text[])), '{}') as states
    from tanks t join companies c on c.id = t.company_id
    where t.id = any(${sql.param([...ruleKeysByTank.keys()])}::uuid[])`);
  const contexts = new Map<string, { tank: TankContext; states: RuleStates }>();
  for (const row of rows) {
    const limits: Partial<Record<ParameterKey, ParameterLimits>> = {};
    for (const [parameter, inForce] of Object.entries(limitsInForce(row.style, row.limits)))
      limits[parameter as ParameterKey] = inForce.limits;
    const rates: Partial<Record<ParameterKey, RateRule>> = {};
    for (const own of row.limits) {
      if (own.rateMaxChange !== null && own.ratePerHours !== null) {
        rates[own.parameter] = rateRuleFromHours({
          maxChange: own.rateMaxChange,
          perHours: own.ratePerHours,
        });
      }
    }
    const inhabitants: LivestockInhabitant[] = [];
    for (const speciesId of row.species) {
      const species = speciesId ? findSpecies(speciesId) : undefined;
      if (!species) continue;
      inhabitants.push({
        speciesId: species.id,
        commonName: species.commonName,
        scientificName: species.scientificName,
        ranges: species.profile.ranges,
      });
    }
    const wanted = new Set(ruleKeysByTank.get(row.id));
    const states: RuleStates = new Map();
    for (const [ruleKey, state] of Object.entries(row.states)) {
      if (!wanted.has(ruleKey)) continue;
      const parsed = thresholdState.safeParse(state);
      if (parsed.success) states.set(ruleKey, parsed.data);
    }
    const tank = {
      id: row.id,
      companyId: row.companyId,
      name: row.name,
      timeZone: row.timeZone,
      limits,
      rates,
      inhabitants,
    };
    contexts.set(row.id, { tank, states });
  }
  return contexts;
}

/** The pass's rule states of every tank, written back in one statement. */
async function saveStates(tx: Tx, statesByTank: ReadonlyMap<string, RuleStates>) {
  const entries = [...statesByTank].flatMap(([tankId, states]) =>
    [...states].map(([ruleKey, state]) => ({ tankId, ruleKey, state: JSON.stringify(state) })),
  );
  if (entries.length === 0) return;
  await tx.execute(sql`
    insert into alert_rule_states (tank_id, rule_key, state)
    select k.tank_id, k.rule_key, k.state
    from unnest(
      ${sql.param(entries.map((e) => e.tankId))}::uuid[],
      ${sql.param(entries.map((e) => e.ruleKey))}::text[],
      ${sql.param(entries.map((e) => e.state))}::jsonb[]
    ) as k(tank_id, rule_key, state)
    on conflict (tank_id, rule_key) do update set state = excluded.state, updated_at = now()`);
}

interface Transition {
  kind: AlertKind;
  ruleKey: string;
  parameter: ParameterKey | null;
  severity: AlertSeverity;
  facts: AlertFacts;
  value: number | null;
  limit: number | null;
  direction: string | null;
  at: Date;
}

/**
 * Writes one transition through the alert store: opens the alert, or changes the open one.
 * Returns the event id (the outbox entry notifications are planned from), or null for no change.
 */
async function applyTransition(
  store: TankAlertStore,
  tank: TankContext,
  change: Transition,
  type: 'opened' | 'escalated' | 'de-escalated' | 'resolved',
): Promise<string | null> {
  const description = describeAlert(change.facts, { tankName: tank.name, timeZone: tank.timeZone });
  const content: AlertChange = {
    severity: change.severity,
    title: description.title,
    body: description.body,
    value: change.value,
    limitValue: change.limit,
    at: change.at,
  };
  if (type === 'opened') {
    return store.open({
      ...content,
      companyId: tank.companyId,
      kind: change.kind,
      ruleKey: change.ruleKey,
      parameter: change.parameter,
      direction: change.direction,
    });
  }
  const existing = await store.findOpen(change.ruleKey);
  if (!existing) return null;
  if (type === 'escalated') return store.escalate(existing, content);
  if (type === 'de-escalated') return store.deEscalate(existing, content);
  return store.resolve(existing, { at: change.at, change: content });
}

async function evaluateLimit(
  store: TankAlertStore,
  tank: TankContext,
  states: RuleStates,
  parameter: ParameterKey,
  batch: NewReading[],
  options: { rejudge?: boolean } = {},
) {
  const ruleKey = limitRuleKey(parameter);
  let state = states.get(ruleKey) ?? initialThresholdState;
  // Judging a reading already seen again (the limits changed) means forgetting that it was seen.
  if (options.rejudge) state = { ...state, lastMeasuredAt: null };
  const events: string[] = [];
  const limits = tank.limits[parameter] ?? null;
  const { deadband } = parameterCatalogue[parameter];
  for (const reading of batch) {
    const outcome = evaluateThreshold(state, reading, limits, {
      deadband,
      ...(reading.source === 'device' ? { dwell: deviceDwell } : {}),
    });
    state = outcome.state;
    if (outcome.action === 'none' || !outcome.severity || !outcome.direction || outcome.limit === null)
      continue;
    const transition = (action: 'open' | 'escalate' | 'de-escalate' | 'resolve'): Transition => ({
      kind: 'limit',
      ruleKey,
      parameter,
      severity: outcome.severity!,
      value: reading.value,
      limit: outcome.limit,
      direction: outcome.direction,
      at: reading.measuredAt,
      facts: {
        kind: 'limit',
        action,
        parameter,
        value: reading.value,
        measuredAt: reading.measuredAt,
        source: reading.source,
        severity: outcome.severity!,
        direction: outcome.direction!,
        limit: outcome.limit!,
        concerns: evaluateLivestock(parameter, reading.value, tank.inhabitants),
      },
    });
    if (outcome.action === 'open' && outcome.replacesOpenAlert) {
      const previous = await store.findOpen(ruleKey);
      if (previous)
        events.push(await store.resolve(previous, { at: reading.measuredAt, value: reading.value }));
    }
    const type = (
      { open: 'opened', escalate: 'escalated', 'de-escalate': 'de-escalated', resolve: 'resolved' } as const
    )[outcome.action];
    const id = await applyTransition(store, tank, transition(outcome.action), type);
    if (id) events.push(id);
  }
  states.set(ruleKey, state);
  return events;
}

/** Opens while the condition holds, resolves once it is gone; for rules judged on the latest value. */
async function setCondition(
  store: TankAlertStore,
  tank: TankContext,
  change: Transition | null,
  ruleKey: string,
  at: Date,
) {
  const existing = await store.findOpen(ruleKey);
  if (change && !existing) return applyTransition(store, tank, change, 'opened');
  if (change && existing && existing.severity !== change.severity) {
    const rank = { notice: 0, warning: 1, critical: 2 } as const;
    return applyTransition(
      store,
      tank,
      change,
      rank[change.severity] > rank[existing.severity] ? 'escalated' : 'de-escalated',
    );
  }
  if (!change && existing) return store.resolve(existing, { at });
  return null;
}

/**
 * A reading outside what the livestock tolerate opens a livestock alert only while the limits are
 * not broken: once they are, the limit alert owns the cause and names the livestock itself, so one
 * reading never opens two alerts. While a device reading waits out its dwell the livestock alert
 * is left as it is; once the limit alert is open it replaces the livestock one.
 */
async function evaluateLivestockRule(
  store: TankAlertStore,
  tank: TankContext,
  parameter: ParameterKey,
  latest: NewReading,
) {
  const ruleKey = `livestock:${parameter}`;
  const limitAlert = await store.findOpen(`limit:${parameter}`);
  if (limitAlert) {
    const superseded = await store.findOpen(ruleKey);
    return superseded
      ? store.resolve(superseded, {
          at: latest.measuredAt,
          note: `Followed by “${limitAlert.title}”, which names the same livestock.`,
        })
      : null;
  }
  if (limitBreach(latest.value, tank.limits[parameter] ?? null) !== null) return null;
  const concerns = evaluateLivestock(parameter, latest.value, tank.inhabitants);
  const change: Transition | null =
    concerns.length === 0
      ? null
      : {
          kind: 'livestock',
          ruleKey,
          parameter,
          severity: 'warning',
          value: latest.value,
          limit: concerns[0]!.limit,
          direction: concerns[0]!.direction,
          at: latest.measuredAt,
          facts: {
            kind: 'livestock',
            parameter,
            value: latest.value,
            measuredAt: latest.measuredAt,
            concerns,
          },
        };
  return setCondition(store, tank, change, ruleKey, latest.measuredAt);
}

/** The rate rule in force for a parameter: the tank's own, else the catalogue's default. */
function rateRuleOf(tank: Pick<TankContext, 'rates'>, parameter: ParameterKey): RateRule | null {
  return tank.rates[parameter] ?? parameterCatalogue[parameter].rateOfChange ?? null;
}

export interface SeriesPoint {
  value: number;
  measuredAt: Date;
}

/**
 * What each rate rule needs of the window before a parameter's latest reading (twice the rule's
 * period, enough for evaluateRate to average a slightly long gap), for every parameter of the batch
 * in one statement.
 *
 * evaluateRate keeps the earlier reading whose change to the latest is largest in size, the
 * earliest of equals: always one at the most positive or the most negative change. So the database
 * returns just the readings at those two changes (the same expression in the same double
 * arithmetic, ties included), and reads only the hours that can hold them: the hourly rollups give
 * each whole hour's lowest and highest value, which bound the changes inside it from above and
 * below, and an hour whose bound cannot reach what another hour surely reaches is skipped. The
 * partial hours at both ends of the window are always read. A device reporting every minute under
 * a daily rule thus costs a few hours of readings per batch instead of two days of them.
 */
export async function loadRateSeries(
  tx: Pick<Tx, 'execute'>,
  tank: Pick<TankContext, 'id' | 'rates'>,
  latest: ReadonlyMap<ParameterKey, NewReading>,
): Promise<Map<ParameterKey, SeriesPoint[]>> {
  return (await loadRateSeriesOfTanks(tx, [{ tank, latest }])).get(tank.id)!;
}

/** `loadRateSeries` for several tanks in one statement (a group of device batches). */
export async function loadRateSeriesOfTanks(
  tx: Pick<Tx, 'execute'>,
  asked: readonly {
    tank: Pick<TankContext, 'id' | 'rates'>;
    latest: ReadonlyMap<ParameterKey, NewReading>;
  }[],
): Promise<Map<string, Map<ParameterKey, SeriesPoint[]>>> {
  const windows = asked.flatMap(({ tank, latest }) =>
    [...latest].flatMap(([parameter, reading]) => {
      const rule = rateRuleOf(tank, parameter);
      return rule ? [{ tankId: tank.id, parameter, reading, perMs: rule.perMs }] : [];
    }),
  );
  const series = new Map<string, Map<ParameterKey, SeriesPoint[]>>(
    asked.map(({ tank }) => [tank.id, new Map()]),
  );
  for (const w of windows) series.get(w.tankId)!.set(w.parameter, []);
  if (windows.length === 0) return series;
  const earliest = new Date(Math.min(...windows.map((w) => w.reading.measuredAt.getTime() - 2 * w.perMs)));
  const newest = new Date(Math.max(...windows.map((w) => w.reading.measuredAt.getTime())));
  // The change a reading of value v, elapsed ms before the latest, makes (as evaluateRate has it).
  const change = (v: SQL, elapsed: SQL) =>
    sql`((w.to_value - ${v}) * w.per_ms) / greatest(${elapsed}, w.per_ms)`;
  const { rows } = await tx.execute<{
    tank_id: string;
    parameter: ParameterKey;
    value: number;
    measured_at: string;
  }>(sql`
    with w as (
      select w.*, f.from_at,
        -- The window's first whole hour starts here, its last partial hour there.
        case when date_bin('1 hour', f.from_at, ${bucketOrigin}::timestamptz) = f.from_at then f.from_at
          else date_bin('1 hour', f.from_at, ${bucketOrigin}::timestamptz) + interval '1 hour' end as head_end,
        date_bin('1 hour', w.to_at, ${bucketOrigin}::timestamptz) as tail_start
      from unnest(
        ${sql.param(windows.map((w) => w.tankId))}::uuid[],
        ${sql.param(windows.map((w) => w.parameter))}::parameter_key[],
        ${sql.param(windows.map((w) => w.reading.measuredAt.toISOString()))}::timestamptz[],
        ${sql.param(windows.map((w) => w.reading.value))}::float8[],
        ${sql.param(windows.map((w) => w.perMs))}::float8[]
      ) as w(tank_id, parameter, to_at, to_value, per_ms)
      cross join lateral (select w.to_at - make_interval(secs => 2 * w.per_ms / 1000) as from_at) f
    ), hours as (
      -- Whole hours with readings, each with how long before the latest its nearest and farthest end are.
      select w.tank_id, w.parameter, w.to_at, w.to_value, w.per_ms, h.min, h.max,
        h.bucket_start as seg_from, h.bucket_start + interval '1 hour' as seg_to,
        (extract(epoch from w.to_at - (h.bucket_start + interval '1 hour')) * 1000)::float8 as near,
        (extract(epoch from w.to_at - h.bucket_start) * 1000)::float8 as far
      from w cross join lateral (
        select h.bucket_start, h.min, h.max from reading_rollups_hourly h
        where h.tank_id = w.tank_id and h.parameter = w.parameter
          and h.bucket_start >= w.head_end and h.bucket_start < w.tail_start
      ) h
    ), bounds as (
      select w.*,
        case when to_value >= min then ${change(sql`min`, sql`near`)} else ${change(sql`min`, sql`far`)} end as most_possible,
        case when to_value >= min then ${change(sql`min`, sql`far`)} else ${change(sql`min`, sql`near`)} end as most_sure,
        case when to_value <= max then ${change(sql`max`, sql`near`)} else ${change(sql`max`, sql`far`)} end as least_possible,
        case when to_value <= max then ${change(sql`max`, sql`far`)} else ${change(sql`max`, sql`near`)} end as least_sure
      from hours w
    ), reached as (
      select tank_id, parameter, max(most_sure) as most, min(least_sure) as least from bounds group by tank_id, parameter
    ), kept as (
      -- A margin of a billionth keeps an hour whose bound ties what another reaches, whatever the rounding.
      select b.tank_id, b.parameter, b.to_at, b.to_value, b.per_ms, b.seg_from, b.seg_to
      from bounds b join reached x using (tank_id, parameter)
      where b.most_possible >= x.most - 1e-9 * greatest(abs(x.most), 1)
        or b.least_possible <= x.least + 1e-9 * greatest(abs(x.least), 1)
      union all
      select w.tank_id, w.parameter, w.to_at, w.to_value, w.per_ms, w.from_at, least(w.head_end, w.to_at) from w
      where w.head_end > w.from_at
      union all
      select w.tank_id, w.parameter, w.to_at, w.to_value, w.per_ms, greatest(w.tail_start, w.head_end), w.to_at from w
    ), earlier as (
      select w.tank_id, w.parameter, r.value, r.measured_at,
        ${change(sql`r.value`, sql`(extract(epoch from w.to_at - r.measured_at) * 1000)::float8`)} as change
      from kept w cross join lateral (
        select r.value, r.measured_at from readings r
        where r.tank_id = w.tank_id and r.parameter = w.parameter
          and r.measured_at >= w.seg_from and r.measured_at < w.seg_to
          -- The same bounds as constants, so planning looks at the one or two months they cover.
          and r.measured_at >= ${earliest.toISOString()}::timestamptz and r.measured_at <= ${newest.toISOString()}::timestamptz
        offset 0 -- kept apart, so each hour is one index range (the planner would scan the tank's year)
      ) r
    ), extremes as (
      select tank_id, parameter, max(change) as most, min(change) as least from earlier group by tank_id, parameter
    )
    select e.tank_id, e.parameter, e.value, e.measured_at
    from earlier e join extremes x using (tank_id, parameter)
    where e.change = x.most or e.change = x.least`);
  for (const row of rows)
    series
      .get(row.tank_id)!
      .get(row.parameter)!
      .push({ value: row.value, measuredAt: new Date(row.measured_at) });
  for (const { tankId, parameter, reading } of windows)
    series.get(tankId)!.get(parameter)!.push({ value: reading.value, measuredAt: reading.measuredAt });
  return series;
}

async function evaluateRateRule(
  store: TankAlertStore,
  tank: TankContext,
  parameter: ParameterKey,
  latest: NewReading,
  series: readonly SeriesPoint[] | undefined,
) {
  const rule = rateRuleOf(tank, parameter);
  if (!rule || !series) return null;
  const outcome = evaluateRate(series, rule);
  const ruleKey = `rate:${parameter}`;
  if (outcome.breach) {
    return applyTransition(
      store,
      tank,
      {
        kind: 'rate',
        ruleKey,
        parameter,
        severity: 'warning',
        value: latest.value,
        limit: rule.maxChange,
        direction: outcome.breach.direction,
        at: latest.measuredAt,
        facts: { kind: 'rate', parameter, breach: outcome.breach, rule },
      },
      'opened',
    );
  }
  return outcome.settled ? setCondition(store, tank, null, ruleKey, latest.measuredAt) : null;
}

/**
 * Free ammonia needs the pH and temperature (and salinity) measured closest before the ammonia test,
 * within `freeAmmoniaCompanionMaxAgeMs` of it; the bound also keeps each probe to the latest month
 * partitions of readings however many years the tank has.
 */
async function evaluateFreeAmmoniaRule(store: TankAlertStore, tank: TankContext, latest: NewReading) {
  const oldest = new Date(latest.measuredAt.getTime() - freeAmmoniaCompanionMaxAgeMs);
  const nearest = async (parameter: ParameterKey) => {
    const [row] = await store.tx
      .select({ value: readings.value })
      .from(readings)
      .where(
        and(
          eq(readings.tankId, tank.id),
          eq(readings.parameter, parameter),
          lte(readings.measuredAt, latest.measuredAt),
          gte(readings.measuredAt, oldest),
        ),
      )
      .orderBy(desc(readings.measuredAt))
      .limit(1);
    return row?.value ?? null;
  };
  const [pH, tempC, salinity] = [
    await nearest('ph'),
    await nearest('temperature'),
    await nearest('salinity'),
  ];
  if (pH === null || tempC === null) return null;
  const outcome = evaluateFreeAmmonia(latest.value, pH, tempC, salinity ?? 0);
  const ruleKey = 'free-ammonia:ammonia';
  const change: Transition | null =
    outcome.severity === null
      ? null
      : {
          kind: 'free-ammonia',
          ruleKey,
          parameter: 'ammonia',
          severity: outcome.severity,
          value: outcome.freeAmmonia,
          limit: outcome.limit,
          direction: 'high',
          at: latest.measuredAt,
          facts: {
            kind: 'free-ammonia',
            totalAmmonia: latest.value,
            pH,
            tempC,
            freeAmmonia: outcome.freeAmmonia,
            severity: outcome.severity,
            measuredAt: latest.measuredAt,
          },
        };
  return setCondition(store, tank, change, ruleKey, latest.measuredAt);
}

const limitRuleKey = (parameter: ParameterKey) => `limit:${parameter}`;

/**
 * Runs every rule that a batch of new readings can trigger, for one tank, in one transaction
 * serialised per tank (an advisory lock), so two batches cannot open the same alert twice.
 * Call it after the readings are committed. Returns the new alert events (the outbox).
 */
export async function evaluateNewReadings(
  db: Db,
  tankId: string,
  batch: readonly NewReading[],
): Promise<string[]> {
  return evaluateNewReadingsOfTanks(db, new Map([[tankId, batch]]));
}

/**
 * `evaluateNewReadings` for the batches of several tanks in one transaction holding every tank's
 * lock (a group of device batches stored together). A pass that changes no alert costs seven
 * statements however many tanks and readings it judges: BEGIN, the locks, the tanks' contexts with
 * their rule states, their open alerts, the rate series, the states written back, COMMIT.
 */
export async function evaluateNewReadingsOfTanks(
  db: Db,
  batches: ReadonlyMap<string, readonly NewReading[]>,
): Promise<string[]> {
  const work = [...batches].flatMap(([tankId, batch]) => {
    if (batch.length === 0) return [];
    const byParameter = new Map<ParameterKey, NewReading[]>();
    for (const reading of batch) {
      const list = byParameter.get(reading.parameter);
      if (list) list.push(reading);
      else byParameter.set(reading.parameter, [reading]);
    }
    const latest = new Map<ParameterKey, NewReading>();
    for (const [parameter, list] of byParameter) {
      list.sort((a, b) => a.measuredAt.getTime() - b.measuredAt.getTime());
      latest.set(parameter, list.at(-1)!);
    }
    return [{ tankId, byParameter, latest }];
  });
  if (work.length === 0) return [];
  return withTanksAlerts(
    db,
    work.map((w) => w.tankId),
    async (stores) => {
      const contexts = await loadTanks(
        stores.tx,
        new Map(work.map((w) => [w.tankId, [...w.byParameter.keys()].map(limitRuleKey)])),
      );
      const present = work.flatMap((w) => {
        const context = contexts.get(w.tankId);
        return context ? [{ ...w, ...context }] : [];
      });
      const series = await loadRateSeriesOfTanks(stores.tx, present);
      const events: string[] = [];
      for (const { tank, states, byParameter, latest } of present) {
        const store = stores.of(tank.id);
        for (const [parameter, list] of byParameter) {
          const last = latest.get(parameter)!;
          events.push(...(await evaluateLimit(store, tank, states, parameter, list)));
          for (const id of [
            await evaluateLivestockRule(store, tank, parameter, last),
            await evaluateRateRule(store, tank, parameter, last, series.get(tank.id)!.get(parameter)),
            parameter === 'ammonia' ? await evaluateFreeAmmoniaRule(store, tank, last) : null,
          ]) {
            if (id) events.push(id);
          }
        }
      }
      await saveStates(stores.tx, new Map(present.map(({ tank, states }) => [tank.id, states])));
      return events;
    },
  );
}

/**
 * After a tank's limits change: each parameter's latest reading is judged again against the limits
 * now in force, so an alert the old limits opened closes (or a newly crossed limit opens one) at
 * once instead of at the next reading. Returns the new alert events.
 */
export async function rejudgeLatestReadings(
  db: Db,
  tankId: string,
  latest: readonly NewReading[],
): Promise<string[]> {
  if (latest.length === 0) return [];
  return withTankAlerts(db, tankId, async (store) => {
    const context = (
      await loadTanks(store.tx, new Map([[tankId, latest.map((reading) => limitRuleKey(reading.parameter))]]))
    ).get(tankId);
    if (!context) return [];
    const { tank, states } = context;
    const events: string[] = [];
    for (const reading of latest) {
      events.push(
        ...(await evaluateLimit(store, tank, states, reading.parameter, [reading], { rejudge: true })),
      );
    }
    await saveStates(store.tx, new Map([[tank.id, states]]));
    return events;
  });
}
