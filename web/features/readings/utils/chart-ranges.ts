import { formatDayMonth, formatDayMonthTime, formatMonthYear } from '../../../lib/format';

const hour = 3_600_000;
const day = 24 * hour;

export const chartRanges = {
  '24h': { label: '24 h', spoken: 'last 24 hours', ms: day },
  '7d': { label: '7 d', spoken: 'last 7 days', ms: 7 * day },
  '30d': { label: '30 d', spoken: 'last 30 days', ms: 30 * day },
  '90d': { label: '90 d', spoken: 'last 90 days', ms: 90 * day },
  '1y': { label: '1 year', spoken: 'last year', ms: 365 * day },
} as const;

export type ChartRange = keyof typeof chartRanges;
export const chartRangeKeys = Object.keys(chartRanges) as ChartRange[];

/** The unit a chart's time axis counts in: hours for a day or two, days up to a quarter, then months. */
export type AxisUnit = 'hour' | 'day' | 'month';

export function axisUnitFor(spanMs: number): AxisUnit {
  if (spanMs <= 2 * day) return 'hour';
  if (spanMs <= 120 * day) return 'day';
  return 'month';
}

/** A tick's label, always with its date: "1 Dec, 18:00", "1 Dec", "Dec 2026". */
export function axisLabel(at: number, unit: AxisUnit): string {
  if (unit === 'hour') return formatDayMonthTime(at);
  if (unit === 'day') return formatDayMonth(at);
  return formatMonthYear(at);
}

/**
 * Room after the window's end, so the newest reading is drawn whole instead of cut in half by the
 * edge of the chart.
 */
export function axisEndPaddingMs(spanMs: number): number {
  return spanMs * 0.02;
}
