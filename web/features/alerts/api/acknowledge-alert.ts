import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlertView } from '@shared/schemas/alerts';
import { api } from '../../../lib/api-client';
import { alertKeys } from '../../../lib/query-keys';

/** Only an open alert can be acknowledged; the API answers 409 `not_open` otherwise. */
export const acknowledgeAlert = ({ alertId, note }: { alertId: string; note?: string }) =>
  api<AlertView>(`/alerts/${alertId}/acknowledge`, { method: 'POST', body: note ? { note } : {} });

export const useAcknowledgeAlert = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acknowledgeAlert,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: alertKeys.all }),
  });
};
