import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BillingSettingsInput, BillingSettingsView, PriceListView } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';
import { billingKeys, urgentKeys } from '../../../lib/query-keys';

export const saveBillingSettings = (input: BillingSettingsInput) =>
  api<BillingSettingsView>('/billing/settings', { method: 'PUT', body: input });

/** The call-out fee is what owners see before asking for an urgent visit, so those settings refresh too. */
export function useSaveBillingSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveBillingSettings,
    onSuccess: (settings) => {
      queryClient.setQueryData<PriceListView>(billingKeys.priceList(), (list) =>
        list ? { ...list, settings } : list,
      );
      void queryClient.invalidateQueries({ queryKey: billingKeys.all });
      void queryClient.invalidateQueries({ queryKey: urgentKeys.settings() });
    },
  });
}
