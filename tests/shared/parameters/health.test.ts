import { describe, expect, it } from 'vitest';
import {
  expectedIntervalMs,
  expectedIntervalsMs,
  limitBreach,
  parameterHealth,
  tankStatus,
  type LatestReading,
} from '@shared/parameters/health';
import { parameterKeys } from '@shared/parameters/keys';
import type { ParameterLimits } from '@shared/parameters/limits';
import type { ReadingSource } from '@shared/readings/sources';
import { createTestClock, days, minutes } from '../../helpers/clock';
import { seriesStart } from '../alerts/reading-series';

const temperature: ParameterLimits = { warnLow: 24, warnHigh: 27, critLow: 22, critHigh: 28.5 };
const deviceInterval = minutes(30);

function readingAgo(value: number, ageMs: number, source: ReadingSource = 'device') {
  const clock = createTestClock(new Date(seriesStart));
  const measuredAt = clock.now();
  clock.advance(ageMs);
  const now = clock.now();
  const latest: LatestReading = { value, measuredAt, source };
  return { latest, now };
}

describe('parameterHealth', () => {
  it('is in range for a fresh reading inside the limits', () => {
    const { latest, now } = readingAgo(25.5, minutes(5));

    expect(parameterHealth(latest, temperature, deviceInterval, now)).toBe('in-range');
  });

  it('is a warning beyond a warning limit and critical beyond a critical one', () => {
    const { now } = readingAgo(0, 0);
    const at = (value: number) =>
      parameterHealth({ value, measuredAt: now, source: 'device' }, temperature, deviceInterval, now);

    expect([at(27.1), at(23.9), at(28.6), at(21.9), at(27), at(28.5)]).toEqual([
      'warning',
      'warning',
      'critical',
      'critical',
      'in-range',
      'warning',
    ]);
  });

  it('goes stale once an in-range reading is older than its expected interval', () => {
    const onTime = readingAgo(25.5, deviceInterval);
    const late = readingAgo(25.5, deviceInterval + 1);

    expect(parameterHealth(onTime.latest, temperature, deviceInterval, onTime.now)).toBe('in-range');
    expect(parameterHealth(late.latest, temperature, deviceInterval, late.now)).toBe('stale');
  });

  it('keeps an old out-of-limits reading at its severity: bad news does not go stale', () => {
    const { latest, now } = readingAgo(29, days(3));

    expect(parameterHealth(latest, temperature, deviceInterval, now)).toBe('critical');
  });

  it('is stale with no reading at all', () => {
    expect(parameterHealth(null, temperature, deviceInterval, new Date())).toBe('stale');
  });

  it('never goes stale with no expected interval, and is in range with no limits', () => {
    const { latest, now } = readingAgo(380, days(90), 'visit');

    expect(parameterHealth(latest, null, null, now)).toBe('in-range');
  });
});

describe('expectedIntervalMs', () => {
  it('expects devices every 30 minutes and home tests at the catalogue interval', () => {
    expect(expectedIntervalMs('temperature', 'device')).toBe(minutes(30));
    expect(expectedIntervalMs('alkalinity', 'home-test')).toBe(days(7));
    expect(expectedIntervalMs('calcium', 'visit')).toBe(days(14));
    expect(expectedIntervalMs('orp', 'visit')).toBeNull();
  });

  it('lists every parameter for the SQL side', () => {
    expect(Object.keys(expectedIntervalsMs).sort()).toEqual([...parameterKeys].sort());
  });
});

describe('limitBreach', () => {
  it('names the severity, side and bound crossed', () => {
    expect(limitBreach(28.6, temperature)).toEqual({ severity: 'critical', direction: 'high', limit: 28.5 });
    expect(limitBreach(23, temperature)).toEqual({ severity: 'warning', direction: 'low', limit: 24 });
    expect(limitBreach(25, temperature)).toBeNull();
    expect(limitBreach(25, null)).toBeNull();
  });
});

describe('tankStatus', () => {
  it('is healthy when every parameter is current and in range', () => {
    expect(tankStatus(['in-range', 'in-range'])).toBe('healthy');
  });

  it('is an alert when anything is critical, whatever else is true', () => {
    expect(tankStatus(['in-range', 'warning', 'critical', 'stale'])).toBe('alert');
  });

  it('is watch when anything is at a warning', () => {
    expect(tankStatus(['in-range', 'warning', 'stale'])).toBe('watch');
  });

  it('is watch when some parameters have gone stale and the rest are in range', () => {
    expect(tankStatus(['in-range', 'stale'])).toBe('watch');
  });

  it('is no-data when every parameter is stale or none is tracked', () => {
    expect(tankStatus(['stale', 'stale'])).toBe('no-data');
    expect(tankStatus([])).toBe('no-data');
  });
});
