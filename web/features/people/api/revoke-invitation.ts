import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { peopleKeys } from '../../../lib/query-keys';

export const revokeInvitation = (invitationId: string) =>
  api<void>(`/invitations/${invitationId}`, { method: 'DELETE' });

export const useRevokeInvitation = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.invitations() }),
  });
};
