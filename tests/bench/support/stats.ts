/** Small, pure figures the benches report; tested in tests/bench/support/*.test.ts. */

export function median(values: readonly number[]): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/** Nearest-rank percentile (p in 0..1): the smallest sample with at least p of them at or below it. */
export function percentile(values: readonly number[], p: number): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))]!;
}

/**
 * ours / baseline for figures where more is better (requests per second); for times, where less
 * is better, the caller passes `lowerIsBetter` and gets baseline / ours, so a ratio above 1 always
 * means ours does better.
 */
export function ratio(ours: number, baseline: number, lowerIsBetter = false): number {
  if (!(ours > 0) || !(baseline > 0)) return Number.NaN;
  return lowerIsBetter ? baseline / ours : ours / baseline;
}

/** Formats a figure with a unit, keeping three significant digits for small ones. */
export function formatFigure(value: number, unit: string): string {
  if (!Number.isFinite(value)) return '—';
  const digits = Math.abs(value) >= 100 ? 0 : Math.abs(value) >= 10 ? 1 : 2;
  const text = value.toLocaleString('en-GB', { minimumFractionDigits: 0, maximumFractionDigits: digits });
  return unit === '' ? text : `${text} ${unit}`;
}
