import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { TipSuggestion } from '@shared/schemas/care-tips';
import { api } from '../api-client';
import { tankKeys, tipKeys } from '../query-keys';

/*
 * The care tips offered for one tank after staff add livestock or publish a visit: the livestock
 * screen and the visit report both show them, so the calls live here beside the shared component.
 */

export const getTipSuggestions = (tankId: string, signal?: AbortSignal) =>
  api<TipSuggestion[]>(`/tanks/${tankId}/tip-suggestions`, { signal });

export const tipSuggestionsQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: tankKeys.tipSuggestions(tankId),
    queryFn: ({ signal }) => getTipSuggestions(tankId, signal),
  });

export const useTipSuggestions = (tankId: string, enabled = true) =>
  useQuery({ ...tipSuggestionsQueryOptions(tankId), enabled });

export const sendTipToTank = (tipId: string, tankId: string) =>
  api<unknown>(`/care-tips/${tipId}/send-to-tank`, { method: 'POST', body: { tankId } });

/** One tap: the tip reaches this tank (a second send is a no-op on the server). */
export function useSendTipToTank(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (tipId: string) => sendTipToTank(tipId, tankId),
    onSuccess: (_result, tipId) => {
      void queryClient.invalidateQueries({ queryKey: tankKeys.tipSuggestions(tankId) });
      void queryClient.invalidateQueries({ queryKey: tipKeys.detail(tipId) });
      void queryClient.invalidateQueries({ queryKey: tipKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: tipKeys.feeds() });
    },
  });
}
