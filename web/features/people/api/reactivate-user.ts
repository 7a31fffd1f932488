import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StaffMember } from '@shared/schemas/users';
import { api } from '../../../lib/api-client';
import { invalidatePeople } from '../../../lib/queries/people';

export const reactivateUser = (userId: string) =>
  api<StaffMember>(`/users/${userId}/reactivate`, { method: 'POST' });

export const useReactivateUser = () => {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: reactivateUser, onSuccess: () => invalidatePeople(queryClient) });
};
