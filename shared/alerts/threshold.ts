/*
 * One alert per tank and parameter for readings beyond its limits, without flapping:
 * - an alert opens when a reading is strictly beyond a bound (manual readings at once; device
 *   readings once the breach has lasted `dwell.readings` readings or `dwell.minutes`);
 * - it stays open, at its severity, until a reading comes back inside that bound by more than the
 *   deadband (hysteresis), and then resolves at once;
 * - warning → critical is an escalation of the same alert (device readings need the dwell again);
 *   critical → warning is a de-escalation of the same alert, when the reading is back inside the
 *   critical bound by the deadband but still beyond the warning one;
 * - a reading beyond the opposite side replaces the alert (the old one resolves, a new one opens).
 * A device breach counts as continuing while the reading stays beyond its bound less the
 * deadband, so noise around a bound neither resets the dwell nor reopens the alert.
 */
import { z } from 'zod';
import { minuteMs } from '@shared/parameters/catalogue';
import { limitBreach } from '@shared/parameters/health';
import {
  limitDirection,
  limitSeverity,
  type LimitDirection,
  type LimitSeverity,
  type ParameterLimits,
} from '@shared/parameters/limits';
import type { ReadingSource } from '@shared/readings/sources';

const breachRun = z.object({ since: z.coerce.date(), count: z.int().positive() });

/** Kept per tank and parameter between readings; JSON-safe through this schema (dates coerce). */
export const thresholdState = z.object({
  open: z
    .object({ severity: limitSeverity, direction: limitDirection, openedAt: z.coerce.date() })
    .nullable(),
  /** Consecutive device readings beyond a bound, for the dwell. */
  pending: z
    .object({ direction: limitDirection, warning: breachRun, critical: breachRun.nullable() })
    .nullable(),
  lastMeasuredAt: z.coerce.date().nullable(),
});
export type ThresholdState = z.infer<typeof thresholdState>;

export const initialThresholdState: ThresholdState = { open: null, pending: null, lastMeasuredAt: null };

export interface ThresholdReading {
  readonly value: number;
  readonly measuredAt: Date;
  readonly source: ReadingSource;
}

export interface Dwell {
  readonly readings: number;
  readonly minutes: number;
}

export interface ThresholdOptions {
  /** In the parameter's stored unit; `parameterCatalogue[p].deadband` by default in callers. */
  readonly deadband: number;
  /** Device readings only; manual readings always act at once. */
  readonly dwell?: Dwell;
}

export const thresholdActions = ['open', 'escalate', 'de-escalate', 'resolve', 'none'] as const;
export type ThresholdAction = (typeof thresholdActions)[number];

export interface ThresholdOutcome {
  readonly state: ThresholdState;
  readonly action: ThresholdAction;
  /** The alert's severity after the action; for 'resolve', the severity it had. Null when none is open. */
  readonly severity: LimitSeverity | null;
  readonly direction: LimitDirection | null;
  /**
   * The bound that matters for the message: the one crossed ('open', 'escalate', 'none' while
   * open), the warning bound still crossed ('de-escalate') or the one returned within ('resolve').
   */
  readonly limit: number | null;
  /** With 'open': an alert on the other side was open and resolves now. */
  readonly replacesOpenAlert: boolean;
}

type Pending = NonNullable<ThresholdState['pending']>;
type Breach = { readonly severity: LimitSeverity; readonly direction: LimitDirection };

function boundOf(
  limits: ParameterLimits | null,
  severity: LimitSeverity,
  direction: LimitDirection,
): number | null {
  if (limits === null) return null;
  const critical = direction === 'high' ? limits.critHigh : limits.critLow;
  if (severity === 'critical') return critical;
  // A side without a warning bound warns at its critical bound, that is, goes straight to critical.
  return (direction === 'high' ? limits.warnHigh : limits.warnLow) ?? critical;
}

function beyond(value: number, bound: number | null, direction: LimitDirection, margin: number): boolean {
  if (bound === null) return false;
  return direction === 'high' ? value > bound - margin : value < bound + margin;
}

/** Severity on one side, with the bounds moved inwards by `margin` (0 for the strict bounds). */
function levelOn(
  value: number,
  limits: ParameterLimits | null,
  direction: LimitDirection,
  margin: number,
): LimitSeverity | null {
  if (beyond(value, boundOf(limits, 'critical', direction), direction, margin)) return 'critical';
  if (beyond(value, boundOf(limits, 'warning', direction), direction, margin)) return 'warning';
  return null;
}

function advancePending(
  previous: Pending | null,
  value: number,
  at: Date,
  limits: ParameterLimits | null,
  deadband: number,
): Pending | null {
  if (previous !== null) {
    const held = levelOn(value, limits, previous.direction, deadband);
    if (held !== null) {
      const strictlyCritical = levelOn(value, limits, previous.direction, 0) === 'critical';
      const critical =
        held !== 'critical'
          ? null
          : previous.critical !== null
            ? { since: previous.critical.since, count: previous.critical.count + 1 }
            : strictlyCritical
              ? { since: at, count: 1 }
              : null;
      const warning = { since: previous.warning.since, count: previous.warning.count + 1 };
      return { direction: previous.direction, warning, critical };
    }
  }
  const breach = limitBreach(value, limits);
  if (breach === null) return null;
  const run = { since: at, count: 1 };
  return { direction: breach.direction, warning: run, critical: breach.severity === 'critical' ? run : null };
}

function dwellMet(run: Pending['warning'] | null, at: Date, dwell: Dwell): boolean {
  if (run === null) return false;
  return run.count >= dwell.readings || at.getTime() - run.since.getTime() >= dwell.minutes * minuteMs;
}

function confirmedBreach(
  reading: ThresholdReading,
  limits: ParameterLimits | null,
  pending: Pending | null,
  dwell: Dwell | undefined,
): Breach | null {
  if (reading.source !== 'device' || dwell === undefined) return limitBreach(reading.value, limits);
  if (pending === null) return null;
  // The run may continue through readings just inside the bound, but an alert only opens or
  // escalates on a reading that is itself beyond it, so its message never misstates the value.
  const now = levelOn(reading.value, limits, pending.direction, 0);
  if (now === null) return null;
  if (now === 'critical' && dwellMet(pending.critical, reading.measuredAt, dwell)) {
    return { severity: 'critical', direction: pending.direction };
  }
  if (dwellMet(pending.warning, reading.measuredAt, dwell)) {
    return { severity: 'warning', direction: pending.direction };
  }
  return null;
}

function outcome(
  state: ThresholdState,
  action: ThresholdAction,
  limits: ParameterLimits | null,
  shown: Breach | null,
  boundSeverity: LimitSeverity | null = shown?.severity ?? null,
  replacesOpenAlert = false,
): ThresholdOutcome {
  return {
    state,
    action,
    severity: shown?.severity ?? null,
    direction: shown?.direction ?? null,
    limit: shown === null || boundSeverity === null ? null : boundOf(limits, boundSeverity, shown.direction),
    replacesOpenAlert,
  };
}

/**
 * Feed readings in the order they were measured. A reading not newer than the last one seen (a
 * replayed or late batch) changes nothing, so evaluating the same reading twice is harmless.
 */
export function evaluateThreshold(
  state: ThresholdState,
  reading: ThresholdReading,
  limits: ParameterLimits | null,
  opts: ThresholdOptions,
): ThresholdOutcome {
  const deadband = Math.max(0, opts.deadband);
  const at = reading.measuredAt;
  const open = state.open;
  if (state.lastMeasuredAt !== null && at.getTime() <= state.lastMeasuredAt.getTime()) {
    return outcome(state, 'none', limits, open);
  }
  const pending =
    reading.source === 'device'
      ? advancePending(state.pending, reading.value, at, limits, deadband)
      : state.pending;
  const confirmed = confirmedBreach(reading, limits, pending, opts.dwell);
  const next = (nextOpen: ThresholdState['open']): ThresholdState => ({
    open: nextOpen,
    pending,
    lastMeasuredAt: at,
  });
  const opened = (breach: Breach): ThresholdState['open'] => ({
    severity: breach.severity,
    direction: breach.direction,
    openedAt: at,
  });

  if (open === null) {
    if (confirmed === null) return outcome(next(null), 'none', limits, null);
    return outcome(next(opened(confirmed)), 'open', limits, confirmed);
  }

  const held = levelOn(reading.value, limits, open.direction, deadband);
  if (held === null) {
    if (confirmed !== null) {
      return outcome(next(opened(confirmed)), 'open', limits, confirmed, confirmed.severity, true);
    }
    return outcome(next(null), 'resolve', limits, open, 'warning');
  }
  if (open.severity === 'warning') {
    if (confirmed?.severity === 'critical' && confirmed.direction === open.direction) {
      const escalated = { ...open, severity: 'critical' as const };
      return outcome(next(escalated), 'escalate', limits, escalated);
    }
    return outcome(next(open), 'none', limits, open);
  }
  if (held === 'warning') {
    const eased = { ...open, severity: 'warning' as const };
    return outcome(next(eased), 'de-escalate', limits, eased);
  }
  return outcome(next(open), 'none', limits, open);
}
