import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { speciesCatalogue } from '@shared/livestock/catalogue';
import { comfortRange } from '@shared/livestock/comfort-range';
import { checkCompatibility } from '@shared/livestock/compatibility';
import type { CompatibilityWarning, Inhabitant } from '@shared/livestock/compatibility';
import type { Species } from '@shared/livestock/species';
import { buildSpecies, catalogued } from './species-factory';

const marine = { waterType: 'marine' } as const;
const fresh = { waterType: 'fresh' } as const;

const tankOf = (...ids: string[]): Inhabitant[] => ids.map((id) => ({ species: catalogued(id) }));

const check = (
  candidateId: string,
  inhabitantIds: string[],
  tank: { waterType: 'marine' | 'fresh' | 'brackish' } = marine,
) => checkCompatibility(catalogued(candidateId), tankOf(...inhabitantIds), tank);

const ofKind = (warnings: CompatibilityWarning[], kind: CompatibilityWarning['kind']) =>
  warnings.filter((warning) => warning.kind === kind);

describe('checkCompatibility', () => {
  describe('a peaceful mix', () => {
    it.each([
      [
        'a reef of ocellaris clownfish, cleaner shrimp, Trochus snail and leather coral',
        marine,
        ['ocellaris-clownfish', 'skunk-cleaner-shrimp', 'trochus-snail', 'leather-coral'],
      ],
      [
        'a planted tank of neon tetras, Corydoras, cherry shrimp, nerite snails, Java fern and Anubias',
        fresh,
        ['neon-tetra', 'corydoras', 'cherry-shrimp', 'nerite-snail', 'java-fern', 'anubias'],
      ],
    ] as const)('gives no warning for %s, whichever joins last', (_name, tank, ids) => {
      for (const candidateId of ids) {
        const rest = ids.filter((id) => id !== candidateId);
        expect(check(candidateId, rest, tank), candidateId).toEqual([]);
      }
    });

    it('lets a second ocellaris clownfish join the first to make a pair', () => {
      expect(check('ocellaris-clownfish', ['ocellaris-clownfish'])).toEqual([]);
    });

    it('does not treat a green chromis as a rival of the clownfish', () => {
      expect(check('green-chromis', ['ocellaris-clownfish'])).toEqual([]);
    });
  });

  describe('water-type', () => {
    it('warns that an ocellaris clownfish cannot live in a freshwater tank', () => {
      const warnings = check('ocellaris-clownfish', ['neon-tetra'], fresh);

      expect(warnings).toEqual([
        {
          kind: 'water-type',
          severity: 'serious',
          message: 'The ocellaris clownfish needs marine water and cannot live in a freshwater tank.',
          speciesIds: ['ocellaris-clownfish'],
        },
      ]);
    });

    it('accepts a molly in a brackish tank and names both water types it suits in a marine one', () => {
      expect(ofKind(check('molly', [], { waterType: 'brackish' }), 'water-type')).toEqual([]);
      expect(ofKind(check('molly', []), 'water-type')[0]?.message).toBe(
        'The molly needs fresh or brackish water and cannot live in a marine tank.',
      );
    });
  });

  describe('stings-neighbours', () => {
    it('warns that a bubble-tip anemone may sting the hammer coral', () => {
      const [warning] = ofKind(
        check('bubble-tip-anemone', ['hammer-coral', 'ocellaris-clownfish']),
        'stings-neighbours',
      );

      expect(warning).toMatchObject({
        severity: 'serious',
        speciesIds: ['bubble-tip-anemone', 'hammer-coral'],
      });
      expect(warning?.message).toBe(
        'The bubble-tip anemone may sting the hammer coral, and the hammer coral may sting it back. ' +
          'The bubble-tip anemone moves around, so spacing alone will not keep them apart.',
      );
    });

    it('warns that a bubble-tip anemone may sting the Acropora and zoanthids wherever they are placed', () => {
      const [warning] = ofKind(check('bubble-tip-anemone', ['acropora', 'zoanthids']), 'stings-neighbours');

      expect(warning).toEqual({
        kind: 'stings-neighbours',
        severity: 'serious',
        message:
          'The bubble-tip anemone may sting the Acropora and zoanthids: its tentacles reach about 15 cm and it ' +
          'moves around, so spacing alone will not protect them.',
        speciesIds: ['bubble-tip-anemone', 'acropora', 'zoanthids'],
      });
    });

    it('cautions to place a torch coral at least 15 cm from the leather coral', () => {
      const [warning] = ofKind(check('torch-coral', ['leather-coral', 'yellow-tang']), 'stings-neighbours');

      expect(warning?.severity).toBe('caution');
      expect(warning?.message).toBe(
        'The torch coral may sting the leather coral: its sweeper tentacles reach about 15 cm. ' +
          'Place it at least 15 cm away, allowing for growth.',
      );
    });

    it('warns that the hammer coral already in the tank may sting a new Acropora placed within 12 cm', () => {
      const warnings = ofKind(check('acropora', ['hammer-coral']), 'stings-neighbours');

      expect(warnings).toEqual([
        {
          kind: 'stings-neighbours',
          severity: 'caution',
          message:
            'The hammer coral already in the tank may sting the new Acropora: its sweeper tentacles reach about ' +
            '12 cm. Place the Acropora at least 12 cm away.',
          speciesIds: ['acropora', 'hammer-coral'],
        },
      ]);
    });

    it('warns once that a torch coral and a hammer coral may sting each other, at the longer reach', () => {
      const warnings = ofKind(check('torch-coral', ['hammer-coral']), 'stings-neighbours');

      expect(warnings).toHaveLength(1);
      expect(warnings[0]?.message).toBe(
        'The torch coral may sting the hammer coral, and the hammer coral may sting it back. ' +
          'Keep at least 15 cm between them, allowing for growth.',
      );
    });

    it('does not warn that a coral may sting another of its own species', () => {
      expect(check('galaxy-coral', ['galaxy-coral'])).toEqual([]);
    });
  });

  describe('wanders', () => {
    it('warns that a bubble-tip anemone may wander into a pump intake even without corals nearby', () => {
      const [warning] = ofKind(check('bubble-tip-anemone', ['ocellaris-clownfish']), 'wanders');

      expect(warning).toMatchObject({ severity: 'caution', speciesIds: ['bubble-tip-anemone'] });
      expect(warning?.message).toMatch(/pump intake.*switch pumps off at the wall/s);
    });

    it('warns that a bubble-tip anemone may wander onto the corals', () => {
      const [warning] = ofKind(check('bubble-tip-anemone', ['hammer-coral', 'leather-coral']), 'wanders');

      expect(warning?.message).toContain('onto the hammer coral and leather coral');
    });

    it('warns that the bubble-tip anemone already in the tank may wander onto a new leather coral', () => {
      const [warning] = ofKind(check('leather-coral', ['bubble-tip-anemone']), 'wanders');

      expect(warning).toMatchObject({
        severity: 'caution',
        speciesIds: ['leather-coral', 'bubble-tip-anemone'],
      });
      expect(warning?.message).toContain('may wander onto the new leather coral');
    });
  });

  describe('nips-corals', () => {
    it('cautions that a flame angelfish may pick at the zoanthids and hammer coral', () => {
      const [warning] = ofKind(
        check('flame-angelfish', ['zoanthids', 'hammer-coral', 'trochus-snail']),
        'nips-corals',
      );

      expect(warning).toMatchObject({
        severity: 'caution',
        speciesIds: ['flame-angelfish', 'zoanthids', 'hammer-coral'],
      });
      expect(warning?.message).toBe(
        'The flame angelfish may pick at the zoanthids and hammer coral; watch it closely after adding it.',
      );
    });

    it('warns seriously that an emperor angelfish will nip the corals', () => {
      const [warning] = ofKind(check('emperor-angelfish', ['leather-coral']), 'nips-corals');

      expect(warning?.severity).toBe('serious');
      expect(warning?.message).toBe(
        'The emperor angelfish eats corals and will likely nip the leather coral.',
      );
    });

    it('warns that the coral beauty angelfish already in the tank may pick at a new hammer coral', () => {
      const [warning] = ofKind(check('hammer-coral', ['coral-beauty-angelfish']), 'nips-corals');

      expect(warning?.message).toBe(
        'The coral beauty angelfish already in the tank may pick at the new hammer coral.',
      );
    });
  });

  describe('nips-clams', () => {
    it('warns that an emperor angelfish will likely nip the maxima clam', () => {
      const [warning] = ofKind(check('emperor-angelfish', ['maxima-clam']), 'nips-clams');

      expect(warning).toMatchObject({
        severity: 'serious',
        speciesIds: ['emperor-angelfish', 'maxima-clam'],
      });
      expect(warning?.message).toContain('will likely nip the maxima clam');
    });

    it('warns that the flame angelfish already in the tank may pick at a new crocea clam', () => {
      const [warning] = ofKind(check('crocea-clam', ['flame-angelfish']), 'nips-clams');

      expect(warning).toMatchObject({ severity: 'caution', speciesIds: ['crocea-clam', 'flame-angelfish'] });
    });
  });

  describe('eats-invertebrates', () => {
    it('warns that a Picasso triggerfish will likely eat the cleaner shrimp and Turbo snail', () => {
      const [warning] = ofKind(
        check('picasso-triggerfish', ['skunk-cleaner-shrimp', 'turbo-snail', 'leather-coral']),
        'eats-invertebrates',
      );

      expect(warning).toEqual({
        kind: 'eats-invertebrates',
        severity: 'serious',
        message:
          'The Picasso triggerfish hunts shrimp and snails and will likely eat the skunk cleaner shrimp and Turbo snail.',
        speciesIds: ['picasso-triggerfish', 'skunk-cleaner-shrimp', 'turbo-snail'],
      });
    });

    it('cautions that a flame hawkfish may eat a small cleaner shrimp', () => {
      const [warning] = ofKind(check('flame-hawkfish', ['skunk-cleaner-shrimp']), 'eats-invertebrates');

      expect(warning?.severity).toBe('caution');
      expect(warning?.message).toContain('may eat the skunk cleaner shrimp');
    });

    it('warns that the betta already in the tank may eat new cherry shrimp', () => {
      const [warning] = ofKind(check('cherry-shrimp', ['betta'], fresh), 'eats-invertebrates');

      expect(warning).toMatchObject({ severity: 'caution', speciesIds: ['cherry-shrimp', 'betta'] });
      expect(warning?.message).toBe(
        'The betta already in the tank may eat the new cherry shrimp, especially a small one.',
      );
    });

    it('warns that the assassin snail already in the tank will likely eat a new nerite snail', () => {
      const [warning] = ofKind(check('nerite-snail', ['assassin-snail'], fresh), 'eats-invertebrates');

      expect(warning?.severity).toBe('serious');
      expect(warning?.message).toBe(
        'The assassin snail already in the tank hunts snails and will likely eat the new nerite snail.',
      );
    });
  });

  describe('eats-fish', () => {
    it('warns that a volitans lionfish will eat the ocellaris clownfish but not the yellow tang', () => {
      const [warning] = ofKind(
        check('volitans-lionfish', ['ocellaris-clownfish', 'yellow-tang']),
        'eats-fish',
      );

      expect(warning).toMatchObject({
        severity: 'serious',
        speciesIds: ['volitans-lionfish', 'ocellaris-clownfish'],
      });
      expect(warning?.message).toContain('will likely eat the ocellaris clownfish.');
    });

    it('warns that the freshwater angelfish already in the tank will likely eat new neon tetras', () => {
      const [warning] = ofKind(check('neon-tetra', ['freshwater-angelfish'], fresh), 'eats-fish');

      expect(warning?.message).toBe(
        'The freshwater angelfish already in the tank eats fish small enough to swallow and will likely eat the new neon tetra.',
      );
    });

    it('leaves Corydoras alone: they are too big for a freshwater angelfish to swallow', () => {
      expect(ofKind(check('corydoras', ['freshwater-angelfish'], fresh), 'eats-fish')).toEqual([]);
    });
  });

  describe('territorial', () => {
    it('warns that a blue tang may fight the yellow tang already in the tank', () => {
      const [warning] = ofKind(check('blue-tang', ['yellow-tang']), 'territorial');

      expect(warning).toMatchObject({ severity: 'caution', speciesIds: ['blue-tang', 'yellow-tang'] });
      expect(warning?.message).toContain('may fight the yellow tang');
    });

    it('warns seriously against a second betta', () => {
      const [warning] = ofKind(check('betta', ['betta'], fresh), 'territorial');

      expect(warning).toMatchObject({ severity: 'serious', speciesIds: ['betta'] });
      expect(warning?.message).toBe(
        'The betta already in the tank will fight another betta; the newcomer may be chased and killed.',
      );
    });

    it('warns against a third ocellaris clownfish, counting quantities across entries', () => {
      const clownfish = catalogued('ocellaris-clownfish');
      const warnings = checkCompatibility(
        clownfish,
        [{ species: clownfish }, { species: clownfish }],
        marine,
      );
      const inOneEntry = checkCompatibility(clownfish, [{ species: clownfish, quantity: 2 }], marine);

      expect(ofKind(warnings, 'territorial')[0]?.message).toBe(
        'The tank already has 2 of the ocellaris clownfish; beyond a pair, another will be chased and may be killed.',
      );
      expect(inOneEntry).toEqual(warnings);
    });

    it('warns that the maroon clownfish already in the tank may fight a new ocellaris clownfish', () => {
      const [warning] = ofKind(check('ocellaris-clownfish', ['maroon-clownfish']), 'territorial');

      expect(warning?.message).toContain('The maroon clownfish treats close relatives as rivals');
    });

    it('warns that a domino damselfish may harass every other fish', () => {
      const warnings = ofKind(
        check('domino-damselfish', ['firefish', 'royal-gramma', 'trochus-snail']),
        'territorial',
      );

      expect(warnings.map((warning) => warning.speciesIds[1])).toEqual(['firefish', 'royal-gramma']);
      expect(warnings[0]?.message).toBe(
        'The domino damselfish defends its territory against other fish and may harass the firefish.',
      );
    });
  });

  describe('care-range', () => {
    it('warns that a cardinal tetra needs softer water than the platy already in the tank', () => {
      const warnings = ofKind(check('cardinal-tetra', ['platy', 'java-fern'], fresh), 'care-range');

      expect(warnings.map((warning) => warning.message)).toEqual([
        'The cardinal tetra needs GH 1–8 °dGH, but the platy needs 10–25 °dGH: no GH suits both.',
        'The cardinal tetra needs KH 0–4 °dKH, but the platy needs 5–15 °dKH: no KH suits both.',
      ]);
      expect(warnings[0]).toMatchObject({ severity: 'serious', speciesIds: ['cardinal-tetra', 'platy'] });
    });

    it('names every inhabitant whose range clashes with the candidate', () => {
      const warning = ofKind(
        check('cardinal-tetra', ['platy', 'molly', 'neon-tetra'], fresh),
        'care-range',
      ).find((w) => w.message.includes('GH'));

      expect(warning?.speciesIds).toEqual(['cardinal-tetra', 'platy', 'molly']);
      expect(warning?.message).toContain(
        'the platy needs 10–25 °dGH and the molly needs 12–30 °dGH: no GH suits them all',
      );
    });

    it('says nothing about care ranges when the water type is already wrong', () => {
      expect(check('acropora', ['neon-tetra'], fresh).map((warning) => warning.kind)).toEqual(['water-type']);
    });

    it('warns exactly when adding the candidate breaks the tank’s comfort range', () => {
      const range = fc
        .tuple(fc.integer({ min: 15, max: 30 }), fc.integer({ min: 1, max: 6 }))
        .map(([min, width]) => ({ min, max: min + width }));
      const animal = (index: number, temperature: { min: number; max: number }) =>
        buildSpecies({ id: `animal-${index}`, profile: { ranges: { temperature } } });

      fc.assert(
        fc.property(range, fc.array(range, { maxLength: 6 }), (candidateRange, tankRanges) => {
          const inhabitants = tankRanges.map((t, index) => animal(index, t));
          const candidate = animal(99, candidateRange);
          const before = comfortRange(inhabitants).conflicts.length;
          const after = comfortRange([...inhabitants, candidate]).conflicts.length;

          const warned = ofKind(
            checkCompatibility(
              candidate,
              inhabitants.map((species) => ({ species })),
              marine,
            ),
            'care-range',
          );

          if (before === 0) expect(warned.length > 0).toBe(after > 0);
          if (warned.length === 0) expect(after).toBe(before);
        }),
      );
    });
  });

  it('names an inhabitant by its nickname as well as its common name', () => {
    const warnings = checkCompatibility(
      catalogued('acropora'),
      [{ species: catalogued('hammer-coral'), nickname: 'Big Green' }],
      marine,
    );

    expect(warnings[0]?.message).toContain('The hammer coral (Big Green) already in the tank');
  });

  it('lists serious warnings before cautions', () => {
    const warnings = check('bubble-tip-anemone', ['hammer-coral']);

    expect(warnings.map((warning) => warning.severity)).toEqual(['serious', 'caution']);
  });

  it('puts the candidate first in every warning and names only animals in the tank', () => {
    const sample = fc.subarray([...speciesCatalogue], { maxLength: 8 });

    fc.assert(
      fc.property(
        fc.constantFrom(...speciesCatalogue),
        sample,
        (candidate: Species, residents: Species[]) => {
          const inhabitantIds = new Set(residents.map((entry) => entry.id));
          const warnings = checkCompatibility(
            candidate,
            residents.map((species) => ({ species })),
            { waterType: candidate.profile.waterTypes[0] ?? 'marine' },
          );
          for (const warning of warnings) {
            expect(warning.speciesIds[0]).toBe(candidate.id);
            for (const id of warning.speciesIds.slice(1)) expect(inhabitantIds).toContain(id);
            expect(warning.message).toMatch(/^The .+[.]$/s);
          }
        },
      ),
    );
  });
});
