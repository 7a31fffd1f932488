import { z } from 'zod';
import { distinctList } from '@shared/lists/distinct';
import { tankStyle, type TankStyle } from '@shared/parameters/limit-templates';
import { livestockGroup, speciesId, type LivestockGroup } from '@shared/livestock/species';
import { equipmentKind, type EquipmentKind } from '@shared/schemas/equipment';
import { visitTask, type VisitTask } from '@shared/schemas/visits';
import { instantWithin } from '@shared/time/plausible';

/*
 * Care tips: advice a company sends to exactly the tanks it concerns. A tip is written as a draft,
 * then sent now or at a set time to its audience; each tank (and each of its owners) receives it at
 * most once; owners read it in their feed and may mark it helpful; staff may withdraw it.
 */

export const careTipIdParams = z.object({ tipId: z.uuid() });

export const tipCategories = ['maintenance', 'livestock', 'equipment', 'safety', 'seasonal'] as const;
export const tipCategory = z.enum(tipCategories);
export type TipCategory = z.infer<typeof tipCategory>;
export const tipCategoryLabels: Readonly<Record<TipCategory, string>> = {
  maintenance: 'Maintenance',
  livestock: 'Livestock',
  equipment: 'Equipment',
  safety: 'Safety',
  seasonal: 'Seasonal',
};

export const tipStatuses = ['draft', 'scheduled', 'sent', 'withdrawn'] as const;
export type TipStatus = (typeof tipStatuses)[number];

/** Who a tip is for: every tank of the company, or those of a style, keeping a species, with a kind of equipment, or chosen ones. */
export const tipAudience = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('all') }),
  z.object({ kind: z.literal('style'), style: tankStyle }),
  z.object({ kind: z.literal('species'), speciesId }),
  z.object({ kind: z.literal('equipment'), equipmentKind }),
  z.object({
    kind: z.literal('tanks'),
    tankIds: distinctList(z.uuid(), 500).refine((ids) => ids.length > 0, 'choose at least one tank'),
  }),
]);
export type TipAudience = z.infer<typeof tipAudience>;

/** When staff are offered the tip for one tap: an animal of a group added, or a visit task done. */
export const tipTrigger = z.discriminatedUnion('on', [
  z.object({ on: z.literal('livestock-added'), group: livestockGroup }),
  z.object({ on: z.literal('visit-task'), task: visitTask }),
]);
export type TipTrigger = z.infer<typeof tipTrigger>;

export const maxTipBodyLength = 20_000;

const careTipFields = z.object({
  title: z.string().trim().min(1, 'give the tip a title').max(160),
  /** Markdown, rendered by shared/text/markdown.ts. */
  body: z
    .string()
    .max(maxTipBodyLength, `at most ${maxTipBodyLength.toLocaleString('en')} characters`)
    .refine((body) => body.trim() !== '', 'write the tip'),
  category: tipCategory,
  photoId: z.uuid().nullable(),
  audience: tipAudience,
  suggestWhen: z.array(tipTrigger).max(10),
});

export const careTipInput = careTipFields.extend({
  photoId: careTipFields.shape.photoId.default(null),
  suggestWhen: careTipFields.shape.suggestWhen.default([]),
});
export type CareTipInput = z.input<typeof careTipInput>;

/** Built on the fields without their defaults, so a change leaves out what it does not name. */
export const careTipPatch = careTipFields.partial();

/** `at` absent or null: now. A time in the past is refused by the service against its clock. */
export const sendTipInput = z.object({ at: instantWithin({ futureDays: 366 }).nullable().default(null) });

export const sendToTankInput = z.object({ tankId: z.uuid() });

export const audienceCountInput = z.object({ audience: tipAudience });

/**
 * Where the next page of a feed starts: the last item's "<deliveredAt>_<tipId>_<tankId>", as
 * `tipFeedCursorOf` writes it. A page shorter than `limit` is the last one.
 */
const uuidText = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';
const feedCursorShape = new RegExp(
  `^(\\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\d(?:\\.\\d{1,6})?Z)_${uuidText}_${uuidText}$`,
);
export const tipFeedCursor = z
  .string()
  .max(120)
  .refine((cursor) => {
    const at = feedCursorShape.exec(cursor)?.[1];
    return at !== undefined && Number.isFinite(Date.parse(at));
  }, 'use the cursor the previous page gave');

export const tipFeedQuery = z.object({
  tankId: z.uuid().optional(),
  cursor: tipFeedCursor.optional(),
  limit: z.coerce.number().int().min(1).max(50).default(20),
});
export type TipFeedQuery = z.input<typeof tipFeedQuery>;

export const tipFeedCursorOf = (item: Pick<TipFeedItem, 'deliveredAt' | 'tipId' | 'tankId'>) =>
  `${item.deliveredAt}_${item.tipId}_${item.tankId}`;

export interface AudienceCount {
  tanks: number;
  owners: number;
}

export interface CareTip {
  id: string;
  title: string;
  body: string;
  category: TipCategory;
  photoId: string | null;
  audience: TipAudience;
  suggestWhen: TipTrigger[];
  status: TipStatus;
  sendAt: string | null;
  sentAt: string | null;
  withdrawnAt: string | null;
  createdBy: { id: string; name: string } | null;
  /** Tanks and owners it has reached so far. */
  reached: AudienceCount;
  helpfulCount: number;
  createdAt: string;
}

/** One tip as a tank's owner (or staff looking at that tank) reads it. */
export interface TipFeedItem {
  tipId: string;
  tankId: string;
  tankName: string;
  title: string;
  body: string;
  category: TipCategory;
  photoId: string | null;
  deliveredAt: string;
  /** Whether the reader marked it helpful. */
  helpful: boolean;
}

export interface TipReach {
  tanks: { id: string; name: string; deliveredAt: string }[];
  owners: { id: string; name: string; tankName: string; helpful: boolean }[];
}

export interface TipSuggestion {
  tip: Pick<CareTip, 'id' | 'title' | 'category'>;
  /** Why it is offered, in words ("An anemone was added"). */
  reason: string;
}

/** Words for a trigger, shown on the tip and with a suggestion. */
export function triggerWords(
  trigger: TipTrigger,
  labels: { group: (g: LivestockGroup) => string; task: (t: VisitTask) => string },
): string {
  return trigger.on === 'livestock-added'
    ? `when ${labels.group(trigger.group)} is added`
    : `when a visit records “${labels.task(trigger.task)}”`;
}

export type { EquipmentKind, TankStyle };
