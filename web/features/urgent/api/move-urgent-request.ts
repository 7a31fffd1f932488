import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UrgentMoveInput, UrgentRequestView } from '@shared/schemas/urgent-requests';
import { api } from '../../../lib/api-client';
import { urgentKeys } from '../../../lib/query-keys';

export const moveUrgentRequest = (requestId: string, move: UrgentMoveInput) =>
  api<UrgentRequestView>(`/urgent-requests/${requestId}/moves`, { method: 'POST', body: move });

/** One step of the lifecycle; the board and the tank's list move with it. */
export function useMoveUrgentRequest(requestId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (move: UrgentMoveInput) => moveUrgentRequest(requestId, move),
    onSuccess: (request) => {
      queryClient.setQueryData(urgentKeys.detail(request.id), request);
      void queryClient.invalidateQueries({ queryKey: urgentKeys.all });
    },
  });
}
