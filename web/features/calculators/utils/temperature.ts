import { z } from 'zod';
import { celsiusFromFahrenheit, fahrenheitFromCelsius } from '@shared/chemistry/index';
import { parseDecimal } from '../../../lib/decimal';

/** The calculators' "Temperatures in" switch. */
export const temperatureUnit = z.enum(['°C', '°F']);
export type TemperatureUnit = z.infer<typeof temperatureUnit>;

/** The unit the switch has just left, as it holds only two. */
export const otherTemperatureUnit = (unit: TemperatureUnit): TemperatureUnit => (unit === '°C' ? '°F' : '°C');

export function toCelsius(value: number, unit: TemperatureUnit): number {
  return unit === '°C' ? value : celsiusFromFahrenheit(value);
}

export function fromCelsius(celsius: number, unit: TemperatureUnit): number {
  return unit === '°C' ? celsius : fahrenheitFromCelsius(celsius);
}

/** Keeps a typed temperature the same physical value when the unit changes: 25 °C ↔ 77 °F. */
export function convertTemperatureText(raw: string, from: TemperatureUnit, to: TemperatureUnit): string {
  const parsed = parseDecimal(raw);
  if (from === to || parsed.state !== 'number') return raw;
  try {
    return String(Number(fromCelsius(toCelsius(parsed.value, from), to).toFixed(2)));
  } catch (error) {
    if (error instanceof RangeError) return raw;
    throw error;
  }
}

/** The choices of the calculators' "Temperatures in" switch. */
export const temperatureUnits = [
  { value: '°C', label: '°C' },
  { value: '°F', label: '°F' },
] as const satisfies readonly { value: TemperatureUnit; label: string }[];
