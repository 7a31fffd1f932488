import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { convertAlkalinity, type AlkalinityUnit } from '@shared/chemistry';

const units: readonly AlkalinityUnit[] = ['dKH', 'meq/L', 'mg/L CaCO3'];

describe('convertAlkalinity', () => {
  // 1 °dKH = 10 mg/L CaO; M(CaO) = 56.077 g/mol (CIAAW 2021); 2 eq/mol → 20 / 56.077 = 0.35665 meq/L.
  it('makes 1 dKH = 0.3566 meq/L (German degree = 10 mg/L CaO, CIAAW 2021 masses; ±0.00005)', () => {
    expect(Math.abs(convertAlkalinity(1, 'dKH', 'meq/L') - 0.35665)).toBeLessThan(0.00005);
  });

  // 56.077 / 20 = 2.8039: the "2.8 dKH per meq/L" of common practice.
  it('makes 1 meq/L = 2.804 dKH, the familiar 2.8 (derived from 10 mg/L CaO; ±0.0005)', () => {
    expect(Math.abs(convertAlkalinity(1, 'meq/L', 'dKH') - 2.8039)).toBeLessThan(0.0005);
  });

  // M(CaCO3)/2 = 100.086 / 2 = 50.043 mg per meq from CIAAW 2021, not Standard Methods 2320 B's 50.000.
  it('makes 1 meq/L = 50.04 mg/L as CaCO3 from molar masses, not the 50.000 of Standard Methods 2320 B (±0.005)', () => {
    const mgPerMeq = convertAlkalinity(1, 'meq/L', 'mg/L CaCO3');

    expect(Math.abs(mgPerMeq - 50.04)).toBeLessThan(0.005);
    expect(Math.abs(mgPerMeq - 50.0)).toBeGreaterThan(0.04);
  });

  // 10 mg/L CaO × 100.086 / 56.077 = 17.848 mg/L as CaCO3.
  it('makes 1 dKH = 17.85 mg/L as CaCO3 (derived; ±0.005)', () => {
    expect(Math.abs(convertAlkalinity(1, 'dKH', 'mg/L CaCO3') - 17.848)).toBeLessThan(0.005);
  });

  it('converts a typical reef reading of 8 dKH to 2.85 meq/L (derived; ±0.005)', () => {
    expect(Math.abs(convertAlkalinity(8, 'dKH', 'meq/L') - 2.853)).toBeLessThan(0.005);
  });

  it('returns the value unchanged between equal units', () => {
    expect(convertAlkalinity(7.3, 'dKH', 'dKH')).toBe(7.3);
  });

  it('round-trips between any two units', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1000, noNaN: true }),
        fc.constantFrom(...units),
        fc.constantFrom(...units),
        (value, from, to) => {
          expect(convertAlkalinity(convertAlkalinity(value, from, to), to, from)).toBeCloseTo(value, 9);
        },
      ),
    );
  });

  it('rejects a negative value and an unknown unit', () => {
    expect(() => convertAlkalinity(-1, 'dKH', 'meq/L')).toThrow(
      new RangeError('value must be at least 0, got -1'),
    );
    expect(() => convertAlkalinity(1, 'ppm' as AlkalinityUnit, 'meq/L')).toThrow(
      new RangeError("from must be one of 'dKH', 'meq/L', 'mg/L CaCO3', got ppm"),
    );
  });
});
