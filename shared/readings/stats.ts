import { dayMs } from '@shared/parameters/catalogue';

/**
 * One point of a series: a single reading (count 1, min = mean = max) or a bucket of readings
 * summarised by PostgreSQL. `at` is the reading's time or the bucket's start, in epoch ms.
 */
export interface SeriesSample {
  readonly at: number;
  readonly min: number;
  readonly mean: number;
  readonly max: number;
  readonly count: number;
}

export interface WindowStats {
  readonly count: number;
  readonly mean: number;
  readonly min: number;
  readonly max: number;
  /** Mean of (highest − lowest) over the days with at least two readings; null when there are none. */
  readonly averageDailySwing: number | null;
  /** Least-squares slope, in units per day; null with fewer than two distinct times. */
  readonly trendPerDay: number | null;
}

export function sampleOf(at: number, value: number): SeriesSample {
  return { at, min: value, mean: value, max: value, count: 1 };
}

/**
 * Mean, extremes, daily swing and trend of a window. Means are weighted by count, so buckets give
 * the same mean as the raw readings; the trend fits bucket means weighted by count, which leaves out
 * the scatter inside each bucket (exact for raw readings, close for buckets much shorter than the
 * window). Days are UTC days, the same days the API's day buckets use.
 */
export function windowStats(samples: readonly SeriesSample[]): WindowStats | null {
  const present = samples.filter((s) => s.count > 0);
  if (present.length === 0) return null;
  let count = 0;
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  for (const s of present) {
    count += s.count;
    sum += s.mean * s.count;
    min = Math.min(min, s.min);
    max = Math.max(max, s.max);
  }
  return {
    count,
    mean: sum / count,
    min,
    max,
    averageDailySwing: averageDailySwing(present),
    trendPerDay: trendPerDay(present),
  };
}

export function averageDailySwing(samples: readonly SeriesSample[]): number | null {
  const days = new Map<number, { min: number; max: number; count: number }>();
  for (const s of samples) {
    const day = Math.floor(s.at / dayMs);
    const seen = days.get(day);
    if (seen) {
      seen.min = Math.min(seen.min, s.min);
      seen.max = Math.max(seen.max, s.max);
      seen.count += s.count;
    } else {
      days.set(day, { min: s.min, max: s.max, count: s.count });
    }
  }
  const swings = [...days.values()].filter((d) => d.count >= 2).map((d) => d.max - d.min);
  if (swings.length === 0) return null;
  return swings.reduce((a, b) => a + b, 0) / swings.length;
}

export function trendPerDay(samples: readonly SeriesSample[]): number | null {
  let weight = 0;
  let meanT = 0;
  let meanV = 0;
  for (const s of samples) {
    weight += s.count;
    meanT += s.at * s.count;
    meanV += s.mean * s.count;
  }
  if (weight === 0) return null;
  meanT /= weight;
  meanV /= weight;
  let covariance = 0;
  let variance = 0;
  for (const s of samples) {
    // Times in days from the weighted mean keep the sums well inside double precision.
    const t = (s.at - meanT) / dayMs;
    covariance += s.count * t * (s.mean - meanV);
    variance += s.count * t * t;
  }
  return variance > 0 ? covariance / variance : null;
}
