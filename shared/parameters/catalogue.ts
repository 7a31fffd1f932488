/*
 * What Brinewatch knows about each parameter, in its stored unit.
 *
 * Test intervals, deadbands and rate-of-change limits are common practice (there is no
 * standard), chosen by the Brinewatch team from memory; every one of them is a default a
 * company can override per tank. Physical bounds are deliberately wide: they only catch typing
 * slips (a dropped decimal point, a reading in the wrong unit), never judge the water.
 */
import { commonPracticeMaxDailyRise } from '@shared/chemistry/index';
import type { RateRule } from './limits';
import type { WaterType } from './water-types';
import type { ParameterKey } from './keys';

export const minuteMs = 60_000;
export const hourMs = 60 * minuteMs;
export const dayMs = 24 * hourMs;

/** A device that has sent nothing for this long is treated as silent (common practice). */
export const deviceStaleAfterMs = 30 * minuteMs;

/** The unit each parameter is stored in; also one of its entry units (see `units.ts`). */
export type StoredUnit =
  '°C' | 'salinity' | '' | 'dKH' | 'mg/L' | 'mg/L NO3' | 'mg/L PO4' | 'mV' | '°dGH' | '°dKH';

export interface ParameterInfo {
  readonly key: ParameterKey;
  readonly label: string;
  readonly unit: StoredUnit;
  /** Printed after a stored value: "26.1 °C", "35.0 ppt", "pH 8.20" (empty for pH). */
  readonly symbol: string;
  readonly decimals: number;
  readonly waterTypes: readonly WaterType[];
  /** Plausible physical bounds for input checks, inclusive, in the stored unit. */
  readonly bounds: { readonly min: number; readonly max: number };
  /** Whether tank devices commonly report it (drives the 30-minute silence check). */
  readonly deviceReported: boolean;
  /** How often a home test is expected; null when nobody tests it by hand between visits. */
  readonly homeTestIntervalMs: number | null;
  readonly deviceStaleAfterMs: number;
  /** How far back inside a limit a reading must come before an open alert resolves. */
  readonly deadband: number;
  /** Default largest change per period; null where ordinary daily swings make one meaningless. */
  readonly rateOfChange: RateRule | null;
  /** What the stored number means, where the unit alone does not say. */
  readonly basis?: string;
}

const allWaters: readonly WaterType[] = ['marine', 'fresh', 'brackish'];
const salty: readonly WaterType[] = ['marine', 'brackish'];

export const parameterCatalogue: Readonly<Record<ParameterKey, ParameterInfo>> = {
  temperature: {
    key: 'temperature',
    label: 'Temperature',
    unit: '°C',
    symbol: '°C',
    decimals: 1,
    waterTypes: allWaters,
    bounds: { min: 0, max: 45 },
    deviceReported: true,
    homeTestIntervalMs: dayMs,
    deviceStaleAfterMs,
    deadband: 0.2,
    rateOfChange: { maxChange: 1, perMs: hourMs },
  },
  salinity: {
    key: 'salinity',
    label: 'Salinity',
    unit: 'salinity',
    // Refractometers and meters sold to keepers are labelled ppt, so owners read "ppt".
    symbol: 'ppt',
    decimals: 1,
    waterTypes: salty,
    bounds: { min: 0, max: 50 },
    deviceReported: true,
    homeTestIntervalMs: 7 * dayMs,
    deviceStaleAfterMs,
    deadband: 0.3,
    rateOfChange: { maxChange: 1, perMs: dayMs },
    basis:
      'Practical salinity (PSS-78), shown as ppt. The salt content in g/kg is about 0.5% higher ' +
      '(reference-composition salinity = 35.16504/35 × practical salinity; Millero et al. 2008, ' +
      'Deep-Sea Research I 55:50–72).',
  },
  ph: {
    key: 'ph',
    label: 'pH',
    unit: '',
    symbol: '',
    decimals: 2,
    waterTypes: allWaters,
    bounds: { min: 3, max: 11 },
    deviceReported: true,
    homeTestIntervalMs: 7 * dayMs,
    deviceStaleAfterMs,
    // Probes wander by a few hundredths; 0.1 keeps that from reopening an alert.
    deadband: 0.1,
    // Reef pH swings by a few tenths between night and day, so no default rate limit.
    rateOfChange: null,
  },
  alkalinity: {
    key: 'alkalinity',
    label: 'Alkalinity',
    unit: 'dKH',
    symbol: 'dKH',
    decimals: 1,
    waterTypes: salty,
    bounds: { min: 0, max: 30 },
    deviceReported: true,
    homeTestIntervalMs: 7 * dayMs,
    deviceStaleAfterMs,
    deadband: 0.2,
    rateOfChange: { maxChange: commonPracticeMaxDailyRise['sodium bicarbonate'].rise, perMs: dayMs },
  },
  calcium: {
    key: 'calcium',
    label: 'Calcium',
    unit: 'mg/L',
    symbol: 'mg/L',
    decimals: 0,
    waterTypes: salty,
    bounds: { min: 0, max: 1000 },
    deviceReported: false,
    homeTestIntervalMs: 14 * dayMs,
    deviceStaleAfterMs,
    deadband: 10,
    rateOfChange: { maxChange: commonPracticeMaxDailyRise['calcium chloride dihydrate'].rise, perMs: dayMs },
  },
  magnesium: {
    key: 'magnesium',
    label: 'Magnesium',
    unit: 'mg/L',
    symbol: 'mg/L',
    decimals: 0,
    waterTypes: salty,
    bounds: { min: 0, max: 2500 },
    deviceReported: false,
    homeTestIntervalMs: 30 * dayMs,
    deviceStaleAfterMs,
    deadband: 20,
    rateOfChange: {
      maxChange: commonPracticeMaxDailyRise['magnesium chloride hexahydrate'].rise,
      perMs: dayMs,
    },
  },
  nitrate: {
    key: 'nitrate',
    label: 'Nitrate',
    unit: 'mg/L NO3',
    symbol: 'mg/L NO3',
    decimals: 1,
    waterTypes: allWaters,
    bounds: { min: 0, max: 500 },
    deviceReported: false,
    homeTestIntervalMs: 7 * dayMs,
    deviceStaleAfterMs,
    deadband: 1,
    rateOfChange: null,
    basis: 'As nitrate ion (NO3).',
  },
  phosphate: {
    key: 'phosphate',
    label: 'Phosphate',
    unit: 'mg/L PO4',
    symbol: 'mg/L PO4',
    decimals: 2,
    waterTypes: allWaters,
    bounds: { min: 0, max: 20 },
    deviceReported: false,
    homeTestIntervalMs: 7 * dayMs,
    deviceStaleAfterMs,
    deadband: 0.01,
    rateOfChange: null,
    basis: 'As phosphate ion (PO4).',
  },
  ammonia: {
    key: 'ammonia',
    label: 'Ammonia (total)',
    unit: 'mg/L',
    symbol: 'mg/L',
    decimals: 2,
    waterTypes: allWaters,
    bounds: { min: 0, max: 20 },
    deviceReported: false,
    homeTestIntervalMs: 14 * dayMs,
    deviceStaleAfterMs,
    deadband: 0.02,
    rateOfChange: null,
    basis: 'Total ammonia (NH3 + NH4+) on the basis the test kit reports.',
  },
  nitrite: {
    key: 'nitrite',
    label: 'Nitrite',
    unit: 'mg/L',
    symbol: 'mg/L',
    decimals: 2,
    waterTypes: allWaters,
    bounds: { min: 0, max: 20 },
    deviceReported: false,
    homeTestIntervalMs: 14 * dayMs,
    deviceStaleAfterMs,
    deadband: 0.02,
    rateOfChange: null,
  },
  orp: {
    key: 'orp',
    label: 'ORP',
    unit: 'mV',
    symbol: 'mV',
    decimals: 0,
    waterTypes: allWaters,
    bounds: { min: -500, max: 700 },
    deviceReported: true,
    // Only probes measure it; a hand reading comes from a technician's meter at a visit.
    homeTestIntervalMs: null,
    deviceStaleAfterMs,
    deadband: 10,
    rateOfChange: null,
  },
  gh: {
    key: 'gh',
    label: 'General hardness (GH)',
    unit: '°dGH',
    symbol: '°dGH',
    decimals: 1,
    waterTypes: ['fresh', 'brackish'],
    bounds: { min: 0, max: 50 },
    deviceReported: false,
    homeTestIntervalMs: 14 * dayMs,
    deviceStaleAfterMs,
    deadband: 0.5,
    rateOfChange: null,
  },
  kh: {
    key: 'kh',
    label: 'Carbonate hardness (KH)',
    unit: '°dKH',
    symbol: '°dKH',
    decimals: 1,
    waterTypes: ['fresh', 'brackish'],
    bounds: { min: 0, max: 40 },
    deviceReported: false,
    homeTestIntervalMs: 7 * dayMs,
    deviceStaleAfterMs,
    deadband: 0.2,
    rateOfChange: { maxChange: 1, perMs: dayMs },
  },
};

export function parametersFor(waterType: WaterType): ParameterKey[] {
  return Object.values(parameterCatalogue)
    .filter((info) => info.waterTypes.includes(waterType))
    .map((info) => info.key);
}

export function isPlausible(parameter: ParameterKey, storedValue: number): boolean {
  const { min, max } = parameterCatalogue[parameter].bounds;
  return Number.isFinite(storedValue) && storedValue >= min && storedValue <= max;
}
