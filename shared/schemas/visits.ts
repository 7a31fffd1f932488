import { z } from 'zod';
import { distinctList } from '@shared/lists/distinct';
import { speciesId } from '@shared/livestock/species';
import { manualReadingInput } from '@shared/schemas/readings';
import { calendarDay, pastInstant } from '@shared/time/plausible';
import type { WaterType } from '@shared/parameters/water-types';
import {
  visitKindLabels,
  visitKinds,
  visitStatusLabels,
  visitStatuses,
  type VisitKind,
  type VisitStatus,
} from '@shared/visits/kinds';

/*
 * Service visits: the schedule and the report a technician writes at the tank. The report is one
 * document saved as it is typed (a draft with a version number) and published when the visit is
 * done; readings and livestock changes in it are applied to the tank when it is published.
 */

export const visitIdParams = z.object({ visitId: z.uuid() });

// The domain values live below the schemas; they are re-exported for the schemas' existing readers.
export { visitKindLabels, visitKinds, visitStatusLabels, visitStatuses, type VisitKind, type VisitStatus };
export const visitKind = z.enum(visitKinds);
export const visitStatus = z.enum(visitStatuses);

/** What a technician typically does on a service visit (common practice in the trade). */
export const visitTasks = [
  'water-test',
  'water-change',
  'skimmer-cup',
  'filter-media',
  'glass',
  'dosing-refill',
  'equipment-check',
  'livestock',
  'aquascape',
  'cables',
] as const;
export const visitTask = z.enum(visitTasks);
export type VisitTask = z.infer<typeof visitTask>;

export const visitTaskLabels: Readonly<Record<VisitTask, string>> = {
  'water-test': 'Tested the water',
  'water-change': 'Water change',
  'skimmer-cup': 'Emptied and cleaned the skimmer cup',
  'filter-media': 'Changed filter socks, floss or media',
  glass: 'Cleaned the glass',
  'dosing-refill': 'Refilled dosing containers',
  'equipment-check': 'Checked the equipment',
  livestock: 'Added, moved or removed livestock',
  aquascape: 'Rockwork and aquascape',
  cables: 'Tidied and labelled cables and power boards',
};

export const equipmentCheckStates = ['ok', 'needs-attention', 'replaced'] as const;
export const equipmentCheckState = z.enum(equipmentCheckStates);
export type EquipmentCheckState = z.infer<typeof equipmentCheckState>;
export const equipmentCheckStateLabels: Readonly<Record<EquipmentCheckState, string>> = {
  ok: 'OK',
  'needs-attention': 'Needs attention',
  replaced: 'Replaced',
};

export const photoPhases = ['before', 'after'] as const;
export const photoPhase = z.enum(photoPhases);
export type PhotoPhase = z.infer<typeof photoPhase>;

const note = (max: number) => z.string().trim().max(max);

/**
 * A water change as entered: the percentage and the litres travel together (the screen computes
 * each from the other with the tank's display + sump volume); the service checks that the litres
 * fit in the system.
 */
export const waterChangeEntry = z.object({
  percent: z.number().gt(0, 'a water change is more than 0 %').max(100, 'at most 100 %'),
  litres: z.number().gt(0, 'a water change is more than 0 litres').max(100_000),
  /** Salinity of the new water, in ppt (practical salinity), when it is saltwater. */
  newSalinityPpt: z.number().min(0, 'at least 0 ppt').max(45, 'at most 45 ppt').nullable().optional(),
});
export type WaterChangeEntry = z.infer<typeof waterChangeEntry>;

export const dosingRefill = z.object({
  container: z.string().trim().min(1, 'say which container').max(120),
  amountMl: z.number().gt(0, 'more than 0 ml').max(100_000, 'at most 100 litres'),
});

export const equipmentCheck = z.object({
  equipmentId: z.uuid(),
  state: equipmentCheckState,
  note: note(500).optional(),
});

export const livestockChange = z.discriminatedUnion('action', [
  z.object({
    action: z.literal('add'),
    speciesId,
    quantity: z.int().min(1, 'at least 1').max(1000),
    nickname: note(80).optional(),
    placement: note(120).optional(),
    /** The compatibility warnings were read and accepted; without it a warning refuses publishing. */
    acknowledgeWarnings: z.boolean().optional(),
  }),
  z.object({ action: z.literal('remove'), livestockId: z.uuid(), note: note(500).optional() }),
  z.object({ action: z.literal('move'), livestockId: z.uuid(), placement: note(120).min(1, 'say where to') }),
]);
export type LivestockChange = z.infer<typeof livestockChange>;

export const reportPhoto = z.object({ photoId: z.uuid(), phase: photoPhase });

/** "HH:MM" on a 24-hour clock. */
export const wallTime = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'use a time as HH:MM');

export const nextVisitEntry = z
  .object({ date: calendarDay, startTime: wallTime, endTime: wallTime })
  .refine((v) => v.endTime > v.startTime, { path: ['endTime'], message: 'ends after it starts' });
export type NextVisitEntry = z.infer<typeof nextVisitEntry>;

/** Hundredths are the finest quantity a line can bill (shared/billing/money.ts). */
const inHundredths = (value: number) => Math.abs(value * 100 - Math.round(value * 100)) < 1e-6;

export const itemUsed = z.object({
  priceItemId: z.uuid(),
  quantity: z
    .number()
    .gt(0, 'more than 0')
    .max(10_000, 'at most 10,000')
    .refine(inHundredths, 'at most two decimals'),
});
export type ItemUsed = z.infer<typeof itemUsed>;

export const maxNotesLength = 20_000;

export const visitReportContent = z
  .object({
    arrivedAt: pastInstant.nullable().default(null),
    departedAt: pastInstant.nullable().default(null),
    tasksDone: distinctList(visitTask, visitTasks.length * 2).default([]),
    waterChange: waterChangeEntry.nullable().default(null),
    dosingRefills: z.array(dosingRefill).max(20).default([]),
    equipmentChecks: z.array(equipmentCheck).max(100).default([]),
    readings: z.array(manualReadingInput).max(50).default([]),
    livestockChanges: z.array(livestockChange).max(50).default([]),
    photos: z.array(reportPhoto).max(30).default([]),
    /** Markdown. */
    notes: z
      .string()
      .max(maxNotesLength, `at most ${maxNotesLength.toLocaleString('en')} characters`)
      .default(''),
    /** Items carried from earlier visits that this visit ticked off. */
    closedItemIds: distinctList(z.uuid(), 100).default([]),
    /** Things to do next time; they appear on the next report's checklist until ticked off. */
    nextItems: z.array(z.string().trim().min(1, 'say what to do').max(300)).max(20).default([]),
    nextVisit: nextVisitEntry.nullable().default(null),
    /** Consumables used and parts fitted, from the company's price list; the invoice is drafted from them. */
    itemsUsed: z.array(itemUsed).max(30).default([]),
  })
  .superRefine((report, ctx) => {
    if (
      report.arrivedAt &&
      report.departedAt &&
      Date.parse(report.departedAt) < Date.parse(report.arrivedAt)
    ) {
      ctx.addIssue({ code: 'custom', path: ['departedAt'], message: 'departure is before arrival' });
    }
    const seen = new Set<string>();
    report.equipmentChecks.forEach((check, index) => {
      if (seen.has(check.equipmentId)) {
        ctx.addIssue({
          code: 'custom',
          path: ['equipmentChecks', index, 'equipmentId'],
          message: 'listed twice',
        });
      }
      seen.add(check.equipmentId);
    });
  });
export type VisitReportContent = z.output<typeof visitReportContent>;
export type VisitReportInput = z.input<typeof visitReportContent>;

export const emptyReport: VisitReportContent = visitReportContent.parse({});

export const saveReportInput = z.object({
  /** The version this edit started from; a stale one is a 409 with the stored report. */
  version: z.int().min(0),
  content: visitReportContent,
});
export type SaveReportInput = z.input<typeof saveReportInput>;

export const publishReportInput = z.object({ version: z.int().min(0) });

export const scheduleVisitInput = z
  .object({
    tankId: z.uuid(),
    kind: visitKind,
    technicianId: z.uuid().nullable().optional(),
    date: calendarDay,
    startTime: wallTime,
    endTime: wallTime,
    /** Routine service only: repeat at the tank's service interval. */
    repeats: z.boolean().default(false),
    note: note(1000).optional(),
  })
  .refine((v) => v.endTime > v.startTime, { path: ['endTime'], message: 'ends after it starts' })
  .refine((v) => !v.repeats || v.kind === 'routine', {
    path: ['repeats'],
    message: 'only routine service repeats',
  });
export type ScheduleVisitInput = z.input<typeof scheduleVisitInput>;

export const updateVisitInput = z
  .object({
    kind: visitKind.optional(),
    technicianId: z.uuid().nullable().optional(),
    date: calendarDay.optional(),
    startTime: wallTime.optional(),
    endTime: wallTime.optional(),
    cancelled: z.boolean().optional(),
    note: note(1000).nullable().optional(),
  })
  .refine(
    (v) =>
      (v.date === undefined) === (v.startTime === undefined) &&
      (v.date === undefined) === (v.endTime === undefined),
    {
      path: ['date'],
      message: 'a new time needs the date, start and end together',
    },
  )
  .refine((v) => !v.startTime || !v.endTime || v.endTime > v.startTime, {
    path: ['endTime'],
    message: 'ends after it starts',
  });
export type UpdateVisitInput = z.input<typeof updateVisitInput>;

export const scheduleQuery = z.object({
  from: calendarDay,
  to: calendarDay,
  /** "me" for the signed-in technician's own visits; admins may name anyone. */
  technicianId: z.union([z.literal('me'), z.uuid()]).optional(),
  tankId: z.uuid().optional(),
});
export type ScheduleQuery = z.infer<typeof scheduleQuery>;

export interface PersonRef {
  id: string;
  name: string;
}

export interface VisitSummary {
  id: string;
  tankId: string;
  tankName: string;
  siteLabel: string | null;
  /** The tank's time zone, which the window's wall times are in. */
  timeZone: string;
  kind: VisitKind;
  status: VisitStatus;
  technician: PersonRef | null;
  windowStart: string;
  windowEnd: string;
  repeats: boolean;
  note: string | null;
  publishedAt: string | null;
  editedAt: string | null;
}

export interface CarriedItem {
  id: string;
  text: string;
  fromVisitId: string;
  openedAt: string;
  closedInVisitId: string | null;
  closedAt: string | null;
}

export interface VisitDetail extends VisitSummary {
  /** The working copy (staff only; owners get null). */
  draft: VisitReportContent | null;
  version: number;
  /** What owners read; null until published. */
  published: VisitReportContent | null;
  publishedBy: PersonRef | null;
  /** Items open on the tank when this report was started, to tick off. */
  carriedItems: CarriedItem[];
  /** The system volume the water change is judged against (display + sump), litres. */
  systemVolumeL: number;
  waterType: WaterType;
  earlierVersions: { version: number; publishedAt: string }[];
  /** Names of the price-list items the report's consumables and parts name (owners cannot read the price list). */
  usedItems: { id: string; name: string; unit: string }[];
}

export interface ReportConflict {
  current: VisitDetail;
}

export interface TankVisits {
  next: VisitSummary | null;
  /** Published reports, newest first; staff also see drafts and the schedule. */
  visits: VisitSummary[];
  lastVisitAt: string | null;
  openItems: CarriedItem[];
}
