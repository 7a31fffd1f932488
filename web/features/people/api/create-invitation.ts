import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvitationInput, Invitation } from '@shared/schemas/invitations';
import { api } from '../../../lib/api-client';
import { peopleKeys } from '../../../lib/query-keys';

/** `emailSent: false` means the invitation exists but its e-mail did not leave. */
export type CreatedInvitation = Invitation & { emailSent: boolean };

export const createInvitation = (input: CreateInvitationInput) =>
  api<CreatedInvitation>('/invitations', { method: 'POST', body: input });

export const useCreateInvitation = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.invitations() }),
  });
};
