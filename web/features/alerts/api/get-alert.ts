import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertView } from '@shared/schemas/alerts';
import { api } from '../../../lib/api-client';
import { alertKeys } from '../../../lib/query-keys';

/** One alert with its timeline (`events`: opened, escalated, acknowledged, resolved…). */
export const getAlert = (alertId: string, signal?: AbortSignal) =>
  api<AlertView>(`/alerts/${alertId}`, { signal });

export const alertQueryOptions = (alertId: string) =>
  queryOptions({
    queryKey: alertKeys.detail(alertId),
    queryFn: ({ signal }) => getAlert(alertId, signal),
  });

export const useAlert = (alertId: string | null) =>
  useQuery({ ...alertQueryOptions(alertId ?? ''), enabled: alertId !== null });
