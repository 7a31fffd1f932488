import { isValidPhoneNumber } from 'libphonenumber-js';
import { z } from 'zod';
import { urgentCategories, type FirstAid } from '@shared/urgent/categories';
import { urgentStatuses } from '@shared/urgent/lifecycle';
import { instantWithin } from '@shared/time/plausible';

export const urgentCategory = z.enum(urgentCategories);
export const urgentStatus = z.enum(urgentStatuses);

export const urgentRequestIdParams = z.object({ requestId: z.uuid() });

/** Requests per tank per hour (rate limit, 429 beyond it). */
export const urgentRequestsPerTankHour = 5;
export const maxUrgentPhotos = 5;

/**
 * A phone number the technician can call: international form ("+44 20 7946 0958"), checked against
 * the numbering plans in libphonenumber-js.
 */
export const phoneNumber = z
  .string()
  .trim()
  .max(40)
  .refine((value) => /^(\+|00)/.test(value) && isValidPhoneNumber(value.replace(/^00/, '+')), {
    message: 'Enter a phone number with its country code, such as +44 20 7946 0958.',
  })
  .transform((value) => value.replace(/^00/, '+'));

export const urgentRequestInput = z.object({
  category: urgentCategory,
  /** The stopped item, when the category is equipment. */
  equipmentId: z.uuid().nullable().default(null),
  description: z.string().trim().min(1, 'Say what is happening.').max(4000),
  photoIds: z.array(z.uuid()).max(maxUrgentPhotos, `At most ${maxUrgentPhotos} photos.`).default([]),
  someoneOnSite: z.boolean(),
  /** How to get in: keys, codes, a neighbour, parking. */
  access: z.string().trim().max(1000).default(''),
  phone: phoneNumber,
  bestTime: z.string().trim().max(200).default(''),
  /** The call-out fee the owner saw before sending (cents); must match the company's current fee. */
  acceptedCallOutFeeCents: z.int().nonnegative().nullable().default(null),
});
export type UrgentRequestInput = z.input<typeof urgentRequestInput>;

const eta = instantWithin({ pastDays: 1, futureDays: 7 });

/** One move in the lifecycle; what each needs is checked here, whether the move is allowed, there. */
export const urgentMoveInput = z.discriminatedUnion('to', [
  z.object({ to: z.literal('acknowledged'), eta, note: z.string().trim().max(1000).default('') }),
  z.object({
    to: z.literal('assigned'),
    technicianId: z.uuid(),
    eta: eta.optional(),
    note: z.string().trim().max(1000).default(''),
  }),
  z.object({
    to: z.literal('on-the-way'),
    eta: eta.optional(),
    note: z.string().trim().max(1000).default(''),
  }),
  z.object({ to: z.literal('on-site'), note: z.string().trim().max(1000).default('') }),
  z.object({ to: z.literal('resolved'), note: z.string().trim().max(1000).default('') }),
  z.object({
    to: z.literal('declined'),
    reason: z.string().trim().min(1, 'Give the owner a reason.').max(1000),
    advice: z.string().trim().min(1, 'Tell the owner what to do instead.').max(2000),
  }),
]);
export type UrgentMoveInput = z.input<typeof urgentMoveInput>;

export const urgentEventTypes = [...urgentStatuses, 'escalated'] as const;
export const urgentEventType = z.enum(urgentEventTypes);

export const urgentEventView = z.object({
  id: z.uuid(),
  type: urgentEventType,
  at: z.iso.datetime(),
  actorName: z.string().nullable(),
  note: z.string(),
  eta: z.iso.datetime().nullable(),
});

/** What was true of the tank when the request was made (attached automatically). */
export const urgentSnapshot = z.object({
  readings: z.array(
    z.object({
      parameter: z.string(),
      label: z.string(),
      value: z.number(),
      unit: z.string(),
      at: z.iso.datetime(),
    }),
  ),
  openAlerts: z.array(
    z.object({ id: z.uuid(), title: z.string(), severity: z.string(), openedAt: z.iso.datetime() }),
  ),
});
export type UrgentSnapshot = z.infer<typeof urgentSnapshot>;

export const urgentRequestView = z.object({
  id: z.uuid(),
  tankId: z.uuid(),
  tankName: z.string(),
  timeZone: z.string(),
  category: urgentCategory,
  equipment: z.object({ id: z.uuid(), name: z.string(), outlet: z.string().nullable() }).nullable(),
  description: z.string(),
  photos: z.array(z.object({ id: z.uuid(), url: z.string(), thumbnailUrl: z.string() })),
  someoneOnSite: z.boolean(),
  access: z.string(),
  phone: z.string(),
  bestTime: z.string(),
  status: urgentStatus,
  eta: z.iso.datetime().nullable(),
  technician: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  requestedBy: z.object({ id: z.uuid().nullable(), name: z.string() }),
  declineReason: z.string().nullable(),
  advice: z.string().nullable(),
  /** The urgent visit planned for it; its report once published. */
  visitId: z.uuid().nullable(),
  callOutFeeCents: z.int().nullable(),
  currency: z.string(),
  snapshot: urgentSnapshot,
  /** Where it stands against the company's acknowledgement target. */
  ackTargetMinutes: z.int(),
  escalationLevel: z.int(),
  acknowledgedAt: z.iso.datetime().nullable(),
  closedAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
  events: z.array(urgentEventView),
});
export type UrgentRequestView = z.infer<typeof urgentRequestView>;

export const urgentBoardQuery = z.object({
  state: z.enum(['open', 'closed']).default('open'),
});

/** The company's urgent-visit settings (admins). First aid: null for a category keeps the default. */
const firstAidText = z.object({
  steps: z.array(z.string().trim().min(1).max(500)).min(1).max(12),
  cautions: z.array(z.string().trim().min(1).max(500)).max(12),
});
export const urgentSettingsInput = z.object({
  ackTargetMinutes: z
    .int()
    .min(5)
    .max(24 * 60),
  firstAid: z.partialRecord(urgentCategory, firstAidText.nullable()),
});
export type UrgentSettingsInput = z.infer<typeof urgentSettingsInput>;

export interface UrgentSettingsView {
  ackTargetMinutes: number;
  /** The call-out fee from the price list, in minor units, shown to the owner before sending; null for none. */
  callOutFeeCents: number | null;
  currency: string;
  /** The text owners see for each category: the company's own, or the default. */
  firstAid: Record<(typeof urgentCategories)[number], FirstAid & { custom: boolean }>;
}
