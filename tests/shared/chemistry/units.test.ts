import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  celsiusFromFahrenheit,
  fahrenheitFromCelsius,
  litresFromImperialGallons,
  litresFromUsGallons,
  usGallonsFromLitres,
} from '@shared/chemistry';

describe('gallons', () => {
  it('defines the US gallon as exactly 3.785411784 L (NIST SP 811, Appendix B)', () => {
    expect(litresFromUsGallons(1)).toBe(3.785411784);
  });

  it('agrees with 231 cubic inches of 2.54 cm (NIST SP 811), to 1e-12 L', () => {
    const cubicInchInLitres = 2.54 ** 3 / 1000;
    expect(litresFromUsGallons(1)).toBeCloseTo(231 * cubicInchInLitres, 12);
  });

  it('defines the imperial gallon as exactly 4.54609 L (UK Weights and Measures Act 1985)', () => {
    expect(litresFromImperialGallons(1)).toBe(4.54609);
  });

  it('converts a 75 US gallon tank to litres and back', () => {
    const litres = litresFromUsGallons(75);

    expect(litres).toBeCloseTo(283.9058838, 7);
    expect(usGallonsFromLitres(litres)).toBeCloseTo(75, 12);
  });

  it('round-trips any volume between US gallons and litres', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), (gallons) => {
        expect(usGallonsFromLitres(litresFromUsGallons(gallons))).toBeCloseTo(gallons, 6);
      }),
    );
  });

  it('rejects a negative volume, naming the argument', () => {
    expect(() => litresFromUsGallons(-1)).toThrow(new RangeError('g must be at least 0, got -1'));
    expect(() => usGallonsFromLitres(Number.NaN)).toThrow(
      new RangeError('l must be a finite number, got NaN'),
    );
    expect(() => litresFromImperialGallons(Infinity)).toThrow(RangeError);
  });
});

describe('temperature', () => {
  it('maps the fixed points of both scales onto each other (scale definitions)', () => {
    expect(celsiusFromFahrenheit(32)).toBe(0);
    expect(celsiusFromFahrenheit(212)).toBe(100);
    expect(fahrenheitFromCelsius(-40)).toBe(-40);
  });

  it('reads a typical reef temperature of 77 °F as 25 °C', () => {
    expect(celsiusFromFahrenheit(77)).toBeCloseTo(25, 12);
  });

  it('round-trips any temperature', () => {
    fc.assert(
      fc.property(fc.double({ min: -273.15, max: 1000, noNaN: true }), (celsius) => {
        expect(celsiusFromFahrenheit(fahrenheitFromCelsius(celsius))).toBeCloseTo(celsius, 9);
      }),
    );
  });

  it('rejects temperatures below absolute zero and non-numbers', () => {
    expect(() => celsiusFromFahrenheit(-500)).toThrow(
      new RangeError('f must be at least -459.67 (absolute zero), got -500'),
    );
    expect(() => fahrenheitFromCelsius(Number.NaN)).toThrow(
      new RangeError('c must be a finite number, got NaN'),
    );
  });
});
