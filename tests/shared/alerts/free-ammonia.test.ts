import { describe, expect, it } from 'vitest';
import { evaluateFreeAmmonia, freeAmmoniaThresholds } from '@shared/alerts/free-ammonia';
import { unionizedAmmonia } from '@shared/chemistry/index';

describe('evaluateFreeAmmonia', () => {
  it('uses the common-practice levels of 0.02 and 0.05 mg/L NH3', () => {
    expect(freeAmmoniaThresholds).toEqual({ warning: 0.02, critical: 0.05 });
  });

  it('takes the free ammonia from the chemistry core', () => {
    const result = evaluateFreeAmmonia(0.5, 8.2, 26, 35);

    expect(result.freeAmmonia).toBe(unionizedAmmonia(0.5, 8.2, 26, 35));
    expect(result.fraction * 0.5).toBeCloseTo(result.freeAmmonia, 12);
  });

  it('warns for 0.5 mg/L total ammonia in fresh water at pH 8 and 25 °C (about 5.4% free, Emerson et al. 1975)', () => {
    const result = evaluateFreeAmmonia(0.5, 8, 25);

    expect(result.fraction).toBeCloseTo(0.0537, 3);
    expect(result).toMatchObject({ severity: 'warning', limit: 0.02 });
  });

  it('is critical for 1 mg/L total at the same pH and temperature', () => {
    expect(evaluateFreeAmmonia(1, 8, 25)).toMatchObject({ severity: 'critical', limit: 0.05 });
  });

  it('raises nothing for the same total in acid water, where almost all of it is harmless ammonium', () => {
    expect(evaluateFreeAmmonia(1, 6.5, 25)).toMatchObject({ severity: null, limit: null });
  });

  it('passes on the chemistry core’s RangeError for a pH outside the scale', () => {
    expect(() => evaluateFreeAmmonia(0.5, 15, 25)).toThrow(RangeError);
  });
});
