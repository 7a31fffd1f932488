import { z } from 'zod';
import { roles, staffRoles, type Role } from '@shared/people/permissions';

export const role = z.enum(roles);
export type { Role };

export const staffRole = z.enum(staffRoles);

export const me = z.object({
  id: z.uuid(),
  name: z.string(),
  email: z.string(),
  role,
  company: z.object({ id: z.uuid(), name: z.string() }),
});
export type Me = z.infer<typeof me>;

export const staffMember = z.object({
  id: z.uuid(),
  name: z.string(),
  email: z.string(),
  role,
  status: z.enum(['active', 'deactivated']),
});
export type StaffMember = z.infer<typeof staffMember>;

export const userIdParams = z.object({ userId: z.uuid() });

export const changeRoleInput = z.object({ role: staffRole });

export const clientSummary = z.object({
  id: z.uuid(),
  name: z.string(),
  email: z.string(),
  status: z.enum(['active', 'deactivated']),
  tanks: z.array(z.object({ id: z.uuid(), name: z.string() })),
});
export type ClientSummary = z.infer<typeof clientSummary>;
