import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { comfortRange, formatRange } from '@shared/livestock/comfort-range';
import { parametersFor } from '@shared/parameters/catalogue';
import type { ParameterRange } from '@shared/livestock/species';
import { buildSpecies, catalogued } from './species-factory';

const withTemperature = (id: string, min: number, max: number) =>
  buildSpecies({
    id,
    commonName: id.replaceAll('-', ' '),
    profile: { ranges: { temperature: { min, max } } },
  });

describe('comfortRange', () => {
  it('is the intersection of the inhabitants’ ranges, naming the species that set each end', () => {
    const clownfish = catalogued('ocellaris-clownfish');
    const acropora = catalogued('acropora');
    const shrimp = catalogued('skunk-cleaner-shrimp');

    const { ranges, conflicts } = comfortRange([clownfish, acropora, shrimp]);

    expect(conflicts).toEqual([]);
    expect(ranges.temperature).toEqual({
      min: 24,
      max: 27,
      limitedBy: { low: [clownfish.id, acropora.id, shrimp.id], high: [acropora.id, shrimp.id] },
    });
    expect(ranges.salinity).toMatchObject({ min: 33, max: 36, limitedBy: { low: [acropora.id, shrimp.id] } });
    expect(ranges.calcium).toEqual({
      min: 400,
      max: 460,
      limitedBy: { low: [acropora.id], high: [acropora.id] },
    });
  });

  it('leaves out parameters no inhabitant has a range for', () => {
    const { ranges } = comfortRange([catalogued('neon-tetra'), catalogued('java-fern')]);

    expect(Object.keys(ranges).sort()).toEqual(['gh', 'kh', 'ph', 'temperature']);
  });

  it('lists a GH conflict between a cardinal tetra and a platy and gives no GH range', () => {
    const cardinal = catalogued('cardinal-tetra');
    const platy = catalogued('platy');

    const { ranges, conflicts } = comfortRange([cardinal, platy, catalogued('java-fern')]);

    expect(ranges.gh).toBeUndefined();
    const gh = conflicts.find((conflict) => conflict.parameter === 'gh');
    expect(gh?.species).toEqual([
      { id: 'cardinal-tetra', commonName: 'cardinal tetra', min: 1, max: 8 },
      { id: 'platy', commonName: 'platy', min: 10, max: 25 },
    ]);
    expect(gh?.message).toBe(
      'No GH suits every inhabitant: the cardinal tetra needs 1–8 °dGH and the platy needs 10–25 °dGH.',
    );
  });

  it('names only the species whose ranges clash, not the one that overlaps both', () => {
    const cool = withTemperature('cool-one', 20, 24);
    const middle = withTemperature('middle-one', 22, 26);
    const warm = withTemperature('warm-one', 25, 28);

    const { conflicts } = comfortRange([middle, warm, cool]);

    expect(conflicts).toHaveLength(1);
    expect(conflicts[0]?.species.map((entry) => entry.id)).toEqual(['cool-one', 'warm-one']);
  });

  it('treats ranges that only touch as overlapping', () => {
    const { ranges, conflicts } = comfortRange([
      withTemperature('a-one', 20, 24),
      withTemperature('b-one', 24, 28),
    ]);

    expect(conflicts).toEqual([]);
    expect(ranges.temperature).toMatchObject({ min: 24, max: 24 });
  });

  it('counts a species listed twice once', () => {
    const neon = catalogued('neon-tetra');

    const { ranges } = comfortRange([neon, neon]);

    expect(ranges.temperature?.limitedBy).toEqual({ low: [neon.id], high: [neon.id] });
  });

  it('is empty for an empty tank', () => {
    expect(comfortRange([])).toEqual({ ranges: {}, conflicts: [] });
  });

  it('lies inside every inhabitant’s range, or reports a conflict when the ranges share no point', () => {
    const range = fc
      .tuple(fc.integer({ min: 0, max: 60 }), fc.integer({ min: 1, max: 30 }))
      .map(([min, width]): ParameterRange => ({ min, max: min + width }));

    fc.assert(
      fc.property(fc.array(range, { minLength: 1, maxLength: 8 }), (temperatures) => {
        const inhabitants = temperatures.map((t, index) => withTemperature(`animal-${index}`, t.min, t.max));
        const shared = temperatures.some((candidate) =>
          temperatures.every((t) => t.min <= candidate.min && candidate.min <= t.max),
        );

        const { ranges, conflicts } = comfortRange(inhabitants);

        if (shared) {
          const band = ranges.temperature;
          if (!band) throw new Error('expected a temperature band');
          expect(conflicts).toEqual([]);
          for (const t of temperatures) {
            expect(band.min).toBeGreaterThanOrEqual(t.min);
            expect(band.max).toBeLessThanOrEqual(t.max);
          }
          expect(band.limitedBy.low.length).toBeGreaterThan(0);
          expect(band.limitedBy.high.length).toBeGreaterThan(0);
        } else {
          expect(ranges.temperature).toBeUndefined();
          expect(conflicts[0]?.species.length).toBeGreaterThanOrEqual(2);
        }
      }),
    );
  });
});

describe('comfortRange on a freshwater tank', () => {
  it('keeps no salinity range, though a molly would also live in brackish water', () => {
    const molly = catalogued('molly');

    const { ranges } = comfortRange([molly], parametersFor('fresh'));

    expect(ranges.salinity).toBeUndefined();
    expect(ranges.temperature).toMatchObject({ min: 24, max: 28 });
    // A brackish tank keeps it.
    expect(comfortRange([molly], parametersFor('brackish')).ranges.salinity).toMatchObject({
      min: 0,
      max: 15,
    });
  });
});

describe('formatRange', () => {
  it('writes a range closed to one value as that value, not "10–10"', () => {
    expect(formatRange('gh', { min: 10, max: 10 })).toBe('10 °dGH');
    expect(formatRange('ph', { min: 8.1, max: 8.1 })).toBe('8.1');
  });

  it('writes an open range from its low to its high end', () => {
    expect(formatRange('gh', { min: 6, max: 10 })).toBe('6–10 °dGH');
  });
});
