import { and, asc, desc, eq, gte, inArray, lte, sql } from 'drizzle-orm';
import { describeAlert, type AlertFacts } from '@shared/alerts/describe-alert';
import { evaluateFreeAmmonia } from '@shared/alerts/free-ammonia';
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
import type { ReadingSource } from '@shared/readings/sources';
import { presentStatuses } from '@shared/schemas/livestock-status';
import type { Db } from '../db/client';
import { alertRuleStates, companies, livestock, readings, tankLimits, tanks } from '../db/schema/index';
import { withTankAlerts, type AlertChange, type TankAlertStore, type Tx } from './alert-store';

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

async function loadTank(tx: Tx, tankId: string): Promise<TankContext | null> {
  const [tank] = await tx
    .select({
      id: tanks.id,
      companyId: tanks.companyId,
      name: tanks.name,
      style: tanks.style,
      timeZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
    })
    .from(tanks)
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .where(eq(tanks.id, tankId));
  if (!tank) return null;
  const rows = await tx.select().from(tankLimits).where(eq(tankLimits.tankId, tankId));
  const limits: Partial<Record<ParameterKey, ParameterLimits>> = {};
  for (const [parameter, inForce] of Object.entries(limitsInForce(tank.style, rows)))
    limits[parameter as ParameterKey] = inForce.limits;
  const rates: Partial<Record<ParameterKey, RateRule>> = {};
  for (const row of rows) {
    if (row.rateMaxChange !== null && row.ratePerHours !== null) {
      rates[row.parameter] = rateRuleFromHours({ maxChange: row.rateMaxChange, perHours: row.ratePerHours });
    }
  }
  const animals = await tx
    .select({ speciesId: livestock.catalogueSpeciesId })
    .from(livestock)
    .where(and(eq(livestock.tankId, tankId), inArray(livestock.status, [...presentStatuses])));
  const inhabitants: LivestockInhabitant[] = [];
  for (const { speciesId } of animals) {
    const species = speciesId ? findSpecies(speciesId) : undefined;
    if (!species) continue;
    inhabitants.push({
      speciesId: species.id,
      commonName: species.commonName,
      scientificName: species.scientificName,
      ranges: species.profile.ranges,
    });
  }
  return { ...tank, limits, rates, inhabitants };
}

async function loadState(tx: Tx, tankId: string, ruleKey: string): Promise<ThresholdState> {
  const [row] = await tx
    .select({ state: alertRuleStates.state })
    .from(alertRuleStates)
    .where(and(eq(alertRuleStates.tankId, tankId), eq(alertRuleStates.ruleKey, ruleKey)));
  const parsed = row ? thresholdState.safeParse(row.state) : null;
  return parsed?.success ? parsed.data : initialThresholdState;
}

async function saveState(tx: Tx, tankId: string, ruleKey: string, state: ThresholdState) {
  await tx
    .insert(alertRuleStates)
    .values({ tankId, ruleKey, state })
    .onConflictDoUpdate({ target: [alertRuleStates.tankId, alertRuleStates.ruleKey], set: { state } });
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
  parameter: ParameterKey,
  batch: NewReading[],
  options: { rejudge?: boolean } = {},
) {
  const ruleKey = `limit:${parameter}`;
  let state = await loadState(store.tx, tank.id, ruleKey);
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
  await saveState(store.tx, tank.id, ruleKey, state);
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

async function evaluateRateRule(
  store: TankAlertStore,
  tank: TankContext,
  parameter: ParameterKey,
  latest: NewReading,
) {
  const rule = tank.rates[parameter] ?? parameterCatalogue[parameter].rateOfChange;
  if (!rule) return null;
  // Twice the rule's period: enough history for evaluateRate to average a slightly long gap.
  const windowStart = new Date(latest.measuredAt.getTime() - 2 * rule.perMs);
  const series = await store.tx
    .select({ value: readings.value, measuredAt: readings.measuredAt })
    .from(readings)
    .where(
      and(
        eq(readings.tankId, tank.id),
        eq(readings.parameter, parameter),
        gte(readings.measuredAt, windowStart),
        lte(readings.measuredAt, latest.measuredAt),
      ),
    )
    .orderBy(asc(readings.measuredAt));
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

/** Free ammonia needs the pH and temperature (and salinity) measured closest before the ammonia test. */
async function evaluateFreeAmmoniaRule(store: TankAlertStore, tank: TankContext, latest: NewReading) {
  const nearest = async (parameter: ParameterKey) => {
    const [row] = await store.tx
      .select({ value: readings.value })
      .from(readings)
      .where(
        and(
          eq(readings.tankId, tank.id),
          eq(readings.parameter, parameter),
          lte(readings.measuredAt, latest.measuredAt),
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
  if (batch.length === 0) return [];
  return withTankAlerts(db, tankId, async (store) => {
    const tank = await loadTank(store.tx, tankId);
    if (!tank) return [];
    const events: string[] = [];
    const byParameter = new Map<ParameterKey, NewReading[]>();
    for (const reading of batch)
      byParameter.set(reading.parameter, [...(byParameter.get(reading.parameter) ?? []), reading]);
    for (const [parameter, list] of byParameter) {
      list.sort((a, b) => a.measuredAt.getTime() - b.measuredAt.getTime());
      const latest = list.at(-1)!;
      events.push(...(await evaluateLimit(store, tank, parameter, list)));
      for (const id of [
        await evaluateLivestockRule(store, tank, parameter, latest),
        await evaluateRateRule(store, tank, parameter, latest),
        parameter === 'ammonia' ? await evaluateFreeAmmoniaRule(store, tank, latest) : null,
      ]) {
        if (id) events.push(id);
      }
    }
    return events;
  });
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
    const tank = await loadTank(store.tx, tankId);
    if (!tank) return [];
    const events: string[] = [];
    for (const reading of latest) {
      events.push(...(await evaluateLimit(store, tank, reading.parameter, [reading], { rejudge: true })));
    }
    return events;
  });
}
