import { findSpecies } from '@shared/livestock/catalogue';
import type { Behaviour, CareProfile, Species } from '@shared/livestock/species';

type SpeciesOverrides = Partial<Omit<Species, 'profile'>> & {
  profile?: Partial<Omit<CareProfile, 'behaviour'>> & { behaviour?: Partial<Behaviour> };
};

let sequence = 0;

/** A calm marine animal with no care ranges, changed only where a test says so. */
export function buildSpecies(overrides: SpeciesOverrides = {}): Species {
  sequence += 1;
  const { profile = {}, ...identity } = overrides;
  const { behaviour = {}, ...care } = profile;
  return {
    id: `test-species-${sequence}`,
    commonName: `test species ${sequence}`,
    scientificName: 'Testus exemplaris',
    ...identity,
    profile: {
      waterTypes: ['marine'],
      group: 'other-invertebrate',
      ranges: {},
      careNotes: 'A made-up species for tests.',
      ...care,
      behaviour: {
        stings: false,
        wanders: false,
        nipsCorals: false,
        nipsClams: false,
        eatsInvertebrates: [],
        mayEatInvertebrates: [],
        eatsSmallFish: false,
        territorial: false,
        reefSafe: true,
        ...behaviour,
      },
    },
  };
}

/** A species from the shipped catalogue; fails the test loudly if the id is gone. */
export function catalogued(id: string): Species {
  const entry = findSpecies(id);
  if (!entry) throw new Error(`species "${id}" is not in the catalogue`);
  return entry;
}
