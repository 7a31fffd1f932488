import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  commonPracticeMaxDailyRise,
  doseGrams,
  dosingCompounds,
  type DosingCompound,
} from '@shared/chemistry';

describe('doseGrams', () => {
  // Arithmetic from CIAAW 2021 molar masses, 1 dKH = 20 / 56.077 = 0.35665 meq/L:
  it.each([
    // 100 L × 0.35665 mmol/L × 84.006 mg/mmol = 2996.1 mg
    { compound: 'sodium bicarbonate', rise: 1, grams: 2.9961 },
    // 100 L × 0.35665 / 2 mmol/L × 105.988 mg/mmol = 1890.0 mg
    { compound: 'sodium carbonate', rise: 1, grams: 1.89 },
    // 100 L × 20 mg/L Ca × 147.008 / 40.078 = 7336.1 mg
    { compound: 'calcium chloride dihydrate', rise: 20, grams: 7.3361 },
    // 100 L × 100 mg/L Mg × 203.295 / 24.305 = 83 643 mg
    { compound: 'magnesium chloride hexahydrate', rise: 100, grams: 83.643 },
    // 100 L × 100 mg/L Mg × 246.466 / 24.305 = 101 406 mg
    { compound: 'magnesium sulfate heptahydrate', rise: 100, grams: 101.406 },
  ] satisfies { compound: DosingCompound; rise: number; grams: number }[])(
    'needs $grams g of $compound to raise 100 L by $rise (molar-mass arithmetic, CIAAW 2021; ±0.1 %)',
    ({ compound, rise, grams }) => {
      expect(Math.abs(doseGrams(compound, 100, rise) - grams) / grams).toBeLessThan(0.001);
    },
  );

  it('needs 2 × 84.006 / 105.988 = 1.585 times more bicarbonate than carbonate for the same rise (2 eq per carbonate)', () => {
    const ratio = doseGrams('sodium bicarbonate', 50, 1) / doseGrams('sodium carbonate', 50, 1);

    expect(ratio).toBeCloseTo(1.5852, 4);
  });

  it('scales with volume and rise', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...dosingCompounds),
        fc.double({ min: 1, max: 10_000, noNaN: true }),
        fc.double({ min: 0.01, max: 200, noNaN: true }),
        (compound, volume, rise) => {
          const single = doseGrams(compound, volume, rise);

          expect(doseGrams(compound, 2 * volume, rise)).toBeCloseTo(2 * single, 9);
          expect(doseGrams(compound, volume, 3 * rise)).toBeCloseTo(3 * single, 9);
        },
      ),
    );
  });

  it('needs nothing for an empty tank or no rise', () => {
    expect(doseGrams('sodium carbonate', 0, 1)).toBe(0);
    expect(doseGrams('sodium carbonate', 100, 0)).toBe(0);
  });

  it('rejects a negative volume, a negative rise and an unknown compound', () => {
    expect(() => doseGrams('sodium bicarbonate', -5, 1)).toThrow(
      new RangeError('volumeLitres must be at least 0, got -5'),
    );
    expect(() => doseGrams('sodium bicarbonate', 100, -1)).toThrow(
      new RangeError('rise must be at least 0, got -1'),
    );
    expect(() => doseGrams('baking soda' as DosingCompound, 100, 1)).toThrow(/^compound must be one of /);
  });
});

describe('commonPracticeMaxDailyRise', () => {
  it('gives every dosing compound a limit (common practice)', () => {
    expect(Object.keys(commonPracticeMaxDailyRise).sort()).toEqual([...dosingCompounds].sort());
  });

  it('uses about 1 dKH, 20 mg/L Ca and 100 mg/L Mg a day (common practice)', () => {
    expect(commonPracticeMaxDailyRise['sodium bicarbonate']).toEqual({ rise: 1, unit: 'dKH' });
    expect(commonPracticeMaxDailyRise['sodium carbonate']).toEqual({ rise: 1, unit: 'dKH' });
    expect(commonPracticeMaxDailyRise['calcium chloride dihydrate']).toEqual({ rise: 20, unit: 'mg/L Ca' });
    expect(commonPracticeMaxDailyRise['magnesium chloride hexahydrate']).toEqual({
      rise: 100,
      unit: 'mg/L Mg',
    });
    expect(commonPracticeMaxDailyRise['magnesium sulfate heptahydrate']).toEqual({
      rise: 100,
      unit: 'mg/L Mg',
    });
  });
});
