/*
 * The words of every alert, for the app, web push and e-mail alike. Calm and specific: what
 * was measured, against which limit, when, and what to do first when it matters.
 */
import { dayMs, hourMs, minuteMs, parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import {
  formatAgainstBound,
  formatValue,
  fromStored,
  unitDecimals,
  unitSymbol,
  type UnitContext,
} from '@shared/parameters/units';
import type { LimitDirection, LimitSeverity, RateRule } from '@shared/parameters/limits';
import type { ReadingSource } from '@shared/readings/sources';
import { deviceStaleFirstSteps, firstSteps, type FirstSteps } from './first-steps';
import { freeAmmoniaThresholds } from './free-ammonia';
import type { AlertKind, AlertSeverity } from './kinds';
import { describeConcerns, toleranceWords, type LivestockConcern } from './livestock';
import type { RateBreach } from './rate';
import { formatDateTime } from '@shared/text/dates';

export interface DescribeContext {
  readonly tankName: string;
  /** IANA time zone the reader lives in; UTC when unknown. */
  readonly timeZone?: string;
  /** Display unit per parameter (°F, meq/L…); the stored unit otherwise. */
  readonly units?: Partial<Record<ParameterKey, string>>;
  readonly unitContext?: UnitContext;
}

export type AlertFacts =
  | {
      readonly kind: 'limit';
      readonly action: 'open' | 'escalate' | 'de-escalate' | 'resolve';
      readonly parameter: ParameterKey;
      readonly value: number;
      readonly measuredAt: Date;
      readonly source: ReadingSource;
      readonly severity: LimitSeverity;
      readonly direction: LimitDirection;
      readonly limit: number;
      /** The inhabitants the same reading does not suit: one cause, one alert, named together. */
      readonly concerns?: readonly LivestockConcern[];
    }
  | {
      readonly kind: 'rate';
      readonly parameter: ParameterKey;
      readonly breach: RateBreach;
      readonly rule: RateRule;
    }
  | {
      readonly kind: 'device-stale';
      readonly deviceName: string;
      /** Null for a device that has not reported since it was added. */
      readonly lastSeen: Date | null;
      readonly silentForMs: number;
    }
  | {
      readonly kind: 'test-overdue';
      readonly parameter: ParameterKey;
      readonly lastMeasuredAt: Date | null;
      readonly intervalMs: number;
      readonly now: Date;
    }
  | {
      readonly kind: 'livestock';
      readonly parameter: ParameterKey;
      readonly value: number;
      readonly measuredAt: Date;
      readonly concerns: readonly LivestockConcern[];
    }
  | {
      readonly kind: 'free-ammonia';
      readonly totalAmmonia: number;
      readonly pH: number;
      readonly tempC: number;
      readonly freeAmmonia: number;
      readonly severity: LimitSeverity;
      readonly measuredAt: Date;
    };

export interface AlertDescription {
  readonly kind: AlertKind;
  readonly severity: AlertSeverity;
  readonly title: string;
  readonly body: string;
  /** Shown with critical alerts and wherever acting early helps. */
  readonly firstSteps: FirstSteps | null;
}

const sourceWords: Readonly<Record<ReadingSource, string>> = {
  device: 'by the tank’s device',
  'home-test': 'in a home test',
  visit: 'at a visit',
};

const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

/** "45 minutes", "3 hours", "9 days": rounded to the unit a person would use. */
export function formatDuration(ms: number): string {
  if (ms < 90 * minuteMs) return plural(Math.max(1, Math.round(ms / minuteMs)), 'minute');
  if (ms < 36 * hourMs) return plural(Math.round(ms / hourMs), 'hour');
  return plural(Math.round(ms / dayMs), 'day');
}

function formatPer(ms: number): string {
  if (ms === hourMs) return 'an hour';
  if (ms === dayMs) return 'a day';
  return `per ${formatDuration(ms)}`;
}

export function describeAlert(facts: AlertFacts, context: DescribeContext): AlertDescription {
  const { tankName, timeZone = 'UTC' } = context;
  const show = (parameter: ParameterKey, value: number, trim = false): string =>
    formatValue(parameter, value, {
      ...(context.units?.[parameter] === undefined ? {} : { unit: context.units[parameter] }),
      ...(context.unitContext === undefined ? {} : { context: context.unitContext }),
      trim,
    });

  const display = (parameter: ParameterKey) => ({
    ...(context.units?.[parameter] === undefined ? {} : { unit: context.units[parameter] }),
    ...(context.unitContext === undefined ? {} : { context: context.unitContext }),
  });

  // A difference is converted end by end: a rise of 1 °C is 1.8 °F, not 33.8 °F.
  const showChange = (parameter: ParameterKey, from: number, to: number): string => {
    const unit = context.units?.[parameter] ?? parameterCatalogue[parameter].unit;
    const unitContext = context.unitContext ?? {};
    const change = Math.abs(
      fromStored(parameter, to, unit, unitContext) - fromStored(parameter, from, unit, unitContext),
    );
    const symbol = unitSymbol(parameter, unit);
    const number = String(Number(change.toFixed(unitDecimals(parameter, unit))));
    return symbol === '' ? number : `${number} ${symbol}`;
  };

  switch (facts.kind) {
    case 'limit': {
      const { parameter, value, direction, severity, limit, action } = facts;
      const { label } = parameterCatalogue[parameter];
      const side = direction === 'high' ? 'above' : 'below';
      const when = `Measured ${sourceWords[facts.source]} at ${formatDateTime(facts.measuredAt, timeZone)}.`;
      // Written at a precision where the reading and the limit differ, so neither contradicts the other.
      const shown = formatAgainstBound(parameter, value, limit, {
        ...(context.units?.[parameter] === undefined ? {} : { unit: context.units[parameter] }),
        ...(context.unitContext === undefined ? {} : { context: context.unitContext }),
      });
      const reading = `${label} ${shown.value}`;
      const bound = `the ${severity} limit of ${shown.bound}`;
      const livestock =
        facts.concerns && facts.concerns.length > 0
          ? `It is also ${toleranceWords(parameter, facts.concerns, display(parameter))}. `
          : '';
      if (action === 'resolve') {
        return {
          kind: 'limit',
          severity: 'notice',
          title: `${label} back within limits in ${tankName}`,
          body: `${reading} is back inside ${bound}. ${when}`,
          firstSteps: null,
        };
      }
      if (action === 'de-escalate') {
        return {
          kind: 'limit',
          severity,
          title: `${label} easing in ${tankName}`,
          body: `${reading} is back inside the critical limit but still ${side} ${bound}. ${livestock}${when}`,
          firstSteps: null,
        };
      }
      const how = severity === 'critical' ? `critically ${direction}` : direction;
      const moved =
        action === 'escalate' ? `${label} has ${direction === 'high' ? 'risen' : 'fallen'} to ` : '';
      const body = moved
        ? `${moved}${shown.value}, ${side} ${bound}. ${livestock}${when}`
        : `${reading} is ${side} ${bound}. ${livestock}${when}`;
      return {
        kind: 'limit',
        severity,
        title: `${label} ${how} in ${tankName}`,
        body,
        firstSteps: firstSteps(parameter, direction, severity),
      };
    }
    case 'rate': {
      const { parameter, breach, rule } = facts;
      const { label } = parameterCatalogue[parameter];
      const verb = breach.direction === 'rising' ? 'rose' : 'fell';
      const moved = showChange(parameter, breach.from.value, breach.to.value);
      const allowed = showChange(parameter, breach.to.value - rule.maxChange, breach.to.value);
      return {
        kind: 'rate',
        severity: 'warning',
        title: `${label} ${breach.direction === 'rising' ? 'rising' : 'falling'} fast in ${tankName}`,
        body:
          `${label} ${verb} by ${moved} in ${formatDuration(breach.elapsedMs)}, faster than the tank’s limit of ` +
          `${allowed} ${formatPer(rule.perMs)}. Now ${show(parameter, breach.to.value)} at ` +
          `${formatDateTime(breach.to.measuredAt, timeZone)}.`,
        firstSteps: firstSteps(parameter, breach.direction === 'rising' ? 'high' : 'low', 'warning'),
      };
    }
    case 'device-stale': {
      return {
        kind: 'device-stale',
        severity: 'warning',
        title: `No recent readings from ${facts.deviceName} in ${tankName}`,
        body:
          (facts.lastSeen
            ? `${facts.deviceName} last sent a reading at ${formatDateTime(facts.lastSeen, timeZone)}, ` +
              `${formatDuration(facts.silentForMs)} ago.`
            : `${facts.deviceName} has sent no reading since it was added ${formatDuration(facts.silentForMs)} ago.`) +
          ' The tank may be fine, but nobody can see it until the device reports again.',
        firstSteps: deviceStaleFirstSteps(),
      };
    }
    case 'test-overdue': {
      const { label } = parameterCatalogue[facts.parameter];
      const usual = `it is usually tested every ${formatDuration(facts.intervalMs)}`;
      const body =
        facts.lastMeasuredAt === null
          ? `${label}: no test recorded yet; ${usual}.`
          : `${label} was last tested ${formatDuration(facts.now.getTime() - facts.lastMeasuredAt.getTime())} ago, ` +
            `at ${formatDateTime(facts.lastMeasuredAt, timeZone)}; ${usual}.`;
      return {
        kind: 'test-overdue',
        severity: 'notice',
        title: `${label} test due in ${tankName}`,
        body,
        firstSteps: null,
      };
    }
    case 'livestock': {
      const { label } = parameterCatalogue[facts.parameter];
      const words = describeConcerns(facts.parameter, facts.value, facts.concerns, display(facts.parameter));
      return {
        kind: 'livestock',
        severity: 'warning',
        title: `${label} outside what some livestock tolerate in ${tankName}`,
        body: `${words}. Measured at ${formatDateTime(facts.measuredAt, timeZone)}.`,
        firstSteps: null,
      };
    }
    case 'free-ammonia': {
      const limit = freeAmmoniaThresholds[facts.severity];
      return {
        kind: 'free-ammonia',
        severity: facts.severity,
        title: `Harmful free ammonia in ${tankName}`,
        body:
          `Total ammonia ${show('ammonia', facts.totalAmmonia)} at pH ${show('ph', facts.pH)} and ` +
          `${show('temperature', facts.tempC)} means about ${facts.freeAmmonia.toFixed(3)} mg/L of free ammonia (NH3), ` +
          `above the ${facts.severity} level of ${limit} mg/L. ` +
          `Measured at ${formatDateTime(facts.measuredAt, timeZone)}.`,
        firstSteps: firstSteps('ammonia', 'high', facts.severity),
      };
    }
  }
}
