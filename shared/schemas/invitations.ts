import { z } from 'zod';

const email = z
  .email('Enter a valid e-mail address.')
  .max(254)
  .transform((value) => value.toLowerCase());
const name = z.string().trim().min(1).max(120).optional();

export const createInvitationInput = z.discriminatedUnion('role', [
  z.object({ role: z.enum(['technician', 'admin']), email, name }),
  z.object({ role: z.literal('owner'), email, name, tankId: z.uuid('Choose a tank.') }),
]);
export type CreateInvitationInput = z.infer<typeof createInvitationInput>;

export const invitation = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string().nullable(),
  role: z.enum(['owner', 'technician', 'admin']),
  tank: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  expiresAt: z.iso.datetime(),
  status: z.enum(['pending', 'accepted', 'expired', 'revoked']),
  emailSent: z.boolean().optional(),
});
export type Invitation = z.infer<typeof invitation>;

export const invitationIdParams = z.object({ invitationId: z.uuid() });
