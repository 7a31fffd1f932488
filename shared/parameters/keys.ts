import { z } from 'zod';

/** Every water parameter Brinewatch records, by its stored key. */
export const parameterKeys = [
  'temperature',
  'salinity',
  'ph',
  'alkalinity',
  'calcium',
  'magnesium',
  'nitrate',
  'phosphate',
  'ammonia',
  'nitrite',
  'orp',
  'gh',
  'kh',
] as const;

export const parameterKey = z.enum(parameterKeys);
export type ParameterKey = z.infer<typeof parameterKey>;
