import { z } from 'zod';

export const health = z.object({
  status: z.enum(['ok', 'degraded']),
  db: z.enum(['ok', 'down']),
});
export type Health = z.infer<typeof health>;
