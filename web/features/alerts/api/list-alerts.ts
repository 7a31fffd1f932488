import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertListQuery, AlertView } from '@shared/schemas/alerts';
import { api } from '../../../lib/api-client';
import { alertKeys } from '../../../lib/query-keys';

export type AlertFilters = Partial<Pick<AlertListQuery, 'status' | 'severity' | 'tankId'>>;

/** The API sorts: the most severe first, then the oldest (resolved ones: the latest first). */
export function listAlerts(filters: AlertFilters, signal?: AbortSignal) {
  const query = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value) query.set(key, value);
  const search = query.toString();
  return api<AlertView[]>(search ? `/alerts?${search}` : '/alerts', { signal });
}

export const alertsQueryOptions = (filters: AlertFilters) =>
  queryOptions({
    queryKey: alertKeys.list(filters),
    queryFn: ({ signal }) => listAlerts(filters, signal),
  });

/** `keepPrevious`: while a changed filter loads, keep showing the last list (the board, not a tank). */
export const useAlerts = (filters: AlertFilters, { keepPrevious = false } = {}) =>
  useQuery({ ...alertsQueryOptions(filters), placeholderData: keepPrevious ? keepPreviousData : undefined });
