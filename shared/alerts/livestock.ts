import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { formatValue, type FormatOptions } from '@shared/parameters/units';
import type { LimitDirection } from '@shared/parameters/limits';

export interface LivestockInhabitant {
  readonly speciesId: string;
  readonly commonName: string;
  readonly scientificName: string;
  readonly ranges: Partial<Record<ParameterKey, { readonly min: number; readonly max: number }>>;
}

export interface LivestockConcern {
  readonly speciesId: string;
  readonly commonName: string;
  readonly scientificName: string;
  readonly direction: LimitDirection;
  /** The end of the species' range that the value is beyond, in the stored unit. */
  readonly limit: number;
  readonly message: string;
}

/** "the hammer coral (Fimbriaphyllia ancora)"; a genus used as a common name is said once. */
function speciesPhrase({
  commonName,
  scientificName,
}: Pick<LivestockInhabitant, 'commonName' | 'scientificName'>): string {
  const genus = scientificName.split(' ')[0] ?? scientificName;
  return commonName.toLowerCase() === genus.toLowerCase()
    ? scientificName
    : `the ${commonName} (${scientificName})`;
}

// Common names such as "zoanthids" or "button polyps" are plural; "chromis" and "hibiscus" are not.
const looksPlural = (commonName: string): boolean => /[^siu]s$/i.test(commonName);

/**
 * The inhabitants whose care range a value falls outside (a value on an end of the range is
 * tolerated), each once, in the order given. Values are stored units; `display` picks the unit
 * the message is written in.
 */
export function evaluateLivestock(
  parameter: ParameterKey,
  value: number,
  inhabitants: readonly LivestockInhabitant[],
  display: Pick<FormatOptions, 'unit' | 'context'> = {},
): LivestockConcern[] {
  const { label } = parameterCatalogue[parameter];
  const seen = new Set<string>();
  const concerns: LivestockConcern[] = [];
  for (const inhabitant of inhabitants) {
    const range = inhabitant.ranges[parameter];
    if (range === undefined || seen.has(inhabitant.speciesId)) continue;
    const direction: LimitDirection | null = value > range.max ? 'high' : value < range.min ? 'low' : null;
    if (direction === null) continue;
    seen.add(inhabitant.speciesId);
    const limit = direction === 'high' ? range.max : range.min;
    const verb = looksPlural(inhabitant.commonName) ? 'tolerate' : 'tolerates';
    const shownValue = formatValue(parameter, value, display);
    const shownLimit = formatValue(parameter, limit, { ...display, trim: true });
    const message =
      `${label} ${shownValue} is ${direction === 'high' ? 'above' : 'below'} what ` +
      `${speciesPhrase(inhabitant)} ${verb} (${direction === 'high' ? 'max' : 'min'} ${shownLimit})`;
    concerns.push({
      speciesId: inhabitant.speciesId,
      commonName: inhabitant.commonName,
      scientificName: inhabitant.scientificName,
      direction,
      limit,
      message,
    });
  }
  return concerns;
}

/** How many species a short list names before "and N more". */
export const speciesShownInList = 2;

/**
 * "the hammer coral (Fimbriaphyllia ancora)" for one species; "cardinal tetra, otocinclus and 7
 * more" for many, so a tank full of small fish does not fill a phone screen.
 */
export function shortSpeciesList(concerns: readonly LivestockConcern[]): string {
  const [only] = concerns;
  if (concerns.length === 1 && only) return speciesPhrase(only);
  const names = concerns.map((concern) => concern.commonName);
  if (names.length <= speciesShownInList + 1) {
    return `the ${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;
  }
  return `the ${names.slice(0, speciesShownInList).join(', ')} and ${names.length - speciesShownInList} more`;
}

/**
 * "above what the hammer coral, zoanthids and 3 more tolerate (max 27 °C)": the species a value
 * does not suit, with the nearest end of their ranges (the edge of the comfort range on that side).
 * Empty when the value suits every inhabitant.
 */
export function toleranceWords(
  parameter: ParameterKey,
  concerns: readonly LivestockConcern[],
  display: Pick<FormatOptions, 'unit' | 'context'> = {},
): string {
  const phrases: string[] = [];
  for (const direction of ['low', 'high'] as const) {
    const group = concerns.filter((concern) => concern.direction === direction);
    if (group.length === 0) continue;
    const edge =
      direction === 'high'
        ? Math.min(...group.map((concern) => concern.limit))
        : Math.max(...group.map((concern) => concern.limit));
    const [first] = group;
    const verb = group.length === 1 && first && !looksPlural(first.commonName) ? 'tolerates' : 'tolerate';
    phrases.push(
      `${direction === 'high' ? 'above' : 'below'} what ${shortSpeciesList(group)} ${verb} ` +
        `(${direction === 'high' ? 'max' : 'min'} ${formatValue(parameter, edge, { ...display, trim: true })})`,
    );
  }
  return phrases.join(' and ');
}

/** "pH 6.90 is below what the cardinal tetra, otocinclus and 7 more tolerate (min 7)". */
export function describeConcerns(
  parameter: ParameterKey,
  value: number,
  concerns: readonly LivestockConcern[],
  display: Pick<FormatOptions, 'unit' | 'context'> = {},
): string {
  const { label } = parameterCatalogue[parameter];
  return `${label} ${formatValue(parameter, value, display)} is ${toleranceWords(parameter, concerns, display)}`;
}
