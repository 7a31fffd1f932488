import { z } from 'zod';
import { parameterKey } from '@shared/parameters/keys';
import {
  allowedUnits,
  checkStoredValue,
  isEntryUnit,
  UnitNotAllowedError,
  type UnitContext,
} from '@shared/parameters/units';

export const readingSources = ['visit', 'home-test', 'device'] as const;
export const readingSource = z.enum(readingSources);
export type ReadingSource = z.infer<typeof readingSource>;

const measuredAt = z.iso.datetime({ offset: true });
// EOS-80 validity, the range the specific-gravity conversion accepts.
const instrumentTempC = z.number().min(-2).max(40);

interface EnteredReading extends UnitContext {
  readonly parameter: z.infer<typeof parameterKey>;
  readonly value: number;
  readonly unit: string;
}

/**
 * Checks that the unit suits the parameter and that the value converts to something a tank can
 * plausibly read, so a slip is reported against the field the person can fix.
 */
function checkEntered(reading: EnteredReading, ctx: z.RefinementCtx): void {
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

/** A reading entered by a person, at a visit or as a home test; the route decides which. */
export const manualReadingInput = z
  .object({
    parameter: parameterKey,
    value: z.number(),
    unit: z.string().max(40),
    measuredAt,
    method: z.string().trim().min(1).max(80).optional(),
    note: z.string().trim().max(1000).optional(),
    sampleTempC: instrumentTempC.optional(),
    referenceTempC: instrumentTempC.optional(),
  })
  .superRefine(checkEntered);
export type ManualReadingInput = z.infer<typeof manualReadingInput>;

export const manualReadingBatch = z.object({
  readings: z.array(manualReadingInput).min(1).max(50),
});
export type ManualReadingBatch = z.infer<typeof manualReadingBatch>;

/**
 * A device states no instrument temperatures, so it cannot send specific gravity. Plausibility is
 * deliberately not checked here: one faulty probe value must not make the whole batch fail (the
 * device would resend it forever); ingest sets such readings aside with `checkStoredValue`.
 */
export const deviceReadingInput = z
  .object({
    parameter: parameterKey,
    value: z.number(),
    unit: z.string().max(40),
    measuredAt,
  })
  .superRefine((reading, ctx) => {
    if (!isEntryUnit(reading.parameter, reading.unit)) {
      const { message } = new UnitNotAllowedError(
        reading.parameter,
        reading.unit,
        allowedUnits(reading.parameter),
      );
      ctx.addIssue({ code: 'custom', path: ['unit'], message });
    } else if (reading.unit === 'specific gravity') {
      ctx.addIssue({
        code: 'custom',
        path: ['unit'],
        message: 'devices send salinity as salinity or conductivity mS/cm, not specific gravity',
      });
    }
  });
export type DeviceReadingInput = z.infer<typeof deviceReadingInput>;

export const deviceReadingBatch = z.object({
  readings: z.array(deviceReadingInput).min(1).max(1000),
});
export type DeviceReadingBatch = z.infer<typeof deviceReadingBatch>;
