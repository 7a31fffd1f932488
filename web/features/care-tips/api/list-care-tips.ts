import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CareTip } from '@shared/schemas/care-tips';
import { api } from '../../../lib/api-client';
import { tipKeys } from '../../../lib/query-keys';

/** The company's tips, newest first, whatever their state. */
export const listCareTips = (signal?: AbortSignal) => api<CareTip[]>('/care-tips', { signal });

export const careTipsQueryOptions = () =>
  queryOptions({ queryKey: tipKeys.lists(), queryFn: ({ signal }) => listCareTips(signal) });

export const useCareTips = () => useQuery(careTipsQueryOptions());
