import type { SpeciesQuery } from '@shared/schemas/livestock';

/** Under the tank's own key, so whatever refreshes a tank refreshes what lives in it. */
export const livestockKeys = {
  list: (tankId: string) => ['tanks', 'detail', tankId, 'livestock'] as const,
  check: (tankId: string, speciesId: string) =>
    ['tanks', 'detail', tankId, 'livestock-check', speciesId] as const,
  comfortRange: (tankId: string) => ['tanks', 'detail', tankId, 'comfort-range'] as const,
  species: (query: Partial<SpeciesQuery>) => ['species', query] as const,
  allSpecies: ['species'] as const,
};
