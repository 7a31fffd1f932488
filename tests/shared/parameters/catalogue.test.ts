import { describe, expect, it } from 'vitest';
import {
  dayMs,
  isPlausible,
  minuteMs,
  parameterCatalogue,
  parametersFor,
} from '@shared/parameters/catalogue';
import { parameterKeys } from '@shared/parameters/keys';
import { entryUnits } from '@shared/parameters/units';

describe('parameterCatalogue', () => {
  it('describes every parameter under its own key', () => {
    for (const key of parameterKeys) expect(parameterCatalogue[key].key).toBe(key);
  });

  it('uses plain labels', () => {
    expect(parameterKeys.map((key) => parameterCatalogue[key].label)).toEqual([
      'Temperature',
      'Salinity',
      'pH',
      'Alkalinity',
      'Calcium',
      'Magnesium',
      'Nitrate',
      'Phosphate',
      'Ammonia (total)',
      'Nitrite',
      'ORP',
      'General hardness (GH)',
      'Carbonate hardness (KH)',
    ]);
  });

  it('stores each parameter in the first of its entry units', () => {
    for (const key of parameterKeys) expect(entryUnits[key][0]).toBe(parameterCatalogue[key].unit);
  });

  it('expects home tests at common-practice intervals: temperature daily, alkalinity weekly, calcium fortnightly', () => {
    expect(parameterCatalogue.temperature.homeTestIntervalMs).toBe(dayMs);
    expect(parameterCatalogue.alkalinity.homeTestIntervalMs).toBe(7 * dayMs);
    expect(parameterCatalogue.calcium.homeTestIntervalMs).toBe(14 * dayMs);
  });

  it('treats every device as stale after 30 minutes', () => {
    for (const key of parameterKeys) expect(parameterCatalogue[key].deviceStaleAfterMs).toBe(30 * minuteMs);
  });

  it('has a positive deadband for every parameter and the common-practice rate limits', () => {
    for (const key of parameterKeys) expect(parameterCatalogue[key].deadband).toBeGreaterThan(0);
    expect(parameterCatalogue.temperature.rateOfChange).toEqual({ maxChange: 1, perMs: 60 * minuteMs });
    expect(parameterCatalogue.alkalinity.rateOfChange).toEqual({ maxChange: 1, perMs: dayMs });
    expect(parameterCatalogue.salinity.rateOfChange).toEqual({ maxChange: 1, perMs: dayMs });
  });

  it('keeps salinity and marine chemistry out of freshwater tanks, and GH out of marine ones', () => {
    expect(parametersFor('fresh')).not.toContain('salinity');
    expect(parametersFor('fresh')).not.toContain('calcium');
    expect(parametersFor('marine')).not.toContain('gh');
    expect(parametersFor('marine')).toContain('alkalinity');
  });

  it('accepts values inside the plausible bounds only', () => {
    expect(isPlausible('temperature', 0)).toBe(true);
    expect(isPlausible('temperature', 45)).toBe(true);
    expect(isPlausible('temperature', 45.1)).toBe(false);
    expect(isPlausible('ph', Number.NaN)).toBe(false);
  });
});
