import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UrgentSettingsInput, UrgentSettingsView } from '@shared/schemas/urgent-requests';
import { api } from '../../../lib/api-client';
import { urgentKeys } from '../../../lib/query-keys';

export const saveUrgentSettings = (input: UrgentSettingsInput) =>
  api<UrgentSettingsView>('/urgent-settings', { method: 'PUT', body: input });

/** The target and fee show on every request, so the board and the requests refresh with the settings. */
export function useSaveUrgentSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveUrgentSettings,
    onSuccess: (settings) => {
      queryClient.setQueryData(urgentKeys.settings(), settings);
      void queryClient.invalidateQueries({ queryKey: urgentKeys.all });
    },
  });
}
