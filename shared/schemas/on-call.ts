import { z } from 'zod';
import { instantWithin } from '@shared/time/plausible';

/** Shifts are planned up to a year ahead and may be entered late, never decades off (common practice). */
const shiftInstant = instantWithin({ pastDays: 366, futureDays: 366 });
const maxShiftDays = 31;

export const onCallShiftInput = z
  .object({
    userId: z.uuid(),
    startsAt: shiftInstant,
    endsAt: shiftInstant,
  })
  .refine((shift) => new Date(shift.endsAt) > new Date(shift.startsAt), {
    message: 'The shift must end after it starts.',
    path: ['endsAt'],
  })
  .refine((shift) => Date.parse(shift.endsAt) - Date.parse(shift.startsAt) <= maxShiftDays * 86_400_000, {
    message: `A shift lasts at most ${maxShiftDays} days.`,
    path: ['endsAt'],
  });
export type OnCallShiftInput = z.infer<typeof onCallShiftInput>;

export const onCallShiftView = z.object({
  id: z.uuid(),
  user: z.object({ id: z.uuid(), name: z.string() }),
  startsAt: z.iso.datetime(),
  endsAt: z.iso.datetime(),
  current: z.boolean(),
});
export type OnCallShiftView = z.infer<typeof onCallShiftView>;

export const shiftIdParams = z.object({ shiftId: z.uuid() });

/** What a delivery tells of: exactly one per delivery (api/db/schema/alerts.ts deliveries). */
export const deliverySubjectKinds = ['alert', 'visit', 'tip', 'message', 'urgent'] as const;
export type DeliverySubjectKind = (typeof deliverySubjectKinds)[number];

export const deliveryView = z.object({
  id: z.uuid(),
  channel: z.enum(['push', 'email', 'in-app']),
  status: z.enum(['pending', 'sent', 'gone', 'failed']),
  attempts: z.number(),
  lastError: z.string().nullable(),
  recipient: z.string(),
  kind: z.enum(deliverySubjectKinds),
  /** A neutral line naming the subject; never a message's words (it may be an internal note). */
  about: z.string(),
  /** Null for a care tip, which may reach many tanks. */
  tankName: z.string().nullable(),
  /** Where the subject opens in the app. */
  link: z.string().startsWith('/'),
  createdAt: z.iso.datetime(),
});
export type DeliveryView = z.infer<typeof deliveryView>;
