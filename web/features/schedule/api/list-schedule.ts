import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ScheduleQuery, VisitSummary } from '@shared/schemas/visits';
import { api } from '../../../lib/api-client';
import { visitKeys } from '../../../lib/query-keys';

/** The visits between two days (both included); technicians get their own whatever they ask. */
export function getSchedule(query: ScheduleQuery, signal?: AbortSignal) {
  const params = new URLSearchParams({ from: query.from, to: query.to });
  if (query.technicianId) params.set('technicianId', query.technicianId);
  if (query.tankId) params.set('tankId', query.tankId);
  return api<VisitSummary[]>(`/visits?${params}`, { signal });
}

export const scheduleQueryOptions = (query: ScheduleQuery) =>
  queryOptions({
    queryKey: visitKeys.schedule(query),
    queryFn: ({ signal }) => getSchedule(query, signal),
    // A day's plan changes while a technician is out (an admin moves a visit, a report is published).
    refetchInterval: 5 * 60_000,
  });

export const useSchedule = (query: ScheduleQuery) => useQuery(scheduleQueryOptions(query));
