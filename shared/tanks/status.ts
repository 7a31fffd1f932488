/*
 * A tank's status, and each parameter's, with the reason in words: the one rule behind the tank
 * list, the tank page, the latest-readings tiles and the readings header. The API gathers the facts
 * in SQL (api/services/tank-health.ts) and decides here.
 *
 * Per parameter, worst first:
 * 1. the limits in force (shared/parameters/health.ts rules 1–2): beyond a critical bound is
 *    critical, beyond a warning bound is warning, at any age;
 * 2. outside what a present inhabitant tolerates (the comfort range) is at least warning, at any
 *    age, like a limit: its alert stays open until a newer reading says otherwise;
 * 3. an open (or acknowledged) alert about the parameter lifts it to the alert's severity
 *    (critical → critical, warning → warning; notices do not count);
 * 4. otherwise stale when older than its freshness window: for a device reading three of that
 *    device's usual intervals, at least 30 minutes (`deviceStaleAfter`); for a visit or home test
 *    the parameter's testing interval (the catalogue's home-test interval); never read is stale.
 *
 * Tank: any critical parameter or critical open alert → alert; any warning parameter or warning
 * open alert → watch; nothing watched, or every watched parameter stale → no recent data; some
 * stale → watch; else healthy. Watched parameters are those with a limit, plus any the livestock
 * or an alert make a concern of.
 */
import { formatDuration } from '@shared/alerts/describe-alert';
import type { AlertKind, AlertSeverity } from '@shared/alerts/kinds';
import { describeConcerns, evaluateLivestock, type LivestockInhabitant } from '@shared/alerts/livestock';
import { deviceStaleAfter } from '@shared/alerts/stale-device';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import {
  expectedIntervalMs,
  limitBreach,
  parameterHealth,
  tankStatus,
  type LatestReading,
  type ParameterHealth,
  type TankStatus,
} from '@shared/parameters/health';
import type { ParameterKey } from '@shared/parameters/keys';
import type { ParameterLimits } from '@shared/parameters/limits';
import { formatValue } from '@shared/parameters/units';

export interface ParameterFacts {
  readonly parameter: ParameterKey;
  /** The limits in force (the tank's own, else its style's template); null when none. */
  readonly limits: ParameterLimits | null;
  readonly latest: LatestReading | null;
  /** For a device reading: the gaps between that device's recent reports (`reportingGaps`). */
  readonly deviceGapsMs?: readonly number[];
}

export interface OpenAlertFact {
  readonly kind: AlertKind;
  readonly severity: AlertSeverity;
  readonly parameter: ParameterKey | null;
  readonly title: string;
}

export interface TankFacts {
  readonly parameters: readonly ParameterFacts[];
  /** Present livestock with their care ranges; their intersection is the comfort range. */
  readonly inhabitants: readonly LivestockInhabitant[];
  /** Alerts not yet resolved (open or acknowledged). */
  readonly openAlerts: readonly OpenAlertFact[];
}

export interface ParameterVerdict {
  readonly parameter: ParameterKey;
  readonly health: ParameterHealth;
  /** Whether it counts towards the tank's status. */
  readonly watched: boolean;
  readonly reason: string;
  /** How long the latest reading counts as current; null when it never goes stale. */
  readonly freshForMs: number | null;
}

export interface TankVerdict {
  readonly status: TankStatus;
  readonly reason: string;
  readonly parameters: readonly ParameterVerdict[];
}

const rank: Readonly<Record<ParameterHealth, number>> = {
  'in-range': 0,
  stale: 1,
  warning: 2,
  critical: 3,
};

const hasBound = (limits: ParameterLimits | null): boolean =>
  limits !== null && Object.values(limits).some((bound) => bound !== null);

/** Rule 4: how long a reading stays current, from who took it. */
export function freshnessWindow(
  parameter: ParameterKey,
  latest: LatestReading,
  deviceGapsMs: readonly number[] = [],
): number | null {
  return latest.source === 'device'
    ? deviceStaleAfter(deviceGapsMs)
    : expectedIntervalMs(parameter, latest.source);
}

export function judgeParameter(
  facts: ParameterFacts,
  inhabitants: readonly LivestockInhabitant[],
  openAlerts: readonly OpenAlertFact[],
  now: Date,
): ParameterVerdict {
  const { parameter, limits, latest } = facts;
  const { label } = parameterCatalogue[parameter];
  const alertsHere = openAlerts.filter(
    (alert) => alert.parameter === parameter && alert.severity !== 'notice',
  );
  const freshForMs = latest === null ? null : freshnessWindow(parameter, latest, facts.deviceGapsMs);
  const concerns = latest === null ? [] : evaluateLivestock(parameter, latest.value, inhabitants);
  const breach = latest === null ? null : limitBreach(latest.value, limits);

  let health = parameterHealth(latest, limits, freshForMs, now);
  if (concerns.length > 0 && rank[health] < rank.warning) health = 'warning';
  const worstAlert = alertsHere.find((alert) => alert.severity === 'critical') ?? alertsHere[0];
  if (worstAlert) {
    const fromAlert: ParameterHealth = worstAlert.severity === 'critical' ? 'critical' : 'warning';
    if (rank[fromAlert] > rank[health]) health = fromAlert;
  }
  const watched = hasBound(limits) || concerns.length > 0 || alertsHere.length > 0;

  const reasons: string[] = [];
  if (latest !== null && breach !== null) {
    const side = breach.direction === 'high' ? 'above' : 'below';
    reasons.push(
      `${label} ${formatValue(parameter, latest.value)} is ${side} the ${breach.severity} limit of ` +
        formatValue(parameter, breach.limit, { trim: true }),
    );
  }
  if (latest !== null && concerns.length > 0) {
    const words = describeConcerns(parameter, latest.value, concerns);
    reasons.push(breach === null ? words : words.replace(/^.*? is /, 'and '));
  }
  if (reasons.length === 0 && worstAlert && rank[health] >= rank.warning) {
    reasons.push(`Open alert: ${worstAlert.title}`);
  }
  let reason = reasons.join(' ');
  if (reason === '') {
    if (latest === null) reason = `No ${label} reading yet`;
    else if (health === 'stale') {
      reason = `No ${label} reading for ${formatDuration(now.getTime() - latest.measuredAt.getTime())}`;
    } else {
      reason = `${label} ${formatValue(parameter, latest.value)} is in range`;
    }
  }
  return { parameter, health, watched, reason, freshForMs };
}

/** "a; b and 3 more": a tank's reason stays one line on a phone. */
function listed(items: readonly string[], shown = 2): string {
  if (items.length <= shown + 1) {
    return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join('; ')} and ${items.at(-1)}`;
  }
  return `${items.slice(0, shown).join('; ')} and ${items.length - shown} more`;
}

/** The first concern in full and a count of the rest, so a tank card stays short on a phone. */
function firstOfMany(parts: readonly string[]): string {
  const [first = '', ...rest] = parts;
  if (rest.length === 0) return first;
  return `${first}, and ${rest.length} more ${rest.length === 1 ? 'concern' : 'concerns'}`;
}

export function judgeTank(facts: TankFacts, now: Date): TankVerdict {
  const parameters = facts.parameters.map((p) => judgeParameter(p, facts.inhabitants, facts.openAlerts, now));
  const counted = parameters.filter((p) => p.watched);
  const alerts = facts.openAlerts.filter((alert) => alert.severity !== 'notice');
  const healths = [
    ...counted.map((p) => p.health),
    ...alerts.map((alert): ParameterHealth => (alert.severity === 'critical' ? 'critical' : 'warning')),
  ];
  const status = tankStatus(healths);

  const level: ParameterHealth | null =
    status === 'alert' ? 'critical' : status === 'watch' ? 'warning' : null;
  let reason: string;
  if (level !== null) {
    const shown = counted.filter((p) => p.health === level);
    const covered = new Set(shown.map((p) => p.parameter));
    // An alert about a parameter already named is the same news; only the others are listed.
    const others = alerts.filter(
      (alert) =>
        (alert.severity === 'critical') === (level === 'critical') &&
        (alert.parameter === null || !covered.has(alert.parameter)),
    );
    const parts = shown.map((p) => p.reason);
    if (others.length > 0) {
      const count = others.length === 1 ? '1 open alert' : `${others.length} open alerts`;
      parts.push(`${count}: ${listed(others.map((alert) => alert.title))}`);
    }
    if (parts.length === 0) parts.push(...counted.filter((p) => p.health === 'stale').map((p) => p.reason));
    reason = firstOfMany(parts);
  } else if (status === 'no-data') {
    const newest = Math.max(
      ...parameters.flatMap((p) => {
        const latest = facts.parameters.find((f) => f.parameter === p.parameter)?.latest;
        return p.watched && latest ? [latest.measuredAt.getTime()] : [];
      }),
    );
    reason =
      counted.length === 0
        ? 'No parameter is watched: no limits are set'
        : Number.isFinite(newest)
          ? `No reading for ${formatDuration(now.getTime() - newest)}`
          : 'No readings yet';
  } else {
    reason =
      counted.length === 1
        ? counted[0]!.reason
        : `All ${counted.length} watched readings are current and in range`;
  }
  return { status, reason, parameters };
}
