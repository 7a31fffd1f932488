import { formatFixed, formatNumber } from '../../../lib/format';

/** A number inside a sentence: up to `decimals` decimals, trailing zeros dropped. */
export function formatPlain(value: number, decimals = 4): string {
  return formatNumber(value, decimals);
}

/** Grams read best with fewer decimals as they grow: 2.99 g, 29.9 g, 299 g. */
export function formatGrams(grams: number): string {
  if (grams < 10) return formatFixed(grams, 2);
  if (grams < 100) return formatFixed(grams, 1);
  return formatFixed(grams, 0);
}
