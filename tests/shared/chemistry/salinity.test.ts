import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { conductivityFromSalinity, practicalSalinity, salinityFromConductivity } from '@shared/chemistry';

const asPublished = { temperatureScale: 'IPTS-68' } as const;
const standardSeawaterConductivity = 42.914; // mS/cm at S 35, 15 °C, 0 dbar (Culkin & Smith 1980)

describe('practicalSalinity (PSS-78)', () => {
  // Check values printed with the SAL78 algorithm in Fofonoff & Millard (1983), UNESCO Tech. Pap. Mar. Sci. 44.
  it.each([
    { ratio: 1, t: 15, p: 0, salinity: 35.0 },
    { ratio: 1.2, t: 20, p: 2000, salinity: 37.245628 },
    { ratio: 0.65, t: 5, p: 1500, salinity: 27.995347 },
  ])(
    'gives S = $salinity for R = $ratio, t68 = $t °C, p = $p dbar (UNESCO Tech. Pap. 44, ±5e-7)',
    ({ ratio, t, p, salinity }) => {
      expect(Math.abs(practicalSalinity(ratio, t, p, asPublished) - salinity)).toBeLessThanOrEqual(5e-7);
    },
  );

  it('gives S = 40.0000 for R = 1.888091, t68 = 40 °C, p = 10000 dbar (UNESCO Tech. Pap. 44 check value, ±5e-5)', () => {
    const salinity = practicalSalinity(1.888091, 40, 10_000, { ...asPublished, allowOutsideValidity: true });

    expect(Math.abs(salinity - 40)).toBeLessThanOrEqual(5e-5);
  });

  it('refuses 40 °C unless asked, because PSS-78 was fitted only for −2…35 °C (Lewis 1980)', () => {
    expect(() => practicalSalinity(1.888091, 40, 10_000, asPublished)).toThrow(
      new RangeError('tempC must be between -2 and 35 (PSS-78 validity), got 40'),
    );
  });

  it('converts ITS-90 input with t68 = 1.00024 · t90 before evaluating', () => {
    const t90 = 25;

    expect(practicalSalinity(1.1, t90)).toBe(practicalSalinity(1.1, 1.00024 * t90, 0, asPublished));
    expect(practicalSalinity(1.1, t90)).not.toBe(practicalSalinity(1.1, t90, 0, asPublished));
  });

  it('rejects a ratio whose salinity falls outside 2–42, naming the argument and the range', () => {
    expect(() => practicalSalinity(0.01, 15)).toThrow(
      /^practical salinity from conductivityRatio 0\.01 must be between 2 and 42 \(PSS-78 validity\), got /,
    );
  });

  it('rejects bad pressure, temperature and scale arguments', () => {
    expect(() => practicalSalinity(1, 15, -1)).toThrow(
      new RangeError('pressureDbar must be between 0 and 10000 (PSS-78 validity), got -1'),
    );
    expect(() => practicalSalinity(1, Number.NaN)).toThrow(
      new RangeError('tempC must be a finite number, got NaN'),
    );
    expect(() => practicalSalinity(0, 15)).toThrow(
      new RangeError('conductivityRatio must be greater than 0, got 0'),
    );
    expect(() => practicalSalinity(1, 15, 0, { temperatureScale: 'Kelvin' as never })).toThrow(
      new RangeError("temperatureScale must be one of 'ITS-90', 'IPTS-68', got Kelvin"),
    );
  });
});

describe('salinityFromConductivity', () => {
  it('reads standard seawater, 42.914 mS/cm at 15 °C, as S = 35 (Culkin & Smith 1980; ±5e-7)', () => {
    const salinity = salinityFromConductivity(standardSeawaterConductivity, 15, asPublished);

    expect(Math.abs(salinity - 35)).toBeLessThanOrEqual(5e-7);
  });

  it('reads about 53 mS/cm as S ≈ 35 at 25 °C (from memory: the usual figure for a 25 °C probe, ±0.1)', () => {
    expect(salinityFromConductivity(53, 25)).toBeCloseTo(35, 0);
    expect(Math.abs(salinityFromConductivity(53, 25) - 35)).toBeLessThan(0.1);
  });

  it('reads lower salinity from the same conductivity in warmer water', () => {
    fc.assert(
      // 50 mS/cm stays inside PSS-78's 2–42 between 15 and 35 °C.
      fc.property(fc.double({ min: 15, max: 34, noNaN: true }), (t) => {
        expect(salinityFromConductivity(50, t + 1)).toBeLessThan(salinityFromConductivity(50, t));
      }),
    );
  });

  it('rejects a non-positive conductivity', () => {
    expect(() => salinityFromConductivity(-3, 25)).toThrow(
      new RangeError('mSPerCm must be greater than 0, got -3'),
    );
  });
});

describe('conductivityFromSalinity', () => {
  it('gives 42.914 mS/cm for S = 35 at 15 °C (PSS-78 definition, Culkin & Smith 1980; ±1e-8 in ratio)', () => {
    // The published coefficients give S(R = 1, 15 °C) = 35 − 8e-8, so the exact inverse sits 2e-9 above R = 1.
    const ratio = conductivityFromSalinity(35, 15, asPublished) / standardSeawaterConductivity;

    expect(Math.abs(ratio - 1)).toBeLessThan(1e-8);
  });

  it('inverts salinityFromConductivity to 1e-9 in conductivity ratio over the validity range', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 42, noNaN: true }),
        fc.double({ min: -2, max: 35, noNaN: true }),
        (salinity, t) => {
          const ratio = conductivityFromSalinity(salinity, t) / standardSeawaterConductivity;
          const recovered = salinityFromConductivity(ratio * standardSeawaterConductivity, t);
          const ratioAgain = conductivityFromSalinity(recovered, t) / standardSeawaterConductivity;

          expect(Math.abs(recovered - salinity)).toBeLessThan(1e-7);
          expect(Math.abs(ratioAgain - ratio)).toBeLessThan(1e-9);
        },
      ),
    );
  });

  it('agrees with practicalSalinity at atmospheric pressure', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 42, noNaN: true }),
        fc.double({ min: -2, max: 35, noNaN: true }),
        (salinity, t) => {
          const ratio = conductivityFromSalinity(salinity, t) / standardSeawaterConductivity;

          expect(Math.abs(practicalSalinity(ratio, t) - salinity)).toBeLessThan(1e-7);
        },
      ),
    );
  });

  it('rises with salinity at every temperature', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 41, noNaN: true }),
        fc.double({ min: -2, max: 35, noNaN: true }),
        (salinity, t) => {
          expect(conductivityFromSalinity(salinity + 1, t)).toBeGreaterThan(
            conductivityFromSalinity(salinity, t),
          );
        },
      ),
    );
  });

  it('rejects a salinity outside PSS-78 validity with the argument and range in the message', () => {
    expect(() => conductivityFromSalinity(50, 25)).toThrow(
      new RangeError('salinity must be between 2 and 42 (PSS-78 validity), got 50'),
    );
    expect(() => conductivityFromSalinity(35, 36)).toThrow(
      new RangeError('tempC must be between -2 and 35 (PSS-78 validity), got 36'),
    );
  });
});
