import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StaffMember } from '@shared/schemas/users';
import { api } from '../../../lib/api-client';
import { invalidatePeople } from '../../../lib/queries/people';

/** Switches the account off; the API ends every session of that person in the same step. */
export const deactivateUser = (userId: string) =>
  api<StaffMember>(`/users/${userId}/deactivate`, { method: 'POST' });

export const useDeactivateUser = () => {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: deactivateUser, onSuccess: () => invalidatePeople(queryClient) });
};
