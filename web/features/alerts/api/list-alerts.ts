import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertListQuery, AlertView } from '@shared/schemas/alerts';
import { api } from '../../../lib/api-client';
import { alertKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

export type AlertFilters = Partial<Pick<AlertListQuery, 'status' | 'severity' | 'tankId'>>;

/** The API sorts: the most severe first, then the oldest (resolved ones: the latest first). */
export const listAlerts = (filters: AlertFilters, signal?: AbortSignal) =>
  api<AlertView[]>(apiPaths.alerts(filters), { signal });

export const alertsQueryOptions = (filters: AlertFilters) =>
  queryOptions({
    queryKey: alertKeys.list(filters),
    queryFn: ({ signal }) => listAlerts(filters, signal),
  });

/** `keepPrevious`: while a changed filter loads, keep showing the last list (the board, not a tank). */
export const useAlerts = (filters: AlertFilters, { keepPrevious = false } = {}) =>
  useQuery({ ...alertsQueryOptions(filters), placeholderData: keepPrevious ? keepPreviousData : undefined });
