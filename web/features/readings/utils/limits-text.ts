import type { ParameterKey } from '@shared/parameters/keys';
import { unitDecimals, unitSymbol } from '@shared/parameters/units';
import type { ParameterLimits } from '@shared/parameters/limits';
import { displayValue } from './display-units';

/** "Warning outside 24.0–27.5 °C · critical outside 22.5–29.0 °C", with open sides said plainly. */
export function limitsSummary(parameter: ParameterKey, limits: ParameterLimits, unit: string): string {
  const symbol = unitSymbol(parameter, unit);
  const number = (value: number) =>
    displayValue(parameter, value, unit).toFixed(unitDecimals(parameter, unit));
  const withUnit = (text: string) => (symbol ? `${text} ${symbol}` : text);
  const band = (low: number | null, high: number | null) => {
    if (low !== null && high !== null) return `outside ${withUnit(`${number(low)}–${number(high)}`)}`;
    if (low !== null) return `below ${withUnit(number(low))}`;
    if (high !== null) return `above ${withUnit(number(high))}`;
    return null;
  };
  const warning = band(limits.warnLow, limits.warnHigh);
  const critical = band(limits.critLow, limits.critHigh);
  return [warning && `Warning ${warning}`, critical && `critical ${critical}`].filter(Boolean).join(' · ');
}

/** "7.00–7.80" (with its unit): the range every inhabitant tolerates, as the chart's unit shows it. */
export function rangeSummary(
  parameter: ParameterKey,
  range: { min: number; max: number },
  unit: string,
): string {
  const symbol = unitSymbol(parameter, unit);
  const number = (value: number) =>
    displayValue(parameter, value, unit).toFixed(unitDecimals(parameter, unit));
  const text = `${number(range.min)}–${number(range.max)}`;
  return symbol ? `${text} ${symbol}` : text;
}
