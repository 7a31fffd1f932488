import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StaffRole } from '@shared/people/permissions';
import type { StaffMember } from '@shared/schemas/users';
import { api } from '../../../lib/api-client';
import { invalidatePeople } from '../../../lib/queries/people';

/** The API answers 409 `own_role` when an admin tries to change their own role. */
export const changeStaffRole = ({ userId, role }: { userId: string; role: StaffRole }) =>
  api<StaffMember>(`/staff/${userId}`, { method: 'PATCH', body: { role } });

export const useChangeStaffRole = () => {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: changeStaffRole, onSuccess: () => invalidatePeople(queryClient) });
};
