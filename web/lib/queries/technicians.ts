import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AssignableStaff } from '@shared/schemas/tanks';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';

/*
 * Active staff a tank or a visit can be given to: the tank form, the console's technician filter
 * and the schedule all pick from this one list.
 */

export const getTechnicians = (signal?: AbortSignal) =>
  api<AssignableStaff[]>('/tanks/technicians', { signal });

export const techniciansQueryOptions = () =>
  queryOptions({
    queryKey: tankKeys.technicians(),
    queryFn: ({ signal }) => getTechnicians(signal),
    staleTime: 5 * 60_000,
  });

export const useTechnicians = () => useQuery(techniciansQueryOptions());
