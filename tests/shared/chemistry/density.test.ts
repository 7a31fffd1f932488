import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { seawaterDensity } from '@shared/chemistry';

const asPublished = { temperatureScale: 'IPTS-68' } as const;

describe('seawaterDensity (EOS-80, one atmosphere)', () => {
  // Check values for the one-atmosphere equation printed in Fofonoff & Millard (1983), UNESCO Tech. Pap. Mar. Sci. 44.
  it.each([
    { salinity: 0, t: 5, density: 999.96675, source: 'UNESCO Tech. Pap. 44' },
    { salinity: 35, t: 5, density: 1027.67547, source: 'UNESCO Tech. Pap. 44' },
    { salinity: 35, t: 25, density: 1023.34306, source: 'UNESCO Tech. Pap. 44' },
    { salinity: 0, t: 25, density: 997.04796, source: 'UNESCO Tech. Pap. 44, from memory' },
  ])('gives $density kg/m³ at S = $salinity, t68 = $t °C ($source, ±5e-6)', ({ salinity, t, density }) => {
    expect(Math.abs(seawaterDensity(salinity, t, asPublished) - density)).toBeLessThanOrEqual(5e-6);
  });

  it('converts ITS-90 input with t68 = 1.00024 · t90 before evaluating', () => {
    expect(seawaterDensity(35, 25)).toBe(seawaterDensity(35, 1.00024 * 25, asPublished));
  });

  it('puts the density maximum of pure water near 4 °C (about 3.98 °C, from memory)', () => {
    expect(seawaterDensity(0, 4)).toBeGreaterThan(seawaterDensity(0, 3));
    expect(seawaterDensity(0, 4)).toBeGreaterThan(seawaterDensity(0, 5));
  });

  it('grows denser with salinity at every valid temperature', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 41, noNaN: true }),
        fc.double({ min: -2, max: 40, noNaN: true }),
        (salinity, t) => {
          expect(seawaterDensity(salinity + 1, t)).toBeGreaterThan(seawaterDensity(salinity, t));
        },
      ),
    );
  });

  it('grows lighter with warming in reef-tank conditions', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 30, max: 40, noNaN: true }),
        fc.double({ min: 20, max: 29, noNaN: true }),
        (salinity, t) => {
          expect(seawaterDensity(salinity, t + 1)).toBeLessThan(seawaterDensity(salinity, t));
        },
      ),
    );
  });

  it('rejects salinity and temperature outside EOS-80 validity, naming the argument and range', () => {
    expect(() => seawaterDensity(43, 25)).toThrow(
      new RangeError('salinity must be between 0 and 42 (EOS-80 validity), got 43'),
    );
    expect(() => seawaterDensity(35, 41)).toThrow(
      new RangeError('tempC must be between -2 and 40 (EOS-80 validity), got 41'),
    );
    expect(() => seawaterDensity(Number.NaN, 25)).toThrow(
      new RangeError('salinity must be a finite number, got NaN'),
    );
  });
});
