import { deviceStaleFirstSteps, firstSteps, type FirstSteps } from '@shared/alerts/first-steps';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { formatAgainstBound, formatValue } from '@shared/parameters/units';
import type { AlertView } from '@shared/schemas/alerts';
import type { LimitDirection } from '@shared/parameters/limits';

/**
 * Which side of its limit the alert is on. The view does not carry the stored direction, so it is
 * read from the reading against the limit it crossed; a `direction` field is used when present.
 */
export function alertDirection(alert: AlertView): LimitDirection | null {
  const stated = 'direction' in alert ? (alert as { direction?: unknown }).direction : undefined;
  if (stated === 'high' || stated === 'low') return stated;
  if (alert.kind === 'free-ammonia') return 'high';
  if (alert.kind !== 'limit' || alert.value === null || alert.limitValue === null) return null;
  return alert.value > alert.limitValue ? 'high' : 'low';
}

/** First aid for a critical alert that is not yet resolved; null when there is nothing specific to say. */
export function criticalFirstSteps(alert: AlertView): FirstSteps | null {
  if (alert.severity !== 'critical' || alert.status === 'resolved') return null;
  const direction = alertDirection(alert);
  const parameter = alert.kind === 'free-ammonia' ? 'ammonia' : alert.parameter;
  if (!parameter || !direction) return null;
  const steps = firstSteps(parameter, direction, 'critical');
  return steps.steps.length > 0 ? steps : null;
}

/**
 * What an owner can do now for an open alert on their tank page: the full first aid for a critical
 * reading, the gentle steps for a warning, and the checks for a device gone quiet.
 */
export function openAlertFirstSteps(alert: AlertView): FirstSteps | null {
  if (alert.status === 'resolved') return null;
  if (alert.kind === 'device-stale') return deviceStaleFirstSteps();
  if (alert.severity === 'critical') return criticalFirstSteps(alert);
  if (alert.severity !== 'warning') return null;
  const direction = alertDirection(alert);
  const parameter = alert.kind === 'free-ammonia' ? 'ammonia' : alert.parameter;
  if (!parameter || !direction) return null;
  const steps = firstSteps(parameter, direction, 'warning');
  return steps.steps.length > 0 ? steps : null;
}

export interface ReadingFacts {
  label: string;
  reading: string;
  limit: string | null;
}

/** "Temperature: 30.5 °C, limit 29 °C", where the alert is about a reading against a limit. */
export function readingFacts(alert: AlertView): ReadingFacts | null {
  if (alert.value === null) return null;
  if (alert.kind === 'free-ammonia') {
    return {
      label: 'Free ammonia (NH3)',
      reading: `${alert.value.toFixed(3)} mg/L`,
      limit: alert.limitValue === null ? null : `${alert.limitValue} mg/L`,
    };
  }
  if (!alert.parameter) return null;
  const { label } = parameterCatalogue[alert.parameter];
  // A rate alert's "limit" is an allowed change per period, not a level to compare with.
  const comparable = alert.kind === 'limit' || alert.kind === 'livestock';
  if (!comparable || alert.limitValue === null) {
    return { label, reading: formatValue(alert.parameter, alert.value), limit: null };
  }
  // Never "36.0 ppt" beside "limit 36 ppt": both get the decimals that tell them apart.
  const shown = formatAgainstBound(alert.parameter, alert.value, alert.limitValue);
  return { label, reading: shown.value, limit: shown.bound };
}
