import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UrgentRequestInput, UrgentRequestView } from '@shared/schemas/urgent-requests';
import { api } from '../../../lib/api-client';
import { urgentKeys } from '../../../lib/query-keys';

export const createUrgentRequest = (tankId: string, input: UrgentRequestInput) =>
  api<UrgentRequestView>(`/tanks/${tankId}/urgent-requests`, { method: 'POST', body: input });

export function useCreateUrgentRequest(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UrgentRequestInput) => createUrgentRequest(tankId, input),
    onSuccess: (request) => {
      queryClient.setQueryData(urgentKeys.detail(request.id), request);
      // The staff board and the tank's list gain it.
      void queryClient.invalidateQueries({ queryKey: urgentKeys.all });
    },
  });
}
