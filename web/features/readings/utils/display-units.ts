import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { allowedUnits, fromStored, unitDecimals, unitSymbol } from '@shared/parameters/units';
import type { ParameterLimits } from '@shared/parameters/limits';

/** Plain names for the unit pickers; the symbol alone ("SG", "meq/L") is not always clear. */
const unitNames: Record<string, string> = {
  '°C': '°C',
  '°F': '°F',
  salinity: 'ppt (salinity)',
  'specific gravity': 'SG (specific gravity)',
  'conductivity mS/cm': 'mS/cm (conductivity)',
  '': 'pH',
  dKH: 'dKH',
  'meq/L': 'meq/L',
  'mg/L CaCO3': 'mg/L as CaCO3',
  'mg/L': 'mg/L',
  'mg/L NO3': 'mg/L as nitrate (NO3)',
  'mg/L NO3-N': 'mg/L as nitrogen (NO3-N)',
  'mg/L PO4': 'mg/L as phosphate (PO4)',
  'mg/L P': 'mg/L as phosphorus (P)',
  mV: 'mV',
  '°dGH': '°dGH',
  '°dKH': '°dKH',
};

export function unitName(unit: string): string {
  return unitNames[unit] ?? unit;
}

/** Unit choices; `short` gives the symbols ("ppt", "SG", "mg/L NO3-N") for narrow pickers. */
export function unitOptions(parameter: ParameterKey, short = false): { value: string; label: string }[] {
  return allowedUnits(parameter).map((unit) => ({
    value: unit,
    label: short ? unitSymbol(parameter, unit) || 'pH' : unitName(unit),
  }));
}

export const storedUnit = (parameter: ParameterKey): string => parameterCatalogue[parameter].unit;

/** A stored value in a display unit, unrounded (charts and statistics round only what they print). */
export function displayValue(parameter: ParameterKey, stored: number, unit: string): number {
  return fromStored(parameter, stored, unit);
}

/** Limits in a display unit; every conversion here is increasing, so low bounds stay low. */
export function limitsIn(parameter: ParameterKey, limits: ParameterLimits, unit: string): ParameterLimits {
  const convert = (value: number | null) => (value === null ? null : displayValue(parameter, value, unit));
  return {
    warnLow: convert(limits.warnLow),
    warnHigh: convert(limits.warnHigh),
    critLow: convert(limits.critLow),
    critHigh: convert(limits.critHigh),
  };
}

/** "26.1 °C", "1.0264 SG", "8.15" (pH carries its name in the label). */
export function formatIn(parameter: ParameterKey, stored: number, unit: string, extraDecimals = 0): string {
  const decimals = unitDecimals(parameter, unit) + extraDecimals;
  const text = (Number(fromStored(parameter, stored, unit).toFixed(decimals)) || 0).toFixed(decimals);
  const symbol = unitSymbol(parameter, unit);
  return symbol ? `${text} ${symbol}` : text;
}

const preferenceKey = (parameter: ParameterKey) => `brinewatch:unit:${parameter}`;

/** The unit a person last chose for a parameter, kept on this device only. */
export function preferredUnit(parameter: ParameterKey): string {
  try {
    const saved = window.localStorage.getItem(preferenceKey(parameter));
    if (saved !== null && (allowedUnits(parameter) as readonly string[]).includes(saved)) return saved;
  } catch {
    // Private browsing can refuse storage; the stored unit is a fine default.
  }
  return storedUnit(parameter);
}

export function rememberUnit(parameter: ParameterKey, unit: string): void {
  try {
    window.localStorage.setItem(preferenceKey(parameter), unit);
  } catch {
    // Not remembering is harmless.
  }
}
