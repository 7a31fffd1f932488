import type { RateRule } from '@shared/parameters/limits';

export interface TimedValue {
  readonly value: number;
  readonly measuredAt: Date;
}

export interface RateBreach {
  readonly direction: 'rising' | 'falling';
  /** Change per `rule.perMs`, signed. */
  readonly change: number;
  readonly from: TimedValue;
  readonly to: TimedValue;
  readonly elapsedMs: number;
}

export interface RateOutcome {
  readonly breach: RateBreach | null;
  /**
   * The worst change is at most `rateSettleFraction` of the rule: an open rate alert may resolve.
   * Between that and the rule it stays as it is, so a rate hovering at the rule cannot flap.
   */
  readonly settled: boolean;
  /** The largest change per `rule.perMs` seen, signed; null with fewer than two readings. */
  readonly worstChange: number | null;
}

export const rateSettleFraction = 0.5;

/**
 * Compares the latest reading with each earlier one in the window. A gap shorter than
 * `rule.perMs` is compared as it is, never scaled up, so two noisy readings a minute apart
 * cannot look like a fast climb; a longer gap is averaged down to `rule.perMs`, so daily home
 * tests a little more than a day apart still count.
 */
export function evaluateRate(readings: readonly TimedValue[], rule: RateRule): RateOutcome {
  const ordered = [...readings].sort((a, b) => a.measuredAt.getTime() - b.measuredAt.getTime());
  const latest = ordered.at(-1);
  let worst: RateBreach | null = null;
  if (latest !== undefined) {
    for (const earlier of ordered.slice(0, -1)) {
      const elapsedMs = latest.measuredAt.getTime() - earlier.measuredAt.getTime();
      if (elapsedMs <= 0) continue;
      const change = ((latest.value - earlier.value) * rule.perMs) / Math.max(elapsedMs, rule.perMs);
      if (worst === null || Math.abs(change) > Math.abs(worst.change)) {
        const direction = change >= 0 ? 'rising' : 'falling';
        worst = { direction, change, from: earlier, to: latest, elapsedMs };
      }
    }
  }
  const size = worst === null ? 0 : Math.abs(worst.change);
  return {
    breach: worst !== null && size > rule.maxChange ? worst : null,
    settled: size <= rule.maxChange * rateSettleFraction,
    worstChange: worst?.change ?? null,
  };
}
