import { dayMs, deviceStaleAfterMs } from '@shared/parameters/catalogue';

export interface DeviceSightings {
  /** Null while the device has never sent a reading. */
  readonly lastSeenAt: Date | null;
  readonly createdAt: Date;
}

export interface StaleDeviceOutcome {
  readonly stale: boolean;
  readonly silentForMs: number;
  readonly staleAfterMs: number;
}

/** How many of its usual reporting intervals a device may miss before it counts as silent. */
export const missedReportsBeforeStale = 3;
/**
 * How many recent gaps between reports set a device's usual interval. The database keeps the last
 * `reportingGapsSampled + 1` report times with each latest reading (reading_device_moments in
 * drizzle/0016): change both together (tests/api/reading-summaries.test.ts checks they agree).
 */
export const reportingGapsSampled = 10;

/**
 * How far back from its last sighting a device's report times are read to find its rhythm: room
 * for the sampled gaps of any device reporting at least every nine days (devices report every few
 * minutes), while the read stays in the latest few month partitions of readings however many years
 * are kept. A device reporting less often than every 45 days shows no gap there and gets the
 * 30-minute default.
 */
export const reportingRhythmLookBackMs = 90 * dayMs;

/**
 * When a device's data stops being current: three of its usual intervals (the median of the gaps
 * between its recent reports, so one late or doubled report moves nothing), never less than
 * `deviceStaleAfterMs` (30 minutes). A device posting every 5 minutes is stale after 30 minutes,
 * one posting hourly after 3 hours. Too few reports to know its rhythm: 30 minutes. Three missed
 * reports before calling a device silent is common practice for polled equipment, not a standard.
 */
export function deviceStaleAfter(recentGapsMs: readonly number[]): number {
  const gaps = recentGapsMs.filter((gap) => gap > 0).sort((a, b) => a - b);
  if (gaps.length === 0) return deviceStaleAfterMs;
  const middle = Math.floor(gaps.length / 2);
  const median = gaps.length % 2 === 1 ? gaps[middle]! : (gaps[middle - 1]! + gaps[middle]!) / 2;
  return Math.max(deviceStaleAfterMs, missedReportsBeforeStale * median);
}

/** The gaps between consecutive report times (any order, repeats ignored), newest first. */
export function reportingGaps(reportedAt: readonly Date[]): number[] {
  const moments = [...new Set(reportedAt.map((at) => at.getTime()))].sort((a, b) => b - a);
  return moments.slice(1).map((at, index) => moments[index]! - at);
}

/**
 * Same rule as tank health: silent for strictly longer than `staleAfterMs`. A device that has never
 * reported is measured from when it was added: a new device gets the same grace as a reading, and
 * one set up but never connected is stale once that grace has passed rather than never.
 */
export function evaluateStaleDevice(
  device: DeviceSightings,
  now: Date,
  staleAfterMs: number = deviceStaleAfterMs,
): StaleDeviceOutcome {
  const since = device.lastSeenAt ?? device.createdAt;
  const silentForMs = Math.max(0, now.getTime() - since.getTime());
  return { stale: silentForMs > staleAfterMs, silentForMs, staleAfterMs };
}
