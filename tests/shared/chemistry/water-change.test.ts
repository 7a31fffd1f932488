import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  concentrationAfterWaterChanges,
  waterChangeFractionFor,
  waterChangesNeeded,
} from '@shared/chemistry';

// Mass balance c_n = c_new + (c0 − c_new)(1 − f)^n (common practice derivation, REFERENCES.md).

const concentration = fc.double({ min: 0, max: 1000, noNaN: true });
const fraction = fc.double({ min: 0.01, max: 1, noNaN: true });

describe('concentrationAfterWaterChanges', () => {
  it('takes nitrate from 40 to 20.48 mg/L with three 20 % changes of nitrate-free water (40 × 0.8³, worked example)', () => {
    expect(concentrationAfterWaterChanges(40, 0, 0.2, 3)).toBeCloseTo(20.48, 10);
  });

  it('does one change by default', () => {
    expect(concentrationAfterWaterChanges(40, 0, 0.25)).toBe(30);
  });

  it('raises salinity towards the replacement water: 30 → 33 with 60 % of salinity 35 water', () => {
    expect(concentrationAfterWaterChanges(30, 35, 0.6)).toBeCloseTo(33, 12);
  });

  it('never overshoots the replacement concentration and moves closer with every change', () => {
    fc.assert(
      fc.property(
        concentration,
        concentration,
        fraction,
        fc.integer({ min: 0, max: 50 }),
        (c0, cNew, f, n) => {
          const now = concentrationAfterWaterChanges(c0, cNew, f, n);
          const next = concentrationAfterWaterChanges(c0, cNew, f, n + 1);
          const slack = 1e-9 * Math.max(1, c0, cNew);

          expect(now).toBeGreaterThanOrEqual(Math.min(c0, cNew) - slack);
          expect(now).toBeLessThanOrEqual(Math.max(c0, cNew) + slack);
          expect(Math.abs(next - cNew)).toBeLessThanOrEqual(Math.abs(now - cNew) + slack);
        },
      ),
    );
  });

  it('rejects a fraction outside (0, 1], a fractional count and a negative concentration', () => {
    expect(() => concentrationAfterWaterChanges(40, 0, 0)).toThrow(
      new RangeError('fraction must be greater than 0 and at most 1, got 0'),
    );
    expect(() => concentrationAfterWaterChanges(40, 0, 1.5)).toThrow(
      new RangeError('fraction must be greater than 0 and at most 1, got 1.5'),
    );
    expect(() => concentrationAfterWaterChanges(40, 0, 0.2, 1.5)).toThrow(
      new RangeError('changes must be a whole number, got 1.5'),
    );
    expect(() => concentrationAfterWaterChanges(-1, 0, 0.2)).toThrow(
      new RangeError('c0 must be at least 0, got -1'),
    );
  });
});

describe('waterChangesNeeded', () => {
  it('needs five 25 % changes to bring nitrate from 40 to 10 mg/L (40 × 0.75⁴ = 12.7, × 0.75⁵ = 9.5; worked example)', () => {
    expect(waterChangesNeeded(40, 10, 0, 0.25)).toBe(5);
  });

  it('counts a target met exactly on paper as met: 40 → 20 with one 50 % change', () => {
    expect(waterChangesNeeded(40, 20, 0, 0.5)).toBe(1);
    expect(waterChangesNeeded(40, 5, 0, 0.5)).toBe(3);
  });

  it('needs none when already at the target and one when replacing everything', () => {
    expect(waterChangesNeeded(12, 12, 0, 0.1)).toBe(0);
    expect(waterChangesNeeded(40, 0, 0, 1)).toBe(1);
  });

  it('returns the smallest count that reaches the target', () => {
    fc.assert(
      fc.property(
        concentration,
        concentration,
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.double({ min: 0.05, max: 1, noNaN: true }),
        (c0, cNew, share, f) => {
          fc.pre(Math.abs(c0 - cNew) > 1e-6);
          const target = cNew + (c0 - cNew) * share;

          const n = waterChangesNeeded(c0, target, cNew, f);

          const gap = (k: number) => Math.abs(concentrationAfterWaterChanges(c0, cNew, f, k) - cNew);
          const targetGap = Math.abs(target - cNew);
          expect(gap(n)).toBeLessThanOrEqual(targetGap * (1 + 1e-9));
          if (n > 0) expect(gap(n - 1)).toBeGreaterThan(targetGap * (1 - 1e-9));
        },
      ),
    );
  });

  it('throws a RangeError when the replacement water cannot get there', () => {
    expect(() => waterChangesNeeded(40, 50, 0, 0.2)).toThrow(
      new RangeError(
        'target must lie between c0 (40) and replacementConc (0) to be reached by water changes, got 50',
      ),
    );
    expect(() => waterChangesNeeded(40, 5, 10, 0.2)).toThrow(RangeError);
    expect(() => waterChangesNeeded(40, 0, 0, 0.2)).toThrow(
      /^target equal to replacementConc \(0\) is only approached, never reached/,
    );
  });
});

describe('waterChangeFractionFor', () => {
  it('needs 75 % to take nitrate from 40 to 10 mg/L with nitrate-free water (worked example)', () => {
    expect(waterChangeFractionFor(40, 10, 0)).toBe(0.75);
  });

  it('needs 60 % to raise salinity 30 → 33 with salinity 35 water', () => {
    expect(waterChangeFractionFor(30, 33, 35)).toBeCloseTo(0.6, 12);
  });

  it('needs nothing when already at the target', () => {
    expect(waterChangeFractionFor(20, 20, 0)).toBe(0);
  });

  it('gives a fraction that one change turns into the target', () => {
    fc.assert(
      // share < 1 keeps the target away from c0, where the answer is 0 (no change at all).
      fc.property(
        concentration,
        concentration,
        fc.double({ min: 0, max: 0.99, noNaN: true }),
        (c0, cNew, share) => {
          fc.pre(Math.abs(c0 - cNew) > 1e-6);
          const target = cNew + (c0 - cNew) * share;

          const f = waterChangeFractionFor(c0, target, cNew);

          expect(concentrationAfterWaterChanges(c0, cNew, f)).toBeCloseTo(target, 6);
        },
      ),
    );
  });

  it('throws a RangeError when the target lies beyond the replacement water', () => {
    expect(() => waterChangeFractionFor(40, 5, 10)).toThrow(
      new RangeError(
        'target must lie between c0 (40) and replacementConc (10) to be reached by water changes, got 5',
      ),
    );
  });
});
