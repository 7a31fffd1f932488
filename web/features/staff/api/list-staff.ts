import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StaffMember } from '@shared/schemas/users';
import { api } from '../../../lib/api-client';
import { staffQueryKey } from './people-query-keys';

export const getStaff = (signal?: AbortSignal) => api<StaffMember[]>('/staff', { signal });

export const staffQueryOptions = () =>
  queryOptions({ queryKey: staffQueryKey, queryFn: ({ signal }) => getStaff(signal) });

export const useStaff = () => useQuery(staffQueryOptions());
