import { describe, expect, it } from 'vitest';
import { catalogueSource, findSpecies, speciesCatalogue } from '@shared/livestock/catalogue';
import { parameterKeys } from '@shared/parameters/keys';
import { speciesInput } from '@shared/schemas/species';
import { species } from '@shared/livestock/species';
import type { LivestockGroup } from '@shared/livestock/species';

describe('speciesCatalogue', () => {
  it('ships at least 45 species', () => {
    expect(speciesCatalogue.length).toBeGreaterThanOrEqual(45);
  });

  it('gives every species a unique id', () => {
    const ids = speciesCatalogue.map((entry) => entry.id);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('holds only entries that the species schema accepts unchanged', () => {
    for (const entry of speciesCatalogue) {
      const parsed = species.safeParse(entry);
      expect(parsed.error?.issues, entry.id).toBeUndefined();
      expect(parsed.data, entry.id).toEqual(entry);
    }
  });

  it('keeps every care range with its minimum below its maximum', () => {
    for (const entry of speciesCatalogue) {
      for (const [parameter, range] of Object.entries(entry.profile.ranges)) {
        expect(range.min, `${entry.id} ${parameter}`).toBeLessThan(range.max);
        expect(parameterKeys).toContain(parameter);
      }
    }
  });

  it('gives every freshwater species a pH range and a GH or KH range', () => {
    for (const entry of speciesCatalogue.filter((e) => e.profile.waterTypes.includes('fresh'))) {
      const { ranges } = entry.profile;
      expect(ranges.ph, entry.id).toBeDefined();
      expect(ranges.gh ?? ranges.kh, entry.id).toBeDefined();
    }
  });

  it('gives every marine and brackish species a temperature and a salinity range', () => {
    for (const entry of speciesCatalogue.filter(
      (e) => !e.profile.waterTypes.every((type) => type === 'fresh'),
    )) {
      expect(entry.profile.ranges.temperature, entry.id).toBeDefined();
      expect(entry.profile.ranges.salinity, entry.id).toBeDefined();
    }
  });

  it('gives every stony coral its alkalinity, calcium, magnesium, nitrate and phosphate preferences', () => {
    for (const entry of speciesCatalogue.filter((e) =>
      ['sps-coral', 'lps-coral'].includes(e.profile.group),
    )) {
      for (const parameter of ['alkalinity', 'calcium', 'magnesium', 'nitrate', 'phosphate'] as const) {
        expect(entry.profile.ranges[parameter], `${entry.id} ${parameter}`).toBeDefined();
      }
    }
  });

  it('covers fish, corals, anemones, clams, invertebrates and plants', () => {
    const groups = new Set(speciesCatalogue.map((entry) => entry.profile.group));
    const expected: LivestockGroup[] = [
      'fish',
      'sps-coral',
      'lps-coral',
      'soft-coral',
      'zoanthid',
      'mushroom',
      'anemone',
      'clam',
      'shrimp',
      'snail',
      'crab',
      'urchin',
      'starfish',
      'plant',
    ];
    for (const group of expected) expect(groups).toContain(group);
    expect(speciesCatalogue.some((entry) => entry.profile.waterTypes.includes('fresh'))).toBe(true);
    expect(speciesCatalogue.some((entry) => entry.profile.waterTypes.includes('brackish'))).toBe(true);
  });

  it('warns about handling every zoanthid, lionfish and leather coral', () => {
    for (const id of ['zoanthids', 'button-polyps']) {
      expect(findSpecies(id)?.profile.behaviour.toxic?.hazard).toBe('contact-toxin');
    }
    expect(findSpecies('volitans-lionfish')?.profile.behaviour.toxic?.hazard).toBe('venomous-spines');
    expect(findSpecies('leather-coral')?.profile.behaviour.toxic).toBeDefined();
  });

  it('names species by common name and "Genus species" or "Genus spp."', () => {
    expect(findSpecies('hammer-coral')).toMatchObject({
      commonName: 'hammer coral',
      scientificName: 'Fimbriaphyllia ancora',
    });
    expect(findSpecies('acropora')?.scientificName).toBe('Acropora spp.');
  });

  it('says where its care data comes from', () => {
    expect(catalogueSource).toMatch(/common .*practice, from memory/i);
  });
});

describe('findSpecies', () => {
  it('finds a species by its id', () => {
    expect(findSpecies('bubble-tip-anemone')?.scientificName).toBe('Entacmaea quadricolor');
  });

  it('returns undefined for an unknown id', () => {
    expect(findSpecies('sea-serpent')).toBeUndefined();
  });
});

describe('speciesInput', () => {
  const companySpecies = {
    commonName: 'spotted sand goby',
    scientificName: 'Valenciennea spp.',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      adultSizeCm: 12,
      ranges: { temperature: { min: 24, max: 27 }, salinity: { min: 33, max: 35 } },
      behaviour: {},
      careNotes: 'Sifts sand all day.',
    },
  };

  it('accepts a species a company adds and fills in calm behaviour', () => {
    const parsed = speciesInput.parse(companySpecies);
    expect(parsed.profile.behaviour).toEqual({
      stings: false,
      wanders: false,
      nipsCorals: false,
      nipsClams: false,
      eatsInvertebrates: [],
      mayEatInvertebrates: [],
      eatsSmallFish: false,
      territorial: false,
      reefSafe: true,
    });
  });

  it('rejects a range whose minimum is not below its maximum', () => {
    const result = speciesInput.safeParse({
      ...companySpecies,
      profile: { ...companySpecies.profile, ranges: { temperature: { min: 27, max: 24 } } },
    });
    expect(result.success).toBe(false);
  });

  it('rejects a stinging species without a sting reach', () => {
    const result = speciesInput.safeParse({
      ...companySpecies,
      profile: { ...companySpecies.profile, group: 'anemone', behaviour: { stings: true } },
    });
    expect(result.error?.issues[0]?.path).toEqual(['profile', 'behaviour', 'stingReachCm']);
  });

  it('rejects a fish without an adult size', () => {
    const { adultSizeCm: _omitted, ...profile } = companySpecies.profile;
    expect(speciesInput.safeParse({ ...companySpecies, profile }).success).toBe(false);
  });

  it('rejects an unknown parameter', () => {
    const result = speciesInput.safeParse({
      ...companySpecies,
      profile: { ...companySpecies.profile, ranges: { salt: { min: 1, max: 2 } } },
    });
    expect(result.success).toBe(false);
  });
});
