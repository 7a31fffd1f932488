import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  nitrateAsNFromNO3,
  nitrateAsNO3FromN,
  phosphateAsPFromPO4,
  phosphateAsPO4FromP,
} from '@shared/chemistry';

describe('nitrate as N and as NO3', () => {
  // M(NO3) / M(N) = (14.007 + 3 × 15.999) / 14.007 = 62.004 / 14.007 (CIAAW 2021).
  it('makes 1 mg/L NO3-N = 4.4266 mg/L NO3 (CIAAW 2021 masses; ±0.00005)', () => {
    expect(Math.abs(nitrateAsNO3FromN(1) - 4.42664)).toBeLessThan(0.00005);
  });

  it('reads 10 mg/L NO3 as 2.259 mg/L NO3-N (derived; ±0.0005)', () => {
    expect(Math.abs(nitrateAsNFromNO3(10) - 2.259)).toBeLessThan(0.0005);
  });

  it('round-trips', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1000, noNaN: true }), (n) => {
        expect(nitrateAsNFromNO3(nitrateAsNO3FromN(n))).toBeCloseTo(n, 9);
      }),
    );
  });

  it('rejects negative and non-finite amounts', () => {
    expect(() => nitrateAsNO3FromN(-2)).toThrow(new RangeError('n must be at least 0, got -2'));
    expect(() => nitrateAsNFromNO3(Number.POSITIVE_INFINITY)).toThrow(
      new RangeError('no3 must be a finite number, got Infinity'),
    );
  });
});

describe('phosphate as P and as PO4', () => {
  // M(PO4) / M(P) = (30.973762 + 4 × 15.999) / 30.973762 = 94.969762 / 30.973762 (CIAAW 2021).
  it('makes 1 mg/L PO4-P = 3.0661 mg/L PO4 (CIAAW 2021 masses; ±0.00005)', () => {
    expect(Math.abs(phosphateAsPO4FromP(1) - 3.06613)).toBeLessThan(0.00005);
  });

  it('reads 0.1 mg/L PO4 as 0.0326 mg/L PO4-P (derived; ±0.00005)', () => {
    expect(Math.abs(phosphateAsPFromPO4(0.1) - 0.032614)).toBeLessThan(0.00005);
  });

  it('round-trips', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 100, noNaN: true }), (p) => {
        expect(phosphateAsPFromPO4(phosphateAsPO4FromP(p))).toBeCloseTo(p, 9);
      }),
    );
  });

  it('rejects negative amounts', () => {
    expect(() => phosphateAsPO4FromP(-0.1)).toThrow(new RangeError('p must be at least 0, got -0.1'));
    expect(() => phosphateAsPFromPO4(-0.1)).toThrow(new RangeError('po4 must be at least 0, got -0.1'));
  });
});
