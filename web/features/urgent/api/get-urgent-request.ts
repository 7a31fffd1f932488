import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UrgentRequestView } from '@shared/schemas/urgent-requests';
import { api } from '../../../lib/api-client';
import { urgentKeys } from '../../../lib/query-keys';

export const getUrgentRequest = (requestId: string, signal?: AbortSignal) =>
  api<UrgentRequestView>(`/urgent-requests/${requestId}`, { signal });

/** Kept fresh by the event stream (an "urgent" event invalidates every request), not by polling. */
export const urgentRequestQueryOptions = (requestId: string) =>
  queryOptions({
    queryKey: urgentKeys.detail(requestId),
    queryFn: ({ signal }) => getUrgentRequest(requestId, signal),
  });

export const useUrgentRequest = (requestId: string) => useQuery(urgentRequestQueryOptions(requestId));
