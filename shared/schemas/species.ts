import type { z } from 'zod';
import { species } from '@shared/livestock/species';

/** A species a company adds for itself; the server assigns the id. */
export const speciesInput = species.omit({ id: true });
export type SpeciesInput = z.input<typeof speciesInput>;
