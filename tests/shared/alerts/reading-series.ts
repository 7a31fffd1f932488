import {
  evaluateThreshold,
  initialThresholdState,
  type ThresholdAction,
  type ThresholdOptions,
  type ThresholdOutcome,
  type ThresholdReading,
} from '@shared/alerts/threshold';
import type { ParameterLimits } from '@shared/parameters/limits';
import type { ReadingSource } from '@shared/readings/sources';
import { createTestClock, minutes } from '../../helpers/clock';

export const seriesStart = '2026-12-01T08:00:00Z';

export function limits(overrides: Partial<ParameterLimits> = {}): ParameterLimits {
  return { warnLow: null, warnHigh: null, critLow: null, critHigh: null, ...overrides };
}

/** Readings of the given values, `everyMs` apart, from `start`. */
export function series(
  values: readonly number[],
  {
    source = 'device',
    everyMs = minutes(5),
    start = seriesStart,
  }: {
    source?: ReadingSource;
    everyMs?: number;
    start?: string;
  } = {},
): ThresholdReading[] {
  const clock = createTestClock(new Date(start));
  return values.map((value, i) => {
    if (i > 0) clock.advance(everyMs);
    return { value, source, measuredAt: clock.now() };
  });
}

/** Feeds readings through `evaluateThreshold` from a closed state, as the API will. */
export function runThreshold(
  readings: readonly ThresholdReading[],
  bounds: ParameterLimits,
  opts: ThresholdOptions,
): { outcomes: ThresholdOutcome[]; actions: ThresholdAction[]; last: ThresholdOutcome | undefined } {
  let state = initialThresholdState;
  const outcomes = readings.map((reading) => {
    const result = evaluateThreshold(state, reading, bounds, opts);
    state = result.state;
    return result;
  });
  return { outcomes, actions: outcomes.map((o) => o.action), last: outcomes.at(-1) };
}

export const count = (actions: readonly ThresholdAction[], action: ThresholdAction): number =>
  actions.filter((a) => a === action).length;
