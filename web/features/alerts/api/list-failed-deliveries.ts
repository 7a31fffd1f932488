import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DeliveryView } from '@shared/schemas/on-call';
import { api } from '../../../lib/api-client';
import { deliveryKeys } from '../../../lib/query-keys';

/** Notifications that could not be delivered: staff follow these up by hand. */
export const listFailedDeliveries = (signal?: AbortSignal) =>
  api<DeliveryView[]>('/deliveries/failed', { signal });

export const failedDeliveriesQueryOptions = () =>
  queryOptions({
    queryKey: deliveryKeys.failed,
    queryFn: ({ signal }) => listFailedDeliveries(signal),
    // A delivery fails only after its retries run out, minutes later, with no live event of its own.
    refetchInterval: 60_000,
  });

export const useFailedDeliveries = () => useQuery(failedDeliveriesQueryOptions());
