import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OnCallShiftView } from '@shared/schemas/on-call';
import { api } from '../../../lib/api-client';
import { onCallKeys } from '../../../lib/query-keys';

/** Shifts that have not ended yet, the soonest first. */
export const listOnCallShifts = (signal?: AbortSignal) => api<OnCallShiftView[]>('/on-call', { signal });

export const onCallShiftsQueryOptions = () =>
  queryOptions({ queryKey: onCallKeys.all, queryFn: ({ signal }) => listOnCallShifts(signal) });

export const useOnCallShifts = () => useQuery(onCallShiftsQueryOptions());
