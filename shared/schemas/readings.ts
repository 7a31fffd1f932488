import { z } from 'zod';
import { parameterKey } from '@shared/parameters/keys';
import type { ParameterLimits } from '@shared/parameters/limits';
import { allowedUnits, isEntryUnit, UnitNotAllowedError } from '@shared/parameters/units';
import type { ParameterHealth, TankStatus } from '@shared/parameters/health';
import { checkEntered, importedReadingInput, instrumentTempC, measuredAt } from '@shared/readings/entry';
import type { Reading } from '@shared/readings/reading';
import { instant } from '@shared/time/plausible';
import { manualSource, readingSource, type ReadingSource } from '@shared/readings/sources';

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

/** The earliest and latest a person's reading may be dated, relative to the server's clock. */
export const futureToleranceMs = 5 * 60_000;

export const createReadingsInput = manualReadingBatch.extend({
  /** Staff choose; owners record home tests, which is also their default. */
  source: manualSource.optional(),
});
export type CreateReadingsInput = z.infer<typeof createReadingsInput>;

/** A CSV import is one batch, all or nothing, so it is bounded like one. */
export const maxImportRows = 5000;

export const importReadingsInput = z.object({
  readings: z.array(importedReadingInput).min(1).max(maxImportRows),
});
export type ImportReadingsInput = z.infer<typeof importReadingsInput>;

/**
 * What the ingest route validates up front: only the envelope. Each reading is checked on its own
 * (`deviceReadingInput`), so one bad row is set aside instead of failing the batch.
 */
export const maxDeviceBatch = 1000;
export const deviceIngestEnvelope = z.object({ readings: z.array(z.unknown()).min(1) });

export const ingestRejectionReasons = [
  'invalid',
  'unknown-parameter',
  'unknown-unit',
  'future',
  'before-tank',
  'implausible',
] as const;
export type IngestRejectionReason = (typeof ingestRejectionReasons)[number];

export interface IngestResult {
  accepted: number;
  duplicate: number;
  rejected: { index: number; reason: IngestRejectionReason; message: string }[];
}

const isoInstant = instant;

export const readingHistoryQuery = z
  .object({
    parameter: parameterKey,
    from: isoInstant,
    to: isoInstant,
    points: z.coerce.number().int().min(10).max(2000).default(500),
  })
  .superRefine((query, ctx) => {
    const span = Date.parse(query.to) - Date.parse(query.from);
    if (!(span > 0)) ctx.addIssue({ code: 'custom', path: ['to'], message: 'to must be after from' });
    else if (span > 5 * 366 * 24 * 3_600_000) {
      ctx.addIssue({ code: 'custom', path: ['from'], message: 'a window covers at most five years' });
    }
  });
export type ReadingHistoryQuery = z.infer<typeof readingHistoryQuery>;

/**
 * "<measuredAt>_<id>" as `cursorOf` writes it: a real moment and an id the service reads as a
 * number, so no larger than 2^53 − 1 (well inside PostgreSQL's bigint).
 */
function isReadingCursor(cursor: string): boolean {
  const split = cursor.lastIndexOf('_');
  const at = cursor.slice(0, split);
  const id = Number(cursor.slice(split + 1));
  return Number.isFinite(Date.parse(at)) && Number.isSafeInteger(id);
}

export const readingListQuery = z.object({
  parameter: parameterKey.optional(),
  source: readingSource.optional(),
  from: isoInstant.optional(),
  to: isoInstant.optional(),
  /** The `next` cursor of the previous page. */
  before: z
    .string()
    .max(60)
    .regex(/^\d{4}-\d\d-\d\dT[\d:.]+Z_\d+$/, 'use the cursor the previous page gave')
    .refine(isReadingCursor, 'use the cursor the previous page gave')
    .optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
});
export type ReadingListQuery = z.infer<typeof readingListQuery>;

export const readingExportQuery = readingListQuery.omit({ before: true, limit: true });
export type ReadingExportQuery = z.infer<typeof readingExportQuery>;

export interface ReadingPage {
  readings: Reading[];
  next: string | null;
}

export interface ReadingBucket {
  /** Start of the bucket (its width is the answer's `bucketMs`). */
  start: string;
  min: number;
  mean: number;
  max: number;
  count: number;
  bySource: Record<ReadingSource, number>;
}

export interface LimitsInForce {
  limits: ParameterLimits | null;
  /** 'tank' for the tank's own limits, 'template' for the style's common-practice defaults. */
  source: 'tank' | 'template' | null;
}

/**
 * A window of history. With no more readings than `points` they come back as they are (`raw`);
 * otherwise as at most `points` buckets, and the visit and home-test readings still come one by one
 * so the chart can show who measured what.
 */
export interface ReadingHistory {
  parameter: z.infer<typeof parameterKey>;
  from: string;
  to: string;
  mode: 'raw' | 'buckets';
  bucketMs: number | null;
  total: number;
  buckets: ReadingBucket[];
  readings: Reading[];
  latest: Reading | null;
  /** The limits in force now; earlier limits are not kept. */
  limits: LimitsInForce;
}

/** One parameter of a tank at a glance: its latest reading judged against its limits. */
export interface ParameterHealthSummary {
  parameter: z.infer<typeof parameterKey>;
  health: ParameterHealth;
  /** The health in words ("pH 6.90 is below what the cardinal tetra tolerates (min 7)"). */
  reason: string;
  /**
   * Whether it counts towards the tank's status: it has a limit, or the livestock or an open alert
   * make a concern of it.
   */
  watched: boolean;
  latest: { value: number; measuredAt: string; source: ReadingSource } | null;
  limits: ParameterLimits | null;
  limitsSource: LimitsInForce['source'];
  /**
   * How long the latest reading counts as current (for a device, three of its usual intervals, at
   * least 30 minutes); null when it never goes stale.
   */
  expectedIntervalMs: number | null;
}

export interface TankHealthSummary {
  status: TankStatus;
  /** Why, in words; the same as the tank list and the tank page give. */
  statusReason: string;
  /** Watched parameters and any others with readings, in catalogue order. */
  parameters: ParameterHealthSummary[];
  lastReadingAt: string | null;
}

export interface DeviceSummary {
  id: string;
  name: string;
  /** The first characters of the token, to tell devices apart. */
  tokenHint: string;
  lastSeenAt: string | null;
  revokedAt: string | null;
  createdAt: string;
}

/** The answer to creating a device: the only time its token is ever shown. */
export interface CreatedDevice {
  device: DeviceSummary;
  token: string;
}

export const createDeviceInput = z.object({ name: z.string().trim().min(1, 'name the device').max(80) });
export type CreateDeviceInput = z.infer<typeof createDeviceInput>;

export const deviceParams = z.object({ tankId: z.uuid(), deviceId: z.uuid() });
