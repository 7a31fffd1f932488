import { checkNumber } from './range-check';

// Exact by definition: US gallon = 231 in³ = 3.785411784 L (NIST SP 811, Appendix B);
// imperial gallon = 4.54609 L (UK Weights and Measures Act 1985).
const litresPerUsGallon = 3.785411784;
const litresPerImperialGallon = 4.54609;

const absoluteZero = { celsius: -273.15, fahrenheit: -459.67 } as const;

export function celsiusFromFahrenheit(f: number): number {
  checkNumber('f', f, { min: absoluteZero.fahrenheit, basis: 'absolute zero' });
  return ((f - 32) * 5) / 9;
}

export function fahrenheitFromCelsius(c: number): number {
  checkNumber('c', c, { min: absoluteZero.celsius, basis: 'absolute zero' });
  return (c * 9) / 5 + 32;
}

export function litresFromUsGallons(g: number): number {
  return checkNumber('g', g, { min: 0 }) * litresPerUsGallon;
}

export function usGallonsFromLitres(l: number): number {
  return checkNumber('l', l, { min: 0 }) / litresPerUsGallon;
}

export function litresFromImperialGallons(g: number): number {
  return checkNumber('g', g, { min: 0 }) * litresPerImperialGallon;
}
