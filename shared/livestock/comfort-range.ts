import { parameterKeys } from '@shared/parameters/keys';
import type { ParameterKey } from '@shared/parameters/keys';
import type { ParameterRange, Species } from '@shared/livestock/species';

export interface ComfortBand {
  min: number;
  max: number;
  /** Ids of the species that set each end of the band. */
  limitedBy: { low: string[]; high: string[] };
}

export interface ComfortConflict {
  parameter: ParameterKey;
  /** The species whose ranges leave no common ground, lowest range first. */
  species: { id: string; commonName: string; min: number; max: number }[];
  message: string;
}

export interface ComfortRange {
  ranges: Partial<Record<ParameterKey, ComfortBand>>;
  conflicts: ComfortConflict[];
}

const parameterWording: Record<ParameterKey, { label: string; unit: string }> = {
  temperature: { label: 'temperature', unit: '°C' },
  salinity: { label: 'salinity', unit: 'ppt' },
  ph: { label: 'pH', unit: '' },
  alkalinity: { label: 'alkalinity', unit: 'dKH' },
  calcium: { label: 'calcium', unit: 'mg/L' },
  magnesium: { label: 'magnesium', unit: 'mg/L' },
  nitrate: { label: 'nitrate', unit: 'mg/L' },
  phosphate: { label: 'phosphate', unit: 'mg/L' },
  ammonia: { label: 'ammonia', unit: 'mg/L' },
  nitrite: { label: 'nitrite', unit: 'mg/L' },
  orp: { label: 'ORP', unit: 'mV' },
  gh: { label: 'GH', unit: '°dGH' },
  kh: { label: 'KH', unit: '°dKH' },
};

export function parameterLabel(parameter: ParameterKey): string {
  return parameterWording[parameter].label;
}

/** "24–27 °C", "7.9–8.4"; a range that has closed to one value is that value ("10 °dGH"), not "10–10". */
export function formatRange(parameter: ParameterKey, range: ParameterRange): string {
  const { unit } = parameterWording[parameter];
  const low = formatNumber(range.min);
  const high = formatNumber(range.max);
  const span = low === high ? low : `${low}–${high}`;
  return unit ? `${span} ${unit}` : span;
}

function formatNumber(value: number): string {
  return String(Number(value.toFixed(3)));
}

/** Ranges that only touch (one ends where the other begins) still overlap. */
export function rangesOverlap(a: ParameterRange, b: ParameterRange): boolean {
  return a.min <= b.max && b.min <= a.max;
}

export function joinWithAnd(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`;
}

/**
 * The water every inhabitant tolerates: per parameter, the intersection of their care ranges.
 * Pass only livestock that is in the tank now; callers leave out removed and dead animals, and
 * pass the parameters the tank's water is measured for (a freshwater tank has no salinity to keep,
 * even when one of its fish would also live in brackish water).
 * A parameter whose ranges have no common ground gets a conflict instead of a range.
 */
export function comfortRange(
  inhabitants: readonly Species[],
  measured: readonly ParameterKey[] = parameterKeys,
): ComfortRange {
  const distinct = [...new Map(inhabitants.map((entry) => [entry.id, entry])).values()];
  const ranges: ComfortRange['ranges'] = {};
  const conflicts: ComfortConflict[] = [];

  for (const parameter of measured) {
    const holders = distinct.flatMap((entry) => {
      const range = entry.profile.ranges[parameter];
      return range ? [{ entry, range }] : [];
    });
    if (holders.length === 0) continue;

    const low = Math.max(...holders.map(({ range }) => range.min));
    const high = Math.min(...holders.map(({ range }) => range.max));

    if (low <= high) {
      ranges[parameter] = {
        min: low,
        max: high,
        limitedBy: {
          low: holders.filter(({ range }) => range.min === low).map(({ entry }) => entry.id),
          high: holders.filter(({ range }) => range.max === high).map(({ entry }) => entry.id),
        },
      };
      continue;
    }

    // A species conflicts when its range ends below someone's minimum or starts above someone's maximum.
    const clashing = holders
      .filter(({ range }) => range.max < low || range.min > high)
      .sort((a, b) => a.range.min - b.range.min || a.range.max - b.range.max);
    conflicts.push({
      parameter,
      species: clashing.map(({ entry, range }) => ({
        id: entry.id,
        commonName: entry.commonName,
        min: range.min,
        max: range.max,
      })),
      message: `No ${parameterLabel(parameter)} suits every inhabitant: ${joinWithAnd(
        clashing.map(({ entry, range }) => `the ${entry.commonName} needs ${formatRange(parameter, range)}`),
      )}.`,
    });
  }

  return { ranges, conflicts };
}
