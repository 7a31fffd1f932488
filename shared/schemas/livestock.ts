import { z } from 'zod';
import { calendarDay, pastInstant } from '@shared/time/plausible';
import { livestockStatus, presentStatuses, type LivestockStatus } from '@shared/schemas/livestock-status';
import { compatibilityWarning } from '@shared/livestock/compatibility';
import { livestockGroup, species, speciesId } from '@shared/livestock/species';
import { waterType } from '@shared/parameters/water-types';
import { personRef, photoRef } from '@shared/schemas/tanks';

export const livestockIdParams = z.object({ tankId: z.uuid(), livestockId: z.uuid() });

/** A company's own species carries this prefix before its row id, so one id names either kind. */
export const companySpeciesPrefix = 'company-';

export const speciesSources = ['catalogue', 'company'] as const;

export const speciesEntry = species.extend({ source: z.enum(speciesSources) });
export type SpeciesEntry = z.infer<typeof speciesEntry>;

export const speciesQuery = z.object({
  q: z.string().trim().max(100).optional(),
  waterType: waterType.optional(),
  group: livestockGroup.optional(),
  limit: z.coerce.number().int().min(1).max(300).default(300),
});
export type SpeciesQuery = z.infer<typeof speciesQuery>;

export const speciesIdParams = z.object({ speciesId });

const isoDate = calendarDay;
const optionalText = (max: number) => z.string().trim().max(max).nullable().optional();

const presentStatus = livestockStatus.refine((status) => presentStatuses.includes(status), {
  message: 'livestock is added as thriving, stable, watch or sick',
});

export const addLivestockInput = z.object({
  speciesId,
  nickname: optionalText(80),
  quantity: z.int().min(1, 'at least 1').max(1000, 'at most 1000').default(1),
  addedOn: isoDate.nullable().optional(),
  /** Where it came from: "aquacultured frag", "moved from the office tank". */
  source: optionalText(120),
  /** Where it sits: "left rock, mid height". */
  placement: optionalText(120),
  status: presentStatus.default('stable'),
  note: optionalText(500),
  /** The person has seen the compatibility warnings and adds it anyway. */
  acknowledgeWarnings: z.boolean().default(false),
});
export type AddLivestockInput = z.input<typeof addLivestockInput>;

export const addLivestockQuery = z.object({
  /** "true": only check compatibility and answer with the warnings; nothing is saved. */
  dryRun: z
    .enum(['true', 'false'])
    .default('false')
    .transform((value) => value === 'true'),
});

export const updateLivestockInput = z
  .object({
    nickname: optionalText(80),
    quantity: z.int().min(1, 'at least 1').max(1000, 'at most 1000'),
    addedOn: isoDate.nullable(),
    source: optionalText(120),
    placement: optionalText(120),
    status: livestockStatus,
    /** Why the status changed; kept in the history with who and when. */
    statusNote: optionalText(500),
    /** When the change was seen, if not now (a technician writing up a visit later). */
    statusChangedAt: pastInstant,
  })
  .partial()
  .refine((input) => input.status !== undefined || (!input.statusNote && !input.statusChangedAt), {
    message: 'a note or time for the history needs a status',
    path: ['status'],
  });
export type UpdateLivestockInput = z.input<typeof updateLivestockInput>;

export const statusEvent = z.object({
  id: z.uuid(),
  status: livestockStatus,
  note: z.string().nullable(),
  changedAt: z.iso.datetime(),
  changedBy: personRef.nullable(),
});
export type StatusEvent = z.infer<typeof statusEvent>;

export const livestockItem = z.object({
  id: z.uuid(),
  tankId: z.uuid(),
  species: speciesEntry,
  nickname: z.string().nullable(),
  quantity: z.int(),
  addedOn: z.string().nullable(),
  source: z.string().nullable(),
  placement: z.string().nullable(),
  status: livestockStatus,
  /** Newest first. */
  history: z.array(statusEvent),
  photos: z.array(photoRef),
});
export type LivestockItem = z.infer<typeof livestockItem>;

export const compatibilityCheck = z.object({
  species: speciesEntry,
  warnings: z.array(compatibilityWarning),
});
export type CompatibilityCheck = z.infer<typeof compatibilityCheck>;

export const livestockStatusLabels: Readonly<Record<LivestockStatus, string>> = {
  thriving: 'Thriving',
  stable: 'Stable',
  watch: 'Keep an eye on',
  sick: 'Sick',
  removed: 'Removed',
  died: 'Died',
};
