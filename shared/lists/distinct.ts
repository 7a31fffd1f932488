import { z } from 'zod';

/**
 * A list where order matters and repeats mean nothing (severities, owners, prey groups): refused
 * above `max` entries, repeats dropped, so a body of ten thousand copies never reaches a row.
 */
export function distinctList<T extends z.ZodType>(item: T, max: number) {
  return z
    .array(item)
    .max(max, `list at most ${max}`)
    .transform((values) => [...new Set(values)]);
}
