import { z } from 'zod';
import { tankStatusSchema } from '@shared/parameters/health';
import { tankStyle, tankStyleWaterType } from '@shared/parameters/limit-templates';
import { cursorParam, encodeCursor } from '@shared/lists/cursor';
import { distinctList } from '@shared/lists/distinct';
import { waterType } from '@shared/parameters/water-types';
import { litresFrom, volumeUnits } from '@shared/tanks/volume';
import { calendarDay } from '@shared/time/plausible';
import { timeZone } from '@shared/time/time-zones';

export const tankIdParams = z.object({ tankId: z.uuid() });

export const volumeUnit = z.enum(volumeUnits);

/** The largest public aquaria hold millions of litres; a client's tank is far below this. */
export const maxTankVolumeL = 100_000;

/** A volume as the person entered it; the parsed value is in litres, the unit we store. */
export const volumeEntry = z
  .object({ value: z.number().min(0, 'a volume cannot be negative'), unit: volumeUnit })
  .transform(({ value, unit }) => litresFrom(value, unit))
  .refine((litres) => litres <= maxTankVolumeL, {
    message: `a tank holds at most ${maxTankVolumeL.toLocaleString('en')} litres here`,
  });

export const isoDate = calendarDay;

const centimetres = z.number().positive('must be above 0').max(2000, 'must be at most 2000 cm');
export const tankDimensions = z.object({
  lengthCm: centimetres,
  widthCm: centimetres,
  heightCm: centimetres,
});
export type TankDimensions = z.infer<typeof tankDimensions>;

const optionalText = (max: number) => z.string().trim().max(max).nullable().optional();

const tankFields = {
  name: z.string().trim().min(1, 'give the tank a name').max(120),
  siteLabel: optionalText(200),
  waterType: waterType.optional(),
  style: tankStyle,
  displayVolume: volumeEntry,
  sumpVolume: volumeEntry.optional(),
  dimensions: tankDimensions.nullable().optional(),
  setUpOn: isoDate.nullable().optional(),
  assignedTechnicianId: z.uuid().nullable().optional(),
  serviceIntervalDays: z.int().min(1, 'at least 1 day').max(365, 'at most 365 days'),
  ownerIds: distinctList(z.uuid(), 20).optional(),
  notes: optionalText(4000),
  /** Only when the tank is not in the company's time zone. */
  timeZone: timeZone.nullable().optional(),
};

/** The style decides the water; a water type sent beside it must agree. */
function styleSuitsWater(
  input: { style?: z.infer<typeof tankStyle>; waterType?: string },
  ctx: z.RefinementCtx,
) {
  if (input.style && input.waterType && tankStyleWaterType[input.style] !== input.waterType) {
    ctx.addIssue({
      code: 'custom',
      path: ['style'],
      message: `this style is for ${tankStyleWaterType[input.style]} water, not ${input.waterType}`,
    });
  }
}

export const createTankInput = z
  .object({ ...tankFields, serviceIntervalDays: tankFields.serviceIntervalDays.default(14) })
  .superRefine(styleSuitsWater);
export type CreateTankInput = z.input<typeof createTankInput>;

export const updateTankInput = z
  .object({ ...tankFields, coverPhotoId: z.uuid().nullable() })
  .partial()
  .superRefine(styleSuitsWater);
export type UpdateTankInput = z.input<typeof updateTankInput>;

export const tankListQuery = z.object({
  /** Matches the tank's name, its site or an owner's name. */
  q: z.string().trim().max(100).optional(),
  /** A staff member's id, or "none" for tanks nobody is assigned to. */
  technicianId: z.union([z.uuid(), z.literal('none')]).optional(),
});
export type TankListQuery = z.infer<typeof tankListQuery>;

export const personRef = z.object({ id: z.uuid(), name: z.string() });
export type PersonRef = z.infer<typeof personRef>;

export const photoRef = z.object({
  id: z.uuid(),
  url: z.string(),
  thumbnailUrl: z.string(),
  width: z.int(),
  height: z.int(),
  caption: z.string().nullable(),
});
export type PhotoRef = z.infer<typeof photoRef>;

export const tankSummary = z.object({
  id: z.uuid(),
  name: z.string(),
  siteLabel: z.string().nullable(),
  waterType,
  style: tankStyle,
  displayVolumeL: z.number(),
  sumpVolumeL: z.number(),
  serviceIntervalDays: z.int(),
  assignedTechnician: personRef.nullable(),
  owners: z.array(personRef),
  coverPhoto: photoRef.nullable(),
  status: tankStatusSchema,
  /** Why, in words: the same reason the tank page and its readings give (shared/tanks/status.ts). */
  statusReason: z.string(),
  /** When the last published visit began; null before the first. */
  lastVisitAt: z.iso.datetime().nullable(),
  /** Past its service interval since the last visit (shared/visits/overdue.ts). */
  visitOverdue: z.boolean(),
  /** The next planned visit, with the tank's zone its window is planned in. */
  nextVisit: z
    .object({ windowStart: z.iso.datetime(), windowEnd: z.iso.datetime(), timeZone: z.string() })
    .nullable(),
});
export type TankSummary = z.infer<typeof tankSummary>;

export const tankDetail = tankSummary.extend({
  dimensions: tankDimensions.nullable(),
  setUpOn: z.string().nullable(),
  notes: z.string().nullable(),
  /** The tank's own zone, when it overrides the company's. */
  timeZone: z.string().nullable(),
  /** The zone the tank's times are shown in: its own, else the company's. */
  effectiveTimeZone: z.string(),
  company: z.object({ id: z.uuid(), name: z.string() }),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
});
export type TankDetail = z.infer<typeof tankDetail>;

export const assignableStaff = z.object({
  id: z.uuid(),
  name: z.string(),
  role: z.enum(['technician', 'admin']),
});
export type AssignableStaff = z.infer<typeof assignableStaff>;

/** The staff overview's page size: a screenful on a desktop, a few swipes on a phone. */
export const tankOverviewPageSize = 50;

/** Where an overview page ends: the status rank, since when, and the tank (the sort order). */
export const tankOverviewPosition = z.object({
  rank: z.coerce.number().int().min(0).max(3),
  since: z.iso.datetime(),
  id: z.uuid(),
});
export type TankOverviewPosition = z.infer<typeof tankOverviewPosition>;

export const encodeTankOverviewCursor = (position: TankOverviewPosition) =>
  encodeCursor([position.rank, position.since, position.id]);

/** `status=alert,watch` or `status=alert&status=watch`; none means every status. */
const statusesParam = z
  .union([z.string().max(100), z.array(z.string().max(100)).max(4)])
  .transform((value) =>
    (Array.isArray(value) ? value : [value])
      .flatMap((part) => part.split(','))
      .map((part) => part.trim())
      .filter((part) => part !== ''),
  )
  .pipe(distinctList(tankStatusSchema, 4));

/**
 * The staff overview: worst status first, then the longest in it, 50 at a time; the filters are
 * the tank list's plus status and style.
 */
export const tankOverviewQuery = tankListQuery.extend({
  status: statusesParam.optional(),
  style: tankStyle.optional(),
  after: cursorParam(tankOverviewPosition).optional(),
});
export type TankOverviewQuery = z.output<typeof tankOverviewQuery>;

export const tankOverviewPage = z.object({
  tanks: z.array(tankSummary),
  /** The cursor for the next page (`after`), or null on the last. */
  next: z.string().nullable(),
  /** Tanks per status under the other filters, for the filter's labels. */
  counts: z.record(tankStatusSchema, z.int()),
});
export type TankOverviewPage = z.infer<typeof tankOverviewPage>;

/**
 * A tank as a picker or a label needs it: no health, photos or visits, so a company's every tank
 * fits in one light answer. The service interval stays for the plan-a-visit form's repeat hint.
 */
export const tankChoice = z.object({
  id: z.uuid(),
  name: z.string(),
  siteLabel: z.string().nullable(),
  serviceIntervalDays: z.int(),
  /** By name, as the tank list orders its owners. */
  ownerNames: z.array(z.string()),
});
export type TankChoice = z.infer<typeof tankChoice>;
