/*
 * A reading as a person enters it. The CSV import checks its rows with these in the browser, and
 * the API checks the same rows again, so the preview shows what the server would refuse.
 */
import { z } from 'zod';
import { parameterKey } from '@shared/parameters/keys';
import { pastInstant } from '@shared/time/plausible';
import { checkStoredValue, type UnitContext } from '@shared/parameters/units';
import { manualSource } from './sources';

export const measuredAt = pastInstant;
// EOS-80 validity, the range the specific-gravity conversion accepts.
export const instrumentTempC = z.number().min(-2).max(40);

interface EnteredReading extends UnitContext {
  readonly parameter: z.infer<typeof parameterKey>;
  readonly value: number;
  readonly unit: string;
}

/**
 * Checks that the unit suits the parameter and that the value converts to something a tank can
 * plausibly read, so a slip is reported against the field the person can fix.
 */
export function checkEntered(reading: EnteredReading, ctx: z.RefinementCtx): void {
  if (reading.unit === 'specific gravity') {
    for (const field of ['sampleTempC', 'referenceTempC'] as const) {
      if (reading[field] === undefined) {
        ctx.addIssue({
          code: 'custom',
          path: [field],
          message: 'a specific-gravity reading needs its sample and reference temperatures',
        });
      }
    }
    if (reading.sampleTempC === undefined || reading.referenceTempC === undefined) return;
  }
  const check = checkStoredValue(reading.parameter, reading.value, reading.unit, reading);
  if (!check.ok) ctx.addIssue({ code: 'custom', path: [check.field], message: check.message });
}

/** One imported CSV row: a manual reading that names its own source. */
export const importedReadingInput = z
  .object({
    parameter: parameterKey,
    value: z.number(),
    unit: z.string().max(40),
    measuredAt,
    source: manualSource,
    method: z.string().trim().min(1).max(80).optional(),
    note: z.string().trim().max(1000).optional(),
    sampleTempC: instrumentTempC.optional(),
    referenceTempC: instrumentTempC.optional(),
  })
  .superRefine(checkEntered);
export type ImportedReadingInput = z.infer<typeof importedReadingInput>;
