import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UrgentSettingsView } from '@shared/schemas/urgent-requests';
import { api } from '../../../lib/api-client';
import { urgentKeys } from '../../../lib/query-keys';

/** The company's first aid, call-out fee and acknowledgement target (its own text, or the defaults). */
export const getUrgentSettings = (signal?: AbortSignal) =>
  api<UrgentSettingsView>('/urgent-settings', { signal });

export const urgentSettingsQueryOptions = () =>
  queryOptions({
    queryKey: urgentKeys.settings(),
    queryFn: ({ signal }) => getUrgentSettings(signal),
    staleTime: 5 * 60_000,
  });

export const useUrgentSettings = () => useQuery(urgentSettingsQueryOptions());
