import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateReadingsInput } from '@shared/schemas/readings';
import type { Reading } from '@shared/readings/reading';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const createReadings = (tankId: string, input: CreateReadingsInput) =>
  api<{ readings: Reading[] }>(`/tanks/${tankId}/readings`, { method: 'POST', body: input });

export function useCreateReadings(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateReadingsInput) => createReadings(tankId, input),
    // New readings change the tank's status, its charts and every list showing it.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.all }),
  });
}
