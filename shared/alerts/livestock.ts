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
function speciesPhrase({ commonName, scientificName }: LivestockInhabitant): string {
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
