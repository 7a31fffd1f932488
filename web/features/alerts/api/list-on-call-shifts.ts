import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OnCallShiftView } from '@shared/schemas/on-call';
import { api } from '../../../lib/api-client';
import { onCallQueryKey } from './on-call-query-keys';

/** Shifts that have not ended yet, the soonest first. */
export const listOnCallShifts = (signal?: AbortSignal) => api<OnCallShiftView[]>('/on-call', { signal });

export const onCallShiftsQueryOptions = () =>
  queryOptions({ queryKey: onCallQueryKey, queryFn: ({ signal }) => listOnCallShifts(signal) });

export const useOnCallShifts = () => useQuery(onCallShiftsQueryOptions());
