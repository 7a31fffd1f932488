import { z } from 'zod';
import { parameterKey } from '@shared/parameters/keys';
import { manualReadingInput } from '@shared/schemas/readings';
import {
  dosingRefill,
  equipmentCheckState,
  itemUsed,
  livestockChange,
  nextVisitEntry,
  reportPhoto,
  visitReportContent,
  visitTask,
  waterChangeEntry,
  type VisitReportContent,
  type VisitReportInput,
} from '@shared/schemas/visits';
import { wallInstant, wallTimeOf } from '@shared/visits/recurrence';
import { blankAsUndefined, decimalDefault, decimalText } from '../../../lib/form-values';

/*
 * The report as the screen holds it: numbers and times as the text typed, in the tank's time zone.
 * `reportFormSchema(zone)` turns that into the shared report content the API checks again, so the
 * autosave sends exactly what the server would accept, and a slip shows against its field.
 */

const wall = z.string().regex(/^(\d{4}-\d\d-\d\dT\d\d:\d\d)?$/, 'use a date and time');

function instantIn(zone: string) {
  return z.string().transform((text, ctx) => {
    if (text.trim() === '') return null;
    const [day, time] = text.split('T');
    try {
      return wallInstant(day!, time!, zone).toISOString();
    } catch {
      ctx.addIssue({ code: 'custom', message: 'use a date and time' });
      return z.NEVER;
    }
  });
}

/** "2026-12-02T09:30" in the tank's zone, as a datetime-local field holds it. */
export function wallText(iso: string | null, zone: string): string {
  if (!iso) return '';
  const { day, time } = wallTimeOf(new Date(iso), zone);
  return `${day}T${time}`;
}

const optionalDecimal = <S extends z.ZodType>(schema: S) => decimalText(schema.optional());

/** The shared rule for a quantity used, saying in its words that a blank one is missing. */
export const quantityUsed = z
  .number({ error: (issue) => (issue.input === undefined ? 'enter a quantity' : undefined) })
  .pipe(itemUsed.shape.quantity);

export function reportFormSchema(zone: string) {
  const at = instantIn(zone);
  return z
    .object({
      arrivedAt: wall.pipe(at),
      departedAt: wall.pipe(at),
      tasksDone: z.array(visitTask),
      waterChange: z.object({
        percent: z.string(),
        litres: z.string(),
        newSalinityPpt: z.string(),
      }),
      dosingRefills: z.array(
        z.object({
          container: dosingRefill.shape.container,
          amountMl: decimalText(dosingRefill.shape.amountMl),
        }),
      ),
      equipmentChecks: z.array(
        z.object({
          equipmentId: z.string(),
          state: z.union([equipmentCheckState, z.literal('')]),
          note: z.string(),
        }),
      ),
      readings: z.array(
        z.object({
          parameter: parameterKey,
          value: decimalText(),
          unit: z.string(),
          measuredAt: z.string(),
        }),
      ),
      livestockChanges: z.array(livestockChange),
      photos: z.array(reportPhoto),
      notes: visitReportContent.shape.notes.unwrap(),
      closedItemIds: z.array(z.string()),
      nextItems: z.array(z.object({ text: z.string() })),
      nextVisit: z.object({ date: z.string(), startTime: z.string(), endTime: z.string() }),
      itemsUsed: z.array(
        z.object({
          priceItemId: itemUsed.shape.priceItemId,
          quantity: decimalText(quantityUsed),
        }),
      ),
    })
    .transform((form, ctx): VisitReportInput => {
      const percent = form.waterChange.percent.trim();
      const litres = form.waterChange.litres.trim();
      let waterChange: VisitReportInput['waterChange'] = null;
      if (percent !== '' || litres !== '') {
        const parsed = z
          .object({
            percent: decimalText(waterChangeEntry.shape.percent),
            litres: decimalText(waterChangeEntry.shape.litres),
            newSalinityPpt: optionalDecimal(z.number().min(0, 'at least 0 ppt').max(45, 'at most 45 ppt')),
          })
          .safeParse(form.waterChange);
        if (!parsed.success) {
          for (const issue of parsed.error.issues)
            ctx.addIssue({ code: 'custom', path: ['waterChange', ...issue.path], message: issue.message });
          return z.NEVER;
        }
        waterChange = { ...parsed.data, newSalinityPpt: parsed.data.newSalinityPpt ?? null };
      }
      const readings = form.readings.map((reading, index) => {
        const parsed = manualReadingInput.safeParse({
          parameter: reading.parameter,
          value: reading.value,
          unit: reading.unit,
          measuredAt: reading.measuredAt,
        });
        if (!parsed.success) {
          for (const issue of parsed.error.issues)
            ctx.addIssue({
              code: 'custom',
              path: ['readings', index, ...issue.path],
              message: issue.message,
            });
        }
        return parsed.success ? parsed.data : null;
      });
      const next = form.nextVisit;
      let nextVisit: VisitReportInput['nextVisit'] = null;
      if (next.date !== '') {
        const parsed = nextVisitEntry.safeParse(next);
        if (!parsed.success) {
          for (const issue of parsed.error.issues)
            ctx.addIssue({ code: 'custom', path: ['nextVisit', ...issue.path], message: issue.message });
        } else nextVisit = parsed.data;
      }
      return {
        arrivedAt: form.arrivedAt,
        departedAt: form.departedAt,
        tasksDone: form.tasksDone,
        waterChange,
        dosingRefills: form.dosingRefills,
        equipmentChecks: form.equipmentChecks.flatMap((check) =>
          check.state === ''
            ? []
            : [
                {
                  equipmentId: check.equipmentId,
                  state: check.state,
                  ...(check.note.trim() ? { note: check.note } : {}),
                },
              ],
        ),
        readings: readings.filter((r): r is NonNullable<typeof r> => r !== null),
        livestockChanges: form.livestockChanges,
        photos: form.photos,
        notes: form.notes,
        closedItemIds: form.closedItemIds,
        nextItems: form.nextItems.map((item) => item.text.trim()).filter((text) => text !== ''),
        nextVisit,
        itemsUsed: form.itemsUsed,
      };
    })
    .pipe(visitReportContent);
}

export type ReportFormValues = z.input<ReturnType<typeof reportFormSchema>>;

/** The screen's starting values from a stored report; every piece of tank equipment gets a row. */
export function formValuesOf(
  content: VisitReportContent,
  zone: string,
  equipmentIds: readonly string[],
): ReportFormValues {
  const checks = new Map(content.equipmentChecks.map((c) => [c.equipmentId, c]));
  const ids = [...new Set([...equipmentIds, ...checks.keys()])];
  return {
    arrivedAt: wallText(content.arrivedAt, zone),
    departedAt: wallText(content.departedAt, zone),
    tasksDone: content.tasksDone,
    waterChange: {
      percent: decimalDefault(content.waterChange?.percent),
      litres: decimalDefault(content.waterChange?.litres),
      newSalinityPpt: decimalDefault(content.waterChange?.newSalinityPpt),
    },
    dosingRefills: content.dosingRefills.map((r) => ({
      container: r.container,
      amountMl: decimalDefault(r.amountMl),
    })),
    equipmentChecks: ids.map((equipmentId) => ({
      equipmentId,
      state: checks.get(equipmentId)?.state ?? '',
      note: checks.get(equipmentId)?.note ?? '',
    })),
    readings: content.readings.map((r) => ({
      parameter: r.parameter,
      value: decimalDefault(r.value),
      unit: r.unit,
      measuredAt: r.measuredAt,
    })),
    livestockChanges: content.livestockChanges,
    photos: content.photos,
    notes: content.notes,
    closedItemIds: content.closedItemIds,
    nextItems: content.nextItems.map((text) => ({ text })),
    nextVisit: content.nextVisit ?? { date: '', startTime: '', endTime: '' },
    itemsUsed: content.itemsUsed.map((item) => ({
      priceItemId: item.priceItemId,
      quantity: decimalDefault(item.quantity),
    })),
  };
}

/**
 * A copy kept on this phone before the report had every part it has now (consumables and parts
 * came later) gets the missing parts empty, so it still opens and saves.
 */
export function keptFormValues(kept: ReportFormValues): ReportFormValues {
  const partial = kept as Partial<ReportFormValues> & Omit<ReportFormValues, 'itemsUsed'>;
  return { ...partial, itemsUsed: partial.itemsUsed ?? [] };
}

/** Where a server issue's path (`content.waterChange.litres`) lives on this form. */
export function reportFieldFor(path: string): string | null {
  return path.replace(/^content\./, '');
}

/** Litres from a percentage of the system volume and back, to one decimal place. */
export const litresFor = (percent: number, systemL: number) =>
  Math.round(((percent * systemL) / 100) * 10) / 10;
export const percentFor = (litres: number, systemL: number) => Math.round((litres / systemL) * 100 * 10) / 10;

export { blankAsUndefined };
