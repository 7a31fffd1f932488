import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VisitDetail } from '@shared/schemas/visits';
import { api } from '../../../lib/api-client';
import { tankKeys, visitKeys } from '../../../lib/query-keys';

export const publishReport = (visitId: string, version: number) =>
  api<VisitDetail>(`/visits/${visitId}/publish`, { method: 'POST', body: { version } });

export function usePublishReport(visitId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (version: number) => publishReport(visitId, version),
    onSuccess: (visit) => {
      queryClient.setQueryData(visitKeys.detail(visitId), visit);
      // Readings, livestock, items and the next visit all changed with it.
      void queryClient.invalidateQueries({ queryKey: tankKeys.detail(visit.tankId) });
      void queryClient.invalidateQueries({ queryKey: visitKeys.schedules() });
    },
  });
}
