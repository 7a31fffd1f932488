import { describe, expect, it } from 'vitest';
import { dayMs, hourMs, minuteMs } from '@shared/parameters/catalogue';
import { bucketOrigin, bucketWidthMs } from '@shared/readings/buckets';

const bucketsTouched = (from: number, to: number, width: number) => {
  const origin = Date.parse(bucketOrigin);
  return Math.floor((to - origin) / width) - Math.floor((from - origin) / width) + 1;
};

describe('bucketWidthMs', () => {
  it('picks whole, readable widths for the chart ranges', () => {
    expect(bucketWidthMs(dayMs, 500)).toBe(5 * minuteMs);
    expect(bucketWidthMs(7 * dayMs, 500)).toBe(30 * minuteMs);
    expect(bucketWidthMs(30 * dayMs, 500)).toBe(2 * hourMs);
    expect(bucketWidthMs(90 * dayMs, 500)).toBe(6 * hourMs);
    expect(bucketWidthMs(365 * dayMs, 500)).toBe(dayMs);
  });

  it('never lets a window touch more buckets than allowed, wherever it starts', () => {
    const ranges = [dayMs, 7 * dayMs, 30 * dayMs, 90 * dayMs, 365 * dayMs, 4 * 365 * dayMs, 3 * hourMs + 17];
    for (const range of ranges) {
      for (const points of [10, 97, 500, 2000]) {
        const width = bucketWidthMs(range, points);
        for (const offset of [0, 1, 7 * minuteMs + 3, 13 * hourMs]) {
          const from = Date.parse('2026-03-29T00:00:00Z') + offset;
          expect(bucketsTouched(from, from + range, width)).toBeLessThanOrEqual(points);
        }
      }
    }
  });

  it('refuses an empty window and too few buckets', () => {
    expect(() => bucketWidthMs(0, 500)).toThrow(RangeError);
    expect(() => bucketWidthMs(dayMs, 2)).toThrow(RangeError);
  });
});
