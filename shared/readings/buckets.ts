import { dayMs, hourMs, minuteMs } from '@shared/parameters/catalogue';

/** Bucket widths a chart reads well: whole minutes, hours and days. */
const niceSteps = [
  minuteMs,
  2 * minuteMs,
  5 * minuteMs,
  10 * minuteMs,
  15 * minuteMs,
  30 * minuteMs,
  hourMs,
  2 * hourMs,
  3 * hourMs,
  4 * hourMs,
  6 * hourMs,
  8 * hourMs,
  12 * hourMs,
  dayMs,
  2 * dayMs,
  3 * dayMs,
  7 * dayMs,
  14 * dayMs,
  30 * dayMs,
] as const;

/**
 * Every bucket starts a whole number of widths after this instant: a Monday at 00:00 UTC, so day
 * and week buckets fall on UTC days and weeks, and the same window always gives the same buckets.
 */
export const bucketOrigin = '2000-01-03T00:00:00Z';

/**
 * The narrowest nice width that keeps a window within `maxBuckets`. A window that does not start on
 * a bucket boundary touches up to ⌊range / width⌋ + 2 buckets, which is what is bounded here.
 */
export function bucketWidthMs(rangeMs: number, maxBuckets: number): number {
  if (!(rangeMs > 0)) throw new RangeError('the window must have a positive length');
  if (!Number.isInteger(maxBuckets) || maxBuckets < 3) throw new RangeError('allow at least 3 buckets');
  const fits = (width: number) => Math.floor(rangeMs / width) + 2 <= maxBuckets;
  const nice = niceSteps.find(fits);
  if (nice !== undefined) return nice;
  const days = Math.ceil(rangeMs / (maxBuckets - 2) / dayMs);
  return (fits(days * dayMs) ? days : days + 1) * dayMs;
}
