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
  /** A bucket's width in ms; absent for a single reading. */
  readonly widthMs?: number;
}

/**
 * A daily swing is shown only from at least this many days with at least two readings each: one
 * day (a home test and a visit on the same afternoon, say) is an anecdote, not an average.
 */
export const minSwingDays = 2;

export interface WindowStats {
  readonly count: number;
  readonly mean: number;
  readonly min: number;
  readonly max: number;
  /**
   * Mean of (highest − lowest) over the UTC days with at least two readings; null unless there are
   * `minSwingDays` such days, or when the samples are buckets wider than a day.
   */
  readonly averageDailySwing: number | null;
  /** How many days the swing is averaged over (0 when it is null). */
  readonly swingDays: number;
  /** Least-squares slope, in units per day; null with fewer than two distinct times. */
  readonly trendPerDay: number | null;
  /**
   * From the first sample to the last, in ms. Under a day, a slope "per day" would stretch a few
   * hours' change into a day's: the change over this span is what to show instead.
   */
  readonly spanMs: number;
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
  const swings = daySwings(present);
  const enoughDays = swings !== null && swings.length >= minSwingDays;
  return {
    count,
    mean: sum / count,
    min,
    max,
    averageDailySwing: enoughDays ? meanOf(swings) : null,
    swingDays: enoughDays ? swings.length : 0,
    trendPerDay: trendPerDay(present),
    spanMs: Math.max(...present.map((s) => s.at)) - Math.min(...present.map((s) => s.at)),
  };
}

/**
 * Highest minus lowest for each UTC day with at least two readings; null when a sample is a bucket
 * wider than a day, whose spread covers several days. Narrower buckets start on whole multiples of
 * their width from a UTC midnight (shared/readings/buckets.ts), so each one lies inside one day.
 */
function daySwings(samples: readonly SeriesSample[]): number[] | null {
  const days = new Map<number, { min: number; max: number; count: number }>();
  for (const s of samples) {
    if ((s.widthMs ?? 0) > dayMs) return null;
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
  return [...days.values()].filter((d) => d.count >= 2).map((d) => d.max - d.min);
}

const meanOf = (values: readonly number[]) => values.reduce((a, b) => a + b, 0) / values.length;

/** Mean of the swings of the days with at least two readings, however few; null when there are none. */
export function averageDailySwing(samples: readonly SeriesSample[]): number | null {
  const swings = daySwings(samples);
  return swings === null || swings.length === 0 ? null : meanOf(swings);
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

export type TrendDirection = 'rising' | 'falling' | 'steady';

/**
 * Which way a trend goes, as it will be read. A slope is steady when it rounds to zero at the
 * precision it is shown with (`perDayDecimals`), or when over the whole window (`windowDays`) it
 * adds up to less than the value's own last shown digit (`valueDecimals`): a "0.000 a day" trend
 * called "falling" contradicts itself, and a change smaller than a test can show is noise.
 */
export function trendDirection(
  perDay: number,
  {
    perDayDecimals,
    valueDecimals,
    windowDays,
  }: { perDayDecimals: number; valueDecimals: number; windowDays: number },
): TrendDirection {
  const shownPerDay = Number(Math.abs(perDay).toFixed(perDayDecimals));
  if (shownPerDay === 0) return 'steady';
  if (Math.abs(perDay * windowDays) < 10 ** -valueDecimals) return 'steady';
  return perDay > 0 ? 'rising' : 'falling';
}
