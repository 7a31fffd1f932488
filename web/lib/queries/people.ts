import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { ClientSummary, StaffMember } from '@shared/schemas/users';
import { api } from '../api-client';
import { peopleKeys } from '../query-keys';

/*
 * The company's people: staff (the on-call roster and the staff screen pick from them) and clients
 * (the tank form picks owners from them).
 */

export const getStaff = (signal?: AbortSignal) => api<StaffMember[]>('/staff', { signal });

export const staffQueryOptions = () =>
  queryOptions({ queryKey: peopleKeys.staff(), queryFn: ({ signal }) => getStaff(signal) });

export const useStaff = () => useQuery(staffQueryOptions());

/** Every client of the company with the tanks they follow, by name. */
export const getClients = (signal?: AbortSignal) => api<ClientSummary[]>('/clients', { signal });

export const clientsQueryOptions = () =>
  queryOptions({ queryKey: peopleKeys.clients(), queryFn: ({ signal }) => getClients(signal) });

export const useClients = () => useQuery(clientsQueryOptions());

/** A change to a person (role, status, a tank's owners) touches both lists. */
export const invalidatePeople = (queryClient: QueryClient) =>
  queryClient.invalidateQueries({ queryKey: peopleKeys.all });
