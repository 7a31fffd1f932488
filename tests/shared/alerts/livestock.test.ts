import { describe, expect, it } from 'vitest';
import { describeConcerns, evaluateLivestock, type LivestockInhabitant } from '@shared/alerts/livestock';

let sequence = 0;
function inhabitant(overrides: Partial<LivestockInhabitant> = {}): LivestockInhabitant {
  sequence += 1;
  return {
    speciesId: `test-species-${sequence}`,
    commonName: `test species ${sequence}`,
    scientificName: 'Testus exemplaris',
    ranges: {},
    ...overrides,
  };
}

const hammer = inhabitant({
  speciesId: 'hammer-coral',
  commonName: 'hammer coral',
  scientificName: 'Fimbriaphyllia ancora',
  ranges: { temperature: { min: 24, max: 28 } },
});
const clownfish = inhabitant({
  speciesId: 'ocellaris-clownfish',
  commonName: 'ocellaris clownfish',
  scientificName: 'Amphiprion ocellaris',
  ranges: { temperature: { min: 23, max: 29.5 } },
});

describe('evaluateLivestock', () => {
  it('names the species a temperature is too warm for, with its limit', () => {
    const concerns = evaluateLivestock('temperature', 29.4, [hammer, clownfish]);

    expect(concerns).toHaveLength(1);
    expect(concerns[0]).toMatchObject({ speciesId: 'hammer-coral', direction: 'high', limit: 28 });
    expect(concerns[0]?.message).toBe(
      'Temperature 29.4 °C is above what the hammer coral (Fimbriaphyllia ancora) tolerates (max 28 °C)',
    );
  });

  it('names every species affected, and each species once', () => {
    const concerns = evaluateLivestock('temperature', 30, [hammer, clownfish, hammer]);

    expect(concerns.map((c) => c.speciesId)).toEqual(['hammer-coral', 'ocellaris-clownfish']);
  });

  it('reports values below the range with the minimum', () => {
    const [concern] = evaluateLivestock('temperature', 22.5, [clownfish]);

    expect(concern?.message).toBe(
      'Temperature 22.5 °C is below what the ocellaris clownfish (Amphiprion ocellaris) tolerates (min 23 °C)',
    );
  });

  it('tolerates a value exactly on the end of a range', () => {
    expect(evaluateLivestock('temperature', 28, [hammer])).toEqual([]);
  });

  it('ignores species with no range for the parameter', () => {
    expect(evaluateLivestock('nitrate', 80, [hammer, clownfish])).toEqual([]);
  });

  it('writes plural common names and genus-only names naturally', () => {
    const zoanthids = inhabitant({
      commonName: 'zoanthids',
      scientificName: 'Zoanthus spp.',
      ranges: { ph: { min: 7.8, max: 8.4 } },
    });
    const acropora = inhabitant({
      commonName: 'Acropora',
      scientificName: 'Acropora spp.',
      ranges: { ph: { min: 8, max: 8.4 } },
    });

    const messages = evaluateLivestock('ph', 7.7, [zoanthids, acropora]).map((c) => c.message);

    expect(messages).toEqual([
      'pH 7.70 is below what the zoanthids (Zoanthus spp.) tolerate (min 7.8)',
      'pH 7.70 is below what Acropora spp. tolerates (min 8)',
    ]);
  });

  it('writes the message in the reader’s unit', () => {
    const [concern] = evaluateLivestock('temperature', 29.4, [hammer], { unit: '°F' });

    expect(concern?.message).toBe(
      'Temperature 84.9 °F is above what the hammer coral (Fimbriaphyllia ancora) tolerates (max 82.4 °F)',
    );
  });

  it('sums up many species in a short list with the edge of the comfort range', () => {
    const many = [
      hammer,
      clownfish,
      ...Array.from({ length: 7 }, () => inhabitant({ ranges: { temperature: { min: 24, max: 28.5 } } })),
    ];
    const concerns = evaluateLivestock('temperature', 30, many);

    expect(concerns).toHaveLength(9);
    expect(describeConcerns('temperature', 30, concerns)).toBe(
      'Temperature 30.0 °C is above what the hammer coral, ocellaris clownfish and 7 more tolerate (max 28 °C)',
    );
    expect(describeConcerns('temperature', 30, concerns.slice(0, 3))).toBe(
      `Temperature 30.0 °C is above what the hammer coral, ocellaris clownfish and ${concerns[2]!.commonName} tolerate (max 28 °C)`,
    );
  });
});
