import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { onCallKeys } from '../../../lib/query-keys';

export const removeOnCallShift = (shiftId: string) => api<void>(`/on-call/${shiftId}`, { method: 'DELETE' });

export const useRemoveOnCallShift = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeOnCallShift,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: onCallKeys.all }),
  });
};
