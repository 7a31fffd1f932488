import type { z } from 'zod';
import type { parameterKey } from '@shared/parameters/keys';
import type { ReadingSource } from './sources';

/** A stored reading as the API shows it. */
export interface Reading {
  id: number;
  parameter: z.infer<typeof parameterKey>;
  /** In the parameter's stored unit. */
  value: number;
  enteredValue: number;
  enteredUnit: string;
  measuredAt: string;
  source: ReadingSource;
  /** The person who recorded it, or the device that sent it. */
  recordedBy: string | null;
  method: string | null;
  note: string | null;
  sampleTempC: number | null;
  referenceTempC: number | null;
}
