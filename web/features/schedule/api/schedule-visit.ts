import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ScheduleVisitInput, VisitSummary } from '@shared/schemas/visits';
import { api } from '../../../lib/api-client';
import { tankKeys, visitKeys } from '../../../lib/query-keys';

/** Plans a visit; a repeating routine service answers with its first visit. */
export const scheduleVisit = (input: ScheduleVisitInput) =>
  api<VisitSummary>('/visits', { method: 'POST', body: input });

export function useScheduleVisit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: scheduleVisit,
    onSuccess: (visit) => {
      void queryClient.invalidateQueries({ queryKey: visitKeys.schedules() });
      void queryClient.invalidateQueries({ queryKey: tankKeys.visits(visit.tankId) });
    },
  });
}
