import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AssignableStaff } from '@shared/schemas/tanks';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

/** Active staff a tank can be assigned to. */
export const getTechnicians = (signal?: AbortSignal) =>
  api<AssignableStaff[]>('/tanks/technicians', { signal });

export const techniciansQueryOptions = () =>
  queryOptions({
    queryKey: tankKeys.technicians(),
    queryFn: ({ signal }) => getTechnicians(signal),
    staleTime: 5 * 60_000,
  });

export const useTechnicians = () => useQuery(techniciansQueryOptions());
