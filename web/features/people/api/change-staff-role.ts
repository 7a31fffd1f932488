import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StaffMember } from '@shared/schemas/users';
import { api } from '../../../lib/api-client';
import { staffQueryKey } from './people-query-keys';

export type StaffRole = 'technician' | 'admin';

/** The API answers 409 `own_role` when an admin tries to change their own role. */
export const changeStaffRole = ({ userId, role }: { userId: string; role: StaffRole }) =>
  api<StaffMember>(`/staff/${userId}`, { method: 'PATCH', body: { role } });

export const useChangeStaffRole = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeStaffRole,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffQueryKey }),
  });
};
