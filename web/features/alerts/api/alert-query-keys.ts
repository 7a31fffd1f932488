import type { AlertListQuery } from '@shared/schemas/alerts';

export type AlertFilters = Partial<Pick<AlertListQuery, 'status' | 'severity' | 'tankId'>>;

/** Every alert query starts with `['alerts']`, so one invalidation refreshes the board, a tank and a detail. */
export const alertsQueryKey = ['alerts'] as const;
export const alertListQueryKey = (filters: AlertFilters) => [...alertsQueryKey, 'list', filters] as const;
export const alertDetailQueryKey = (alertId: string) => [...alertsQueryKey, 'detail', alertId] as const;
