import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateVisitInput, VisitSummary } from '@shared/schemas/visits';
import { api } from '../../../lib/api-client';
import { tankKeys, visitKeys } from '../../../lib/query-keys';

/** Changes a planned visit: who does it, when, its kind, or whether it is cancelled. */
export const updateVisit = (visitId: string, input: UpdateVisitInput) =>
  api<VisitSummary>(`/visits/${visitId}`, { method: 'PATCH', body: input });

export function useUpdateVisit(visitId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateVisitInput) => updateVisit(visitId, input),
    onSuccess: (visit) => {
      void queryClient.invalidateQueries({ queryKey: visitKeys.schedules() });
      void queryClient.invalidateQueries({ queryKey: visitKeys.detail(visit.id) });
      void queryClient.invalidateQueries({ queryKey: tankKeys.visits(visit.tankId) });
    },
  });
}
