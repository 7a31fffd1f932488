import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  conductivityFromSalinity,
  salinityFromConductivity,
  salinityFromSpecificGravity,
  specificGravity,
} from '@shared/chemistry';

const asPublished = { temperatureScale: 'IPTS-68' } as const;

describe('specificGravity', () => {
  it('is the ratio of the UNESCO 44 check densities ρ(35, 25)/ρ(0, 25) for 25/25 °C (UNESCO Tech. Pap. 44, ±1e-8)', () => {
    const expected = 1023.34306 / 997.04796;

    expect(Math.abs(specificGravity(35, 25, 25, asPublished) - expected)).toBeLessThan(1e-8);
  });

  it('is exactly 1 for pure water read at its own temperature', () => {
    expect(specificGravity(0, 18)).toBe(1);
  });

  it('uses the sample temperature as the reference unless told otherwise', () => {
    expect(specificGravity(35, 25)).toBe(specificGravity(35, 25, 25));
  });

  it('reads higher against a colder reference, where pure water is denser than at 25 °C', () => {
    expect(specificGravity(35, 25, 4)).toBeLessThan(specificGravity(35, 25, 25));
  });

  it('rises with salinity', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 41, noNaN: true }),
        fc.double({ min: -2, max: 40, noNaN: true }),
        fc.double({ min: -2, max: 40, noNaN: true }),
        (salinity, sample, reference) => {
          expect(specificGravity(salinity + 1, sample, reference)).toBeGreaterThan(
            specificGravity(salinity, sample, reference),
          );
        },
      ),
    );
  });

  it('rejects a reference temperature outside EOS-80 validity', () => {
    expect(() => specificGravity(35, 25, 60)).toThrow(
      new RangeError('referenceTempC must be between -2 and 40 (EOS-80 validity), got 60'),
    );
  });
});

describe('salinityFromSpecificGravity', () => {
  // Sanity values derived from EOS-80 for the two common hydrometer references (approximate, ±0.05).
  it('reads SG 1.026 at 25 °C against a 25 °C reference as salinity ≈ 34.5', () => {
    expect(Math.abs(salinityFromSpecificGravity(1.026, 25, 25) - 34.5)).toBeLessThan(0.05);
  });

  it('reads SG 1.026 at 25 °C against a 4 °C reference as salinity ≈ 38.5', () => {
    expect(Math.abs(salinityFromSpecificGravity(1.026, 25, 4) - 38.5)).toBeLessThan(0.05);
  });

  it('inverts specificGravity to 1e-6 in salinity over the EOS-80 range', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 42, noNaN: true }),
        fc.double({ min: -2, max: 40, noNaN: true }),
        fc.double({ min: -2, max: 40, noNaN: true }),
        (salinity, sample, reference) => {
          const sg = specificGravity(salinity, sample, reference);

          expect(Math.abs(salinityFromSpecificGravity(sg, sample, reference) - salinity)).toBeLessThan(1e-6);
        },
      ),
    );
  });

  it('round-trips a probe reading: conductivity → salinity → SG → salinity → conductivity', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 42, noNaN: true }),
        fc.double({ min: 0, max: 35, noNaN: true }),
        fc.constantFrom(4, 15.56, 20, 25),
        (startSalinity, t, reference) => {
          const mSPerCm = conductivityFromSalinity(startSalinity, t);

          const salinity = salinityFromConductivity(mSPerCm, t);
          const sg = specificGravity(salinity, t, reference);
          const back = conductivityFromSalinity(salinityFromSpecificGravity(sg, t, reference), t);

          expect(Math.abs(back - mSPerCm) / mSPerCm).toBeLessThan(1e-7);
        },
      ),
    );
  });

  it('rejects a specific gravity no salinity in 0–42 can produce, stating the reachable range', () => {
    expect(() => salinityFromSpecificGravity(1.1, 25)).toThrow(
      new RangeError(
        'sg must be between 1 and 1.03169 (EOS-80 salinity 0 to 42 at sample 25 °C, reference 25 °C), got 1.1',
      ),
    );
    expect(() => salinityFromSpecificGravity(Number.NaN, 25)).toThrow(
      new RangeError('sg must be a finite number, got NaN'),
    );
  });
});
