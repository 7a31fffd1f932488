/*
 * The units a person or a device may enter a reading in, and the one each parameter is stored
 * in. Every conversion goes through shared/chemistry so the portal has one set of equations.
 */
import {
  celsiusFromFahrenheit,
  conductivityFromSalinity,
  convertAlkalinity,
  describeBounds,
  fahrenheitFromCelsius,
  nitrateAsNFromNO3,
  nitrateAsNO3FromN,
  outOfRangeDetails,
  phosphateAsPFromPO4,
  phosphateAsPO4FromP,
  salinityFromConductivity,
  salinityFromSpecificGravity,
  specificGravity,
} from '@shared/chemistry/index';
import { isPlausible, parameterCatalogue, type StoredUnit } from './catalogue';
import type { ParameterKey } from './keys';

/** The stored unit comes first. */
export const entryUnits = {
  temperature: ['°C', '°F'],
  salinity: ['salinity', 'specific gravity', 'conductivity mS/cm'],
  ph: [''],
  alkalinity: ['dKH', 'meq/L', 'mg/L CaCO3'],
  calcium: ['mg/L'],
  magnesium: ['mg/L'],
  nitrate: ['mg/L NO3', 'mg/L NO3-N'],
  phosphate: ['mg/L PO4', 'mg/L P'],
  ammonia: ['mg/L'],
  nitrite: ['mg/L'],
  orp: ['mV'],
  gh: ['°dGH'],
  // Carbonate hardness is what an alkalinity titration measures, so kits sold in meq/L or
  // mg/L CaCO3 convert exactly like alkalinity.
  kh: ['°dKH', 'meq/L', 'mg/L CaCO3'],
} as const satisfies { readonly [P in ParameterKey]: readonly [StoredUnit, ...string[]] };

export type EntryUnit<P extends ParameterKey = ParameterKey> = (typeof entryUnits)[P][number];

/**
 * Temperatures that some units need. Specific gravity needs both: `sampleTempC` (the water as
 * read) and `referenceTempC` (the instrument's calibration, commonly 25 °C or 4 °C). Conductivity
 * uses `sampleTempC`, which is 25 °C for meters that compensate to 25 °C, the usual case.
 */
export interface UnitContext {
  readonly sampleTempC?: number;
  readonly referenceTempC?: number;
}

export interface StoredValue {
  readonly value: number;
  /** How the value was entered, when it was converted; worth keeping beside the reading. */
  readonly note?: string;
}

export class UnitNotAllowedError extends RangeError {
  override readonly name = 'UnitNotAllowedError';

  constructor(
    readonly parameter: ParameterKey,
    readonly unit: string,
    readonly allowed: readonly string[],
  ) {
    const names = allowed.map((u) => `'${u}'`).join(', ');
    super(`${parameterCatalogue[parameter].label} cannot be entered in '${unit}'; use one of ${names}`);
  }
}

/** Conductivity meters sold to keepers compensate to 25 °C. */
const conductivityDefaultTempC = 25;
/** Display default for specific gravity, the pairing most hobby instruments use (common practice). */
const displaySgTempC = 25;

interface UnitSpec {
  readonly symbol: string;
  readonly decimals: number;
  readonly toStored: (value: number, context: UnitContext) => number;
  readonly fromStored: (stored: number, context: UnitContext) => number;
  readonly describe?: (value: number, context: UnitContext) => string;
}

type UnitTable = { readonly [P in ParameterKey]: Readonly<Record<EntryUnit<P>, UnitSpec>> };

function storedSpec(parameter: ParameterKey): UnitSpec {
  const { symbol, decimals } = parameterCatalogue[parameter];
  return { symbol, decimals, toStored: (v) => v, fromStored: (v) => v };
}

function requireSgTemperatures(context: UnitContext): { sample: number; reference: number } {
  const { sampleTempC, referenceTempC } = context;
  if (sampleTempC === undefined || referenceTempC === undefined) {
    throw new RangeError(
      'specific gravity needs the sample temperature (sampleTempC) and the instrument’s reference temperature (referenceTempC)',
    );
  }
  return { sample: sampleTempC, reference: referenceTempC };
}

const alkalinityFrom = (unit: 'meq/L' | 'mg/L CaCO3', symbol: string, decimals: number): UnitSpec => ({
  symbol,
  decimals,
  toStored: (v) => convertAlkalinity(v, unit, 'dKH'),
  fromStored: (v) => convertAlkalinity(v, 'dKH', unit),
  describe: (v) => `${v} ${symbol}`,
});

const units: UnitTable = {
  temperature: {
    '°C': storedSpec('temperature'),
    '°F': {
      symbol: '°F',
      decimals: 1,
      toStored: celsiusFromFahrenheit,
      fromStored: fahrenheitFromCelsius,
      describe: (v) => `${v} °F`,
    },
  },
  salinity: {
    salinity: storedSpec('salinity'),
    'specific gravity': {
      symbol: 'SG',
      decimals: 4,
      toStored: (v, context) => {
        const { sample, reference } = requireSgTemperatures(context);
        return salinityFromSpecificGravity(v, sample, reference);
      },
      fromStored: (v, context) =>
        specificGravity(v, context.sampleTempC ?? displaySgTempC, context.referenceTempC ?? displaySgTempC),
      describe: (v, context) => {
        const { sample, reference } = requireSgTemperatures(context);
        return `specific gravity ${v} at ${sample} °C (reference ${reference} °C)`;
      },
    },
    'conductivity mS/cm': {
      symbol: 'mS/cm',
      decimals: 1,
      toStored: (v, context) => salinityFromConductivity(v, context.sampleTempC ?? conductivityDefaultTempC),
      fromStored: (v, context) =>
        conductivityFromSalinity(v, context.sampleTempC ?? conductivityDefaultTempC),
      describe: (v, context) =>
        `conductivity ${v} mS/cm at ${context.sampleTempC ?? conductivityDefaultTempC} °C`,
    },
  },
  ph: { '': storedSpec('ph') },
  alkalinity: {
    dKH: storedSpec('alkalinity'),
    'meq/L': alkalinityFrom('meq/L', 'meq/L', 2),
    'mg/L CaCO3': alkalinityFrom('mg/L CaCO3', 'mg/L CaCO3', 0),
  },
  calcium: { 'mg/L': storedSpec('calcium') },
  magnesium: { 'mg/L': storedSpec('magnesium') },
  nitrate: {
    'mg/L NO3': storedSpec('nitrate'),
    'mg/L NO3-N': {
      symbol: 'mg/L NO3-N',
      decimals: 2,
      toStored: nitrateAsNO3FromN,
      fromStored: nitrateAsNFromNO3,
      describe: (v) => `${v} mg/L NO3-N`,
    },
  },
  phosphate: {
    'mg/L PO4': storedSpec('phosphate'),
    'mg/L P': {
      symbol: 'mg/L P',
      decimals: 3,
      toStored: phosphateAsPO4FromP,
      fromStored: phosphateAsPFromPO4,
      describe: (v) => `${v} mg/L P`,
    },
  },
  ammonia: { 'mg/L': storedSpec('ammonia') },
  nitrite: { 'mg/L': storedSpec('nitrite') },
  orp: { mV: storedSpec('orp') },
  gh: { '°dGH': storedSpec('gh') },
  kh: {
    '°dKH': storedSpec('kh'),
    'meq/L': alkalinityFrom('meq/L', 'meq/L', 2),
    'mg/L CaCO3': alkalinityFrom('mg/L CaCO3', 'mg/L CaCO3', 0),
  },
};

export function allowedUnits<P extends ParameterKey>(parameter: P): readonly EntryUnit<P>[] {
  return entryUnits[parameter];
}

export function isEntryUnit<P extends ParameterKey>(parameter: P, unit: string): unit is EntryUnit<P> {
  return (entryUnits[parameter] as readonly string[]).includes(unit);
}

function specFor(parameter: ParameterKey, unit: string): UnitSpec {
  if (!isEntryUnit(parameter, unit)) throw new UnitNotAllowedError(parameter, unit, entryUnits[parameter]);
  return (units[parameter] as Readonly<Record<string, UnitSpec>>)[unit] as UnitSpec;
}

/**
 * Converts an entered value to the parameter's stored unit. Throws `UnitNotAllowedError` for a
 * unit the parameter does not take and a RangeError (from shared/chemistry) for a value or
 * temperature outside an equation's validity.
 */
export function toStored(
  parameter: ParameterKey,
  value: number,
  unit: string,
  context: UnitContext = {},
): StoredValue {
  const spec = specFor(parameter, unit);
  const stored = spec.toStored(value, context);
  return spec.describe === undefined
    ? { value: stored }
    : { value: stored, note: `Entered as ${spec.describe(value, context)}.` };
}

/**
 * Converts a stored value to a display unit. Specific gravity is shown at 25/25 °C and
 * conductivity at 25 °C unless the context says otherwise.
 */
export function fromStored(
  parameter: ParameterKey,
  storedValue: number,
  displayUnit: string,
  context: UnitContext = {},
): number {
  return specFor(parameter, displayUnit).fromStored(storedValue, context);
}

export function unitSymbol(parameter: ParameterKey, unit: string): string {
  return specFor(parameter, unit).symbol;
}

export function unitDecimals(parameter: ParameterKey, unit: string): number {
  return specFor(parameter, unit).decimals;
}

export interface FormatOptions {
  /** Display unit; the stored unit when absent. */
  readonly unit?: string;
  readonly context?: UnitContext;
  /** Drop trailing zeros, as limits are written ("max 28 °C", not "max 28.0 °C"). */
  readonly trim?: boolean;
}

/** "26.1 °C", "1.0264 SG", "8.20" (pH carries its name in the label, not after the number). */
export function formatValue(
  parameter: ParameterKey,
  storedValue: number,
  options: FormatOptions = {},
): string {
  const unit = options.unit ?? parameterCatalogue[parameter].unit;
  const spec = specFor(parameter, unit);
  const shown = spec.fromStored(storedValue, options.context ?? {});
  // Rounding can leave "-0.0"; a reading of nothing is shown without a sign.
  const rounded = Number(shown.toFixed(spec.decimals)) || 0;
  const number = options.trim ? String(rounded) : rounded.toFixed(spec.decimals);
  return spec.symbol === '' ? number : `${number} ${spec.symbol}`;
}

/**
 * A reading and the bound it crossed, written so they never read as equal: usually the reading at
 * its own precision and the bound trimmed ("36.2 ppt" against "36 ppt"), but when both round to the
 * same figure ("36.0 ppt is above 36 ppt") both get more decimals until they differ ("36.04 ppt"
 * against "36.00 ppt").
 */
export function formatAgainstBound(
  parameter: ParameterKey,
  storedValue: number,
  storedBound: number,
  options: Omit<FormatOptions, 'trim'> = {},
): { value: string; bound: string } {
  const usual = {
    value: formatValue(parameter, storedValue, options),
    bound: formatValue(parameter, storedBound, { ...options, trim: true }),
  };
  const spec = specFor(parameter, options.unit ?? parameterCatalogue[parameter].unit);
  const value = spec.fromStored(storedValue, options.context ?? {});
  const bound = spec.fromStored(storedBound, options.context ?? {});
  const at = (n: number, decimals: number) => (Number(n.toFixed(decimals)) || 0).toFixed(decimals);
  if (value === bound || at(value, spec.decimals) !== at(bound, spec.decimals)) return usual;
  const withSymbol = (text: string) => (spec.symbol === '' ? text : `${text} ${spec.symbol}`);
  for (let decimals = spec.decimals + 1; decimals <= spec.decimals + 4; decimals += 1) {
    if (at(value, decimals) !== at(bound, decimals)) {
      return { value: withSymbol(at(value, decimals)), bound: withSymbol(at(bound, decimals)) };
    }
  }
  return usual;
}

export type StoredValueCheck =
  | { readonly ok: true; readonly value: number; readonly note?: string }
  | { readonly ok: false; readonly field: 'unit' | 'value'; readonly message: string };

/**
 * A conversion the equations refuse, in a tank owner's words: the allowed range in the unit typed,
 * never the equation's name (that belongs on the calculators' Source line).
 */
function conversionProblem(parameter: ParameterKey, value: number, unit: string, error: RangeError): string {
  const { label } = parameterCatalogue[parameter];
  const symbol = isEntryUnit(parameter, unit) ? unitSymbol(parameter, unit) : unit;
  const withUnit = (text: string) => (symbol ? `${text} ${symbol}` : text);
  const refused = outOfRangeDetails(error);
  if (refused && refused.value === value) {
    const bounds = describeBounds(refused.bounds);
    if (bounds !== undefined) {
      return `${label} ${withUnit(String(value))} cannot be converted: it must be ${withUnit(bounds)}; check the value and its unit`;
    }
  }
  return `${label} ${withUnit(String(value))} cannot be converted; check the value, its unit and any temperatures given`;
}

/**
 * `toStored` plus the plausibility bounds, without throwing: the reading schemas report the
 * failure as an issue, and device ingest can set one bad reading aside without refusing its batch.
 */
export function checkStoredValue(
  parameter: ParameterKey,
  value: number,
  unit: string,
  context: UnitContext = {},
): StoredValueCheck {
  let stored: StoredValue;
  try {
    stored = toStored(parameter, value, unit, context);
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    if (error instanceof UnitNotAllowedError) return { ok: false, field: 'unit', message: error.message };
    return { ok: false, field: 'value', message: conversionProblem(parameter, value, unit, error) };
  }
  if (!isPlausible(parameter, stored.value)) {
    const { label, bounds } = parameterCatalogue[parameter];
    const range = `${formatValue(parameter, bounds.min, { trim: true })} to ${formatValue(parameter, bounds.max, { trim: true })}`;
    const shown = formatValue(parameter, stored.value);
    return {
      ok: false,
      field: 'value',
      message: `${label} ${shown} is outside what a tank can plausibly read (${range}); check the value and its unit`,
    };
  }
  return stored.note === undefined ? { ok: true, value: stored.value } : { ok: true, ...stored };
}
