import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateTankInput, TankDetail } from '@shared/schemas/tanks';
import { api } from '../../../lib/api-client';
import { invalidatePeople } from '../../../lib/queries/people';
import { tankKeys } from '../../../lib/query-keys';

export const createTank = (input: CreateTankInput) =>
  api<TankDetail>('/tanks', { method: 'POST', body: input });

export function useCreateTank() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createTank,
    onSuccess: (tank) => {
      queryClient.setQueryData(tankKeys.detail(tank.id), tank);
      void queryClient.invalidateQueries({ queryKey: tankKeys.all });
      void invalidatePeople(queryClient);
    },
  });
}
