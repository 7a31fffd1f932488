import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeviceSummary } from '@shared/schemas/readings';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const revokeDevice = (tankId: string, deviceId: string) =>
  api<DeviceSummary>(`/tanks/${tankId}/devices/${deviceId}`, { method: 'DELETE' });

export function useRevokeDevice(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (deviceId: string) => revokeDevice(tankId, deviceId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.devices(tankId) }),
  });
}
