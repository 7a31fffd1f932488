import { describe, expect, it } from 'vitest';
import { dayMs, hourMs } from '@shared/parameters/catalogue';
import {
  averageDailySwing,
  sampleOf,
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
