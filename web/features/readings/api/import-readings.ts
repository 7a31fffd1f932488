import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportReadingsInput } from '@shared/schemas/readings';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const importReadings = (tankId: string, input: ImportReadingsInput) =>
  api<{ imported: number }>(`/tanks/${tankId}/readings/import`, { method: 'POST', body: input });

export function useImportReadings(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ImportReadingsInput) => importReadings(tankId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.all }),
  });
}
