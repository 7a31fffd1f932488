import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TankDetail, UpdateTankInput } from '@shared/schemas/tanks';
import { api } from '../../../lib/api-client';
import { invalidatePeople } from '../../../lib/queries/people';
import { tankKeys } from '../../../lib/query-keys';

export const updateTank = (tankId: string, input: UpdateTankInput) =>
  api<TankDetail>(`/tanks/${tankId}`, { method: 'PATCH', body: input });

export function useUpdateTank(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateTankInput) => updateTank(tankId, input),
    onSuccess: (tank) => {
      queryClient.setQueryData(tankKeys.detail(tank.id), tank);
      void queryClient.invalidateQueries({ queryKey: tankKeys.all });
      void invalidatePeople(queryClient);
    },
  });
}
