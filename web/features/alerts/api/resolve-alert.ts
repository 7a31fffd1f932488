import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlertView } from '@shared/schemas/alerts';
import { api } from '../../../lib/api-client';
import { alertKeys } from '../../../lib/query-keys';

/** The note is required: the API answers 400 with an issue on `body.note` when it is blank. */
export const resolveAlert = ({ alertId, note }: { alertId: string; note: string }) =>
  api<AlertView>(`/alerts/${alertId}/resolve`, { method: 'POST', body: { note } });

export const useResolveAlert = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resolveAlert,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: alertKeys.all }),
  });
};
