import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Health } from '@shared/schemas/health';
import { api } from '../../../lib/api-client';
import { apiPaths } from '@shared/first-load/api-paths';

export const getHealth = (signal?: AbortSignal) => api<Health>(apiPaths.health(), { signal });

export const healthQueryOptions = () =>
  queryOptions({ queryKey: ['health'], queryFn: ({ signal }) => getHealth(signal), refetchInterval: 60_000 });

export const useHealth = () => useQuery(healthQueryOptions());
