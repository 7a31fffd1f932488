import { z } from 'zod';
import { calendarDay } from '@shared/time/plausible';

/** What sits in or under a tank; the trade's own names for each kind. */
export const equipmentKinds = [
  'return-pump',
  'skimmer',
  'heater',
  'chiller',
  'lighting',
  'wavemaker',
  'dosing-pump',
  'reactor',
  'controller',
  'auto-top-off',
  'uv-steriliser',
  'filter',
  'probe',
  'power-board',
  'other',
] as const;
export const equipmentKind = z.enum(equipmentKinds);
export type EquipmentKind = z.infer<typeof equipmentKind>;

export const equipmentKindLabels: Readonly<Record<EquipmentKind, string>> = {
  'return-pump': 'Return pump',
  skimmer: 'Protein skimmer',
  heater: 'Heater',
  chiller: 'Chiller',
  lighting: 'Lighting',
  wavemaker: 'Wavemaker',
  'dosing-pump': 'Dosing pump',
  reactor: 'Reactor',
  controller: 'Controller',
  'auto-top-off': 'Auto top-off',
  'uv-steriliser': 'UV steriliser',
  filter: 'Filter',
  probe: 'Probe',
  'power-board': 'Power board',
  other: 'Other',
};

/** Kinds that draw mains power near water; the power-board map shows the electrical caution beside them. */
export const poweredKinds: readonly EquipmentKind[] = equipmentKinds.filter(
  (kind) => kind !== 'probe' && kind !== 'other' && kind !== 'filter',
);

export const equipmentIdParams = z.object({ tankId: z.uuid(), equipmentId: z.uuid() });

const isoDate = calendarDay;
/** Board and outlet as written on the labels under the cabinet: "B", "4", "Left strip". */
const label = z.string().trim().min(1).max(24);
const optional = <T extends z.ZodType>(schema: T) => schema.nullable().optional();

const equipmentFields = {
  kind: equipmentKind,
  description: z.string().trim().min(1, 'describe it, e.g. "Return pump in the sump"').max(200),
  installedOn: optional(isoDate),
  maintenanceIntervalDays: optional(z.int().min(1, 'at least 1 day').max(730, 'at most 730 days')),
  lastServicedOn: optional(isoDate),
  powerBoard: optional(label),
  outlet: optional(label),
  notes: optional(z.string().trim().max(2000)),
};

export interface EquipmentIssue {
  path: 'lastServicedOn' | 'powerBoard';
  message: string;
}

/** Rules across fields; the API checks them again on the merged row after a partial change. */
export function equipmentIssues(item: {
  installedOn?: string | null;
  lastServicedOn?: string | null;
  powerBoard?: string | null;
  outlet?: string | null;
}): EquipmentIssue[] {
  const issues: EquipmentIssue[] = [];
  if (item.installedOn && item.lastServicedOn && item.lastServicedOn < item.installedOn) {
    issues.push({ path: 'lastServicedOn', message: 'cannot be before it was installed' });
  }
  if (item.outlet && !item.powerBoard) {
    issues.push({ path: 'powerBoard', message: 'say which board the outlet is on' });
  }
  return issues;
}

export const equipmentInput = z.object(equipmentFields).superRefine((input, ctx) => {
  for (const issue of equipmentIssues(input)) {
    ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
  }
});
export type EquipmentInput = z.input<typeof equipmentInput>;

export const equipmentPatch = z.object(equipmentFields).partial();
export type EquipmentPatch = z.input<typeof equipmentPatch>;

export const equipmentItem = z.object({
  id: z.uuid(),
  tankId: z.uuid(),
  kind: equipmentKind,
  description: z.string(),
  installedOn: z.string().nullable(),
  maintenanceIntervalDays: z.int().nullable(),
  lastServicedOn: z.string().nullable(),
  /** Last serviced plus the interval; null when either is unknown. */
  maintenanceDueOn: z.string().nullable(),
  powerBoard: z.string().nullable(),
  outlet: z.string().nullable(),
  notes: z.string().nullable(),
});
export type EquipmentItem = z.infer<typeof equipmentItem>;

/** "2026-03-01" plus 30 days, in calendar days (no time zone can shift a date-only value). */
export function addDays(isoDay: string, days: number): string {
  const date = new Date(`${isoDay}T00:00:00Z`);
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

export function maintenanceDueOn(item: {
  lastServicedOn: string | null;
  maintenanceIntervalDays: number | null;
}) {
  return item.lastServicedOn && item.maintenanceIntervalDays
    ? addDays(item.lastServicedOn, item.maintenanceIntervalDays)
    : null;
}

/** Outlets in the order they sit on the board: "2" before "10", letters after numbers. */
export function compareOutlets(a: string | null, b: string | null): number {
  return (a ?? '').localeCompare(b ?? '', 'en', { numeric: true, sensitivity: 'base' });
}
