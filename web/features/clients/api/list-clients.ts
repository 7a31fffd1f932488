import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClientSummary } from '@shared/schemas/users';
import { api } from '../../../lib/api-client';
import { clientsQueryKey } from '../../staff/api/people-query-keys';

/** Every client of the company with the tanks they follow, by name. */
export const getClients = (signal?: AbortSignal) => api<ClientSummary[]>('/clients', { signal });

export const clientsQueryOptions = () =>
  queryOptions({ queryKey: clientsQueryKey, queryFn: ({ signal }) => getClients(signal) });

export const useClients = () => useQuery(clientsQueryOptions());
