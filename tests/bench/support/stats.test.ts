import { describe, expect, it } from 'vitest';
import { formatFigure, median, percentile, ratio } from './stats';

describe('bench figures', () => {
  it('takes the middle sample, or the mean of the two middle ones', () => {
    expect(median([30, 10, 20])).toBe(20);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNaN();
  });

  it('reads percentiles by nearest rank', () => {
    const samples = Array.from({ length: 100 }, (_, i) => i + 1);
    expect(percentile(samples, 0.5)).toBe(50);
    expect(percentile(samples, 0.95)).toBe(95);
    expect(percentile(samples, 0.99)).toBe(99);
    expect(percentile([7], 0.99)).toBe(7);
  });

  it('gives ratios above 1 when ours does better, for rates and for times', () => {
    expect(ratio(72, 141)).toBeCloseTo(0.511, 3);
    expect(ratio(20, 400, true)).toBe(20);
    expect(ratio(0, 10)).toBeNaN();
  });

  it('formats figures with a unit and fewer decimals as they grow', () => {
    expect(formatFigure(1461.4, 'readings/s')).toBe('1,461 readings/s');
    expect(formatFigure(12.345, 'ms')).toBe('12.3 ms');
    expect(formatFigure(0.5234, '')).toBe('0.52');
    expect(formatFigure(Number.NaN, 'ms')).toBe('—');
  });
});
