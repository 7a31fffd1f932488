import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatedDevice, CreateDeviceInput } from '@shared/schemas/readings';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const createDevice = (tankId: string, input: CreateDeviceInput) =>
  api<CreatedDevice>(`/tanks/${tankId}/devices`, { method: 'POST', body: input });

export function useCreateDevice(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateDeviceInput) => createDevice(tankId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.devices(tankId) }),
  });
}
