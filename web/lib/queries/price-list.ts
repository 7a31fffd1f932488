import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PriceListView } from '@shared/schemas/billing';
import { api } from '../api-client';
import { billingKeys } from '../query-keys';

/** The company's price list (staff): billing settings and every item, archived ones last. The price-list page edits it; a visit report names its consumables and parts from it. */
export const getPriceList = (signal?: AbortSignal) => api<PriceListView>('/billing/price-list', { signal });

export const priceListQueryOptions = () =>
  queryOptions({
    queryKey: billingKeys.priceList(),
    queryFn: ({ signal }) => getPriceList(signal),
    // Kept for the working day once read, so a report opened here before the connection dropped
    // still offers the list; prices change rarely.
    staleTime: 5 * 60_000,
    gcTime: 12 * 60 * 60_000,
  });

export const usePriceList = (enabled = true) => useQuery({ ...priceListQueryOptions(), enabled });
