import { describe, expect, it } from 'vitest';
import { limitsFromComfort } from '@shared/readings/comfort-limits';
import { parameterLimits } from '@shared/parameters/limits';

describe('limitsFromComfort', () => {
  it('makes the comfort range the warning band and keeps the critical bounds outside it', () => {
    const limits = limitsFromComfort(
      { warnLow: 24, warnHigh: 27.5, critLow: 22.5, critHigh: 29 },
      { min: 24.5, max: 27 },
    );

    expect(limits).toEqual({ warnLow: 24.5, warnHigh: 27, critLow: 22.5, critHigh: 29 });
    expect(parameterLimits.safeParse(limits).success).toBe(true);
  });

  it('moves a critical bound out to the band when the band would cross it', () => {
    const limits = limitsFromComfort(
      { warnLow: 34, warnHigh: 35, critLow: 33, critHigh: 35.5 },
      { min: 32, max: 36 },
    );

    expect(limits).toEqual({ warnLow: 32, warnHigh: 36, critLow: 32, critHigh: 36 });
    expect(parameterLimits.safeParse(limits).success).toBe(true);
  });

  it('leaves open critical bounds open', () => {
    expect(limitsFromComfort(null, { min: 1, max: 10 })).toEqual({
      warnLow: 1,
      warnHigh: 10,
      critLow: null,
      critHigh: null,
    });
  });
});
