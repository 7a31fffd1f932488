import { describe, expect, it } from 'vitest';
import { dayMs, hourMs } from '@shared/parameters/catalogue';
import {
  averageDailySwing,
  minSwingDays,
  sampleOf,
  trendDirection,
  trendPerDay,
  windowStats,
  type SeriesSample,
} from '@shared/readings/stats';

const t0 = Date.parse('2026-11-01T00:00:00Z');

function bucketOf(values: { at: number; value: number }[]): SeriesSample {
  const numbers = values.map((v) => v.value);
  return {
    at: values[0]!.at,
    min: Math.min(...numbers),
    max: Math.max(...numbers),
    mean: numbers.reduce((a, b) => a + b, 0) / numbers.length,
    count: numbers.length,
  };
}

describe('windowStats', () => {
  it('gives count, mean, min and max of raw readings', () => {
    const stats = windowStats([sampleOf(t0, 25), sampleOf(t0 + hourMs, 26), sampleOf(t0 + 2 * hourMs, 27.5)]);

    expect(stats).toMatchObject({ count: 3, min: 25, max: 27.5 });
    expect(stats!.mean).toBeCloseTo(26.1667, 4);
  });

  it('says how long the readings span, so a few hours are not read as a day', () => {
    const stats = windowStats([sampleOf(t0 + 2 * hourMs, 25.2), sampleOf(t0 + 11 * hourMs, 25)])!;
    expect(stats.spanMs).toBe(9 * hourMs);
    // 0.2 in 9 hours is about 0.53 a day: shown as the change over the span instead.
    expect(stats.trendPerDay! * (stats.spanMs / (24 * hourMs))).toBeCloseTo(-0.2, 12);
  });

  it('weights bucket means by their counts, so buckets give the raw mean', () => {
    const raw = Array.from({ length: 48 }, (_, i) => ({ at: t0 + i * hourMs, value: 8 + (i % 5) / 10 }));
    const buckets = [bucketOf(raw.slice(0, 10)), bucketOf(raw.slice(10, 40)), bucketOf(raw.slice(40))];

    const fromRaw = windowStats(raw.map((r) => sampleOf(r.at, r.value)))!;
    const fromBuckets = windowStats(buckets)!;

    expect(fromBuckets.count).toBe(48);
    expect(fromBuckets.mean).toBeCloseTo(fromRaw.mean, 12);
    expect([fromBuckets.min, fromBuckets.max]).toEqual([fromRaw.min, fromRaw.max]);
  });

  it('is null for an empty window', () => {
    expect(windowStats([])).toBeNull();
    expect(windowStats([{ at: t0, min: 0, mean: 0, max: 0, count: 0 }])).toBeNull();
  });
});

describe('trendPerDay', () => {
  it('is the least-squares slope per day', () => {
    // value = 35 + 0.25 per day, exactly on a line.
    const line = Array.from({ length: 10 }, (_, i) => sampleOf(t0 + i * dayMs, 35 + 0.25 * i));
    expect(trendPerDay(line)).toBeCloseTo(0.25, 12);
  });

  it('matches the textbook slope for scattered points (x = 0,1,2,3 days; y = 1,3,2,5 → 1.1 per day)', () => {
    const points = [1, 3, 2, 5].map((y, x) => sampleOf(t0 + x * dayMs, y));
    expect(trendPerDay(points)).toBeCloseTo(1.1, 12);
  });

  it('is null with one time only', () => {
    expect(trendPerDay([sampleOf(t0, 1)])).toBeNull();
    expect(trendPerDay([sampleOf(t0, 1), sampleOf(t0, 2)])).toBeNull();
  });
});

describe('averageDailySwing', () => {
  it('averages highest minus lowest over UTC days with at least two readings', () => {
    const samples = [
      sampleOf(t0 + 2 * hourMs, 25.1),
      sampleOf(t0 + 14 * hourMs, 25.9),
      sampleOf(t0 + dayMs + 3 * hourMs, 25.4),
      sampleOf(t0 + dayMs + 15 * hourMs, 25.6),
      // A day with one reading has no swing to measure.
      sampleOf(t0 + 2 * dayMs + hourMs, 30),
    ];
    expect(averageDailySwing(samples)).toBeCloseTo((0.8 + 0.2) / 2, 12);
  });

  it('reads a day bucket’s own spread', () => {
    expect(averageDailySwing([{ at: t0, min: 8.0, mean: 8.15, max: 8.3, count: 288 }])).toBeCloseTo(0.3, 12);
  });

  it('is null when no day has two readings', () => {
    expect(averageDailySwing([sampleOf(t0, 1), sampleOf(t0 + 3 * dayMs, 2)])).toBeNull();
  });
});

describe('windowStats daily swing', () => {
  it('gives no daily swing for 79 readings taken once a day', () => {
    const daily = Array.from({ length: 79 }, (_, i) =>
      sampleOf(t0 + i * dayMs + 18 * hourMs, 25 + (i % 3) / 10),
    );

    const stats = windowStats(daily)!;

    expect(stats.count).toBe(79);
    expect(stats.averageDailySwing).toBeNull();
    expect(stats.swingDays).toBe(0);
  });

  it(`needs ${minSwingDays} days with two readings each, not one day that happens to have two`, () => {
    const mostlyDaily = [
      ...Array.from({ length: 10 }, (_, i) => sampleOf(t0 + i * dayMs + 8 * hourMs, 25)),
      // A visit on the afternoon of the third day.
      sampleOf(t0 + 2 * dayMs + 15 * hourMs, 25.8),
    ];
    expect(windowStats(mostlyDaily)!.averageDailySwing).toBeNull();

    const twoDays = [...mostlyDaily, sampleOf(t0 + 5 * dayMs + 15 * hourMs, 25.4)];
    const stats = windowStats(twoDays)!;
    expect(stats.averageDailySwing).toBeCloseTo((0.8 + 0.4) / 2, 12);
    expect(stats.swingDays).toBe(2);
  });

  it('reads hour buckets of a day as that day, and day buckets by their own spread', () => {
    const hourly = (day: number, low: number, high: number): SeriesSample[] => [
      {
        at: t0 + day * dayMs + 3 * hourMs,
        min: low,
        mean: low + 0.1,
        max: low + 0.2,
        count: 12,
        widthMs: hourMs,
      },
      {
        at: t0 + day * dayMs + 15 * hourMs,
        min: high - 0.2,
        mean: high - 0.1,
        max: high,
        count: 12,
        widthMs: hourMs,
      },
    ];
    expect(windowStats([...hourly(0, 25, 26), ...hourly(1, 25.2, 25.8)])!.averageDailySwing).toBeCloseTo(
      (1 + 0.6) / 2,
      12,
    );

    const days = [
      { at: t0, min: 8.0, mean: 8.15, max: 8.3, count: 288, widthMs: dayMs },
      { at: t0 + dayMs, min: 8.1, mean: 8.2, max: 8.3, count: 288, widthMs: dayMs },
    ];
    expect(windowStats(days)!.averageDailySwing).toBeCloseTo((0.3 + 0.2) / 2, 12);
  });

  it('gives no daily swing from buckets wider than a day, whose spread covers several days', () => {
    const wide = [
      { at: t0, min: 8.0, mean: 8.15, max: 8.3, count: 576, widthMs: 2 * dayMs },
      { at: t0 + 2 * dayMs, min: 8.1, mean: 8.2, max: 8.3, count: 576, widthMs: 2 * dayMs },
    ];
    expect(windowStats(wide)!.averageDailySwing).toBeNull();
    expect(averageDailySwing(wide)).toBeNull();
  });
});

describe('trendDirection', () => {
  const pH = { perDayDecimals: 3, valueDecimals: 2 };

  it('calls a slope that shows as 0.000 a day steady, never falling', () => {
    expect(trendDirection(-0.0004, { ...pH, windowDays: 90 })).toBe('steady');
    expect(trendDirection(0.0004, { ...pH, windowDays: 365 })).toBe('steady');
  });

  it('calls a slope steady when the whole window moves less than the last digit of a reading', () => {
    // 0.001 a day for a week is 0.007, less than the 0.01 a pH reading is written to.
    expect(trendDirection(-0.001, { ...pH, windowDays: 7 })).toBe('steady');
  });

  it('says rising or falling for a change the readings show', () => {
    expect(trendDirection(-0.002, { ...pH, windowDays: 90 })).toBe('falling');
    expect(trendDirection(0.05, { perDayDecimals: 2, valueDecimals: 1, windowDays: 7 })).toBe('rising');
  });
});
