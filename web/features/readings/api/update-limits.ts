import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TankLimitsView, UpdateLimitsInput } from '@shared/schemas/limits';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const updateLimits = (tankId: string, input: UpdateLimitsInput) =>
  api<TankLimitsView>(`/tanks/${tankId}/limits`, { method: 'PUT', body: input });

export function useUpdateLimits(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateLimitsInput) => updateLimits(tankId, input),
    onSuccess: (view) => {
      queryClient.setQueryData(tankKeys.limits(tankId), view);
      // Limits decide health and the chart's bands.
      return queryClient.invalidateQueries({ queryKey: tankKeys.all });
    },
  });
}
