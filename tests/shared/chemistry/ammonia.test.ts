import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { unionizedAmmonia, unionizedAmmoniaFraction } from '@shared/chemistry';

/**
 * Fraction of total ammonia present as NH3, from the table "calculated from data in Emerson et al.
 * (1975)" in UF/IFAS EDIS publication FA16, "Ammonia in Aquatic Systems" (also printed as Table 1.4
 * of Fundamentals of Aquatic Veterinary Medicine). Printed to four decimals, so ±0.00005.
 */
const emersonTablePoints = [
  { t: 6, pH: 8.4, fraction: 0.0328 },
  { t: 10, pH: 8.0, fraction: 0.0182 },
  { t: 14, pH: 7.6, fraction: 0.01 },
  { t: 18, pH: 7.8, fraction: 0.0211 },
  { t: 20, pH: 7.0, fraction: 0.0039 },
  { t: 20, pH: 8.0, fraction: 0.0381 },
  { t: 22, pH: 8.4, fraction: 0.1031 },
  { t: 26, pH: 8.2, fraction: 0.088 },
  { t: 30, pH: 8.0, fraction: 0.0743 },
  { t: 30, pH: 8.4, fraction: 0.1678 },
] as const;
const tableTolerance = 0.00005;

/** Emerson et al. (1975) as printed: pKa = 0.09018 + 2729.92 / T, with a chosen kelvin offset. */
function emersonFraction(pH: number, t: number, kelvinOffset: number): number {
  return 1 / (1 + 10 ** (0.09018 + 2729.92 / (t + kelvinOffset) - pH));
}

describe('unionizedAmmoniaFraction in fresh water (Emerson et al. 1975)', () => {
  it.each(emersonTablePoints)(
    'gives $fraction at $t °C and pH $pH (UF/IFAS EDIS FA16 table from Emerson et al. 1975, ±0.00005)',
    ({ t, pH, fraction }) => {
      expect(Math.abs(unionizedAmmoniaFraction(pH, t) - fraction)).toBeLessThanOrEqual(tableTolerance);
    },
  );

  it('reproduces that table with T = t + 273.15; with T = t + 273 most points miss (UF/IFAS EDIS FA16)', () => {
    const misses = (offset: number) =>
      emersonTablePoints.filter(
        ({ t, pH, fraction }) => Math.abs(emersonFraction(pH, t, offset) - fraction) > tableTolerance,
      ).length;

    expect(misses(273.15)).toBe(0);
    expect(misses(273)).toBeGreaterThanOrEqual(9);
  });

  it('evaluates the published equation itself when salinity is 0', () => {
    expect(unionizedAmmoniaFraction(8.1, 24)).toBe(emersonFraction(8.1, 24, 273.15));
  });

  it('rises with pH and with temperature', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 49, noNaN: true }),
        (pH, t) => {
          const fraction = unionizedAmmoniaFraction(pH, t);

          expect(fraction).toBeGreaterThan(0);
          expect(fraction).toBeLessThan(1);
          expect(unionizedAmmoniaFraction(pH + 0.1, t)).toBeGreaterThan(fraction);
          expect(unionizedAmmoniaFraction(pH, t + 1)).toBeGreaterThan(fraction);
        },
      ),
    );
  });

  it('rejects temperatures outside the 0–50 °C of the fit', () => {
    expect(() => unionizedAmmoniaFraction(8, 55)).toThrow(
      new RangeError('tempC must be between 0 and 50 (Emerson et al. 1975 fit), got 55'),
    );
  });
});

describe('unionizedAmmoniaFraction in seawater (Clegg & Whitfield 1995, total pH scale)', () => {
  // Worked from CW95 eq. 18 by hand: pK*a = 9.23030 per kg water, + 0.01555 to per kg seawater = 9.24585,
  // so NH3 / total = 1 / (1 + 10^(9.24585 − 8.2)) = 0.08255.
  it('gives 8.26 % NH3 in a reef tank at 25 °C, salinity 35, pH_T 8.2 (Clegg & Whitfield 1995 eq. 18, ±0.00001)', () => {
    expect(Math.abs(unionizedAmmoniaFraction(8.2, 25, 35) - 0.08255)).toBeLessThan(1e-5);
  });

  it('stays within 0.03 pK units of the Johansson & Wedborg (1980) expression recommended by Bell et al. (2007) for 5–30 °C, S 30–36 (expression from memory)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 30, noNaN: true }),
        fc.double({ min: 30, max: 36, noNaN: true }),
        (t, salinity) => {
          const pH = 8;
          const fraction = unionizedAmmoniaFraction(pH, t, salinity);
          const pKa = pH + Math.log10((1 - fraction) / fraction);
          const johanssonWedborg = -0.467 + 0.00113 * salinity + 2887.9 / (t + 273.15);

          expect(Math.abs(pKa - johanssonWedborg)).toBeLessThan(0.03);
        },
      ),
    );
  });

  it('joins the fresh-water curve as salinity falls towards 0 (within 0.005 pK at 25 °C)', () => {
    const pH = 8;
    const pKa = (fraction: number) => pH + Math.log10((1 - fraction) / fraction);

    expect(
      Math.abs(pKa(unionizedAmmoniaFraction(pH, 25, 1e-6)) - pKa(unionizedAmmoniaFraction(pH, 25))),
    ).toBeLessThan(0.005);
  });

  it('rises with pH and temperature across the validity range', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6, max: 9.5, noNaN: true }),
        fc.double({ min: -2, max: 39, noNaN: true }),
        fc.double({ min: 0.5, max: 40, noNaN: true }),
        (pH, t, salinity) => {
          const fraction = unionizedAmmoniaFraction(pH, t, salinity);

          expect(unionizedAmmoniaFraction(pH + 0.1, t, salinity)).toBeGreaterThan(fraction);
          expect(unionizedAmmoniaFraction(pH, t + 1, salinity)).toBeGreaterThan(fraction);
        },
      ),
    );
  });

  it('rejects salinity and temperature outside Clegg & Whitfield validity', () => {
    expect(() => unionizedAmmoniaFraction(8.2, 25, 41)).toThrow(
      new RangeError('salinity must be between 0 and 40 (Clegg & Whitfield 1995 validity), got 41'),
    );
    expect(() => unionizedAmmoniaFraction(8.2, 45, 35)).toThrow(
      new RangeError('tempC must be between -2 and 40 (Clegg & Whitfield 1995 validity), got 45'),
    );
    expect(() => unionizedAmmoniaFraction(15, 25, 35)).toThrow(
      new RangeError('pH must be between 0 and 14 (aqueous pH scale), got 15'),
    );
  });
});

describe('unionizedAmmonia', () => {
  it('returns NH3 in the units of the total: 1.0 mg/L TAN-N at 20 °C, pH 8.0 → 0.0381 mg/L NH3-N (UF/IFAS EDIS FA16, ±0.00005)', () => {
    expect(Math.abs(unionizedAmmonia(1.0, 8.0, 20) - 0.0381)).toBeLessThanOrEqual(0.00005);
  });

  it('never exceeds the total', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 14, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        (total, pH, t) => {
          expect(unionizedAmmonia(total, pH, t, 35)).toBeLessThanOrEqual(total);
        },
      ),
    );
  });

  it('rejects a negative total', () => {
    expect(() => unionizedAmmonia(-0.1, 8, 25)).toThrow(
      new RangeError('totalAmmonia must be at least 0, got -0.1'),
    );
  });
});
