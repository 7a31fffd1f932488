import { describe, expect, it } from 'vitest';
import { limitTemplates } from '@shared/parameters/limit-templates';
import { limitsInForce } from '@shared/parameters/limits-in-force';

const unwatched = { warnLow: null, warnHigh: null, critLow: null, critHigh: null };

describe('limitsInForce', () => {
  it('follows the style template where the tank has no row of its own', () => {
    const inForce = limitsInForce('sps-reef', []);

    expect(inForce.alkalinity).toEqual({ limits: limitTemplates['sps-reef'].alkalinity, source: 'template' });
    expect(Object.keys(inForce).sort()).toEqual(Object.keys(limitTemplates['sps-reef']).sort());
  });

  it("takes the tank's own row whole, even when it leaves a bound open", () => {
    const own = { parameter: 'temperature' as const, warnLow: 24, warnHigh: null, critLow: 22, critHigh: 29 };

    expect(limitsInForce('sps-reef', [own]).temperature).toEqual({
      limits: { warnLow: 24, warnHigh: null, critLow: 22, critHigh: 29 },
      source: 'tank',
    });
  });

  it('keeps a row with four empty bounds, which is how a parameter stops being watched', () => {
    expect(limitsInForce('mixed-reef', [{ parameter: 'orp', ...unwatched }]).orp).toEqual({
      limits: unwatched,
      source: 'tank',
    });
  });

  it('adds a parameter the style leaves out when the tank has a row for it, and nothing else', () => {
    const inForce = limitsInForce('planted-freshwater', [
      { parameter: 'salinity', warnLow: 0, warnHigh: 1, critLow: null, critHigh: 2 },
    ]);

    expect(inForce.salinity?.source).toBe('tank');
    expect(inForce.orp).toBeUndefined();
  });
});
