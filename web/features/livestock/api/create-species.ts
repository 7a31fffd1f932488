import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpeciesEntry } from '@shared/schemas/livestock';
import type { SpeciesInput } from '@shared/schemas/species';
import { api } from '../../../lib/api-client';
import { speciesKeys } from '../../../lib/query-keys';

export const createSpecies = (input: SpeciesInput) =>
  api<SpeciesEntry>('/species', { method: 'POST', body: input });

export function useCreateSpecies() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSpecies,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: speciesKeys.all }),
  });
}
