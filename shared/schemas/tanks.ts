import { z } from 'zod';

export const tankIdParams = z.object({ tankId: z.uuid() });

export const tankSummary = z.object({
  id: z.uuid(),
  name: z.string(),
  siteLabel: z.string().nullable(),
});
export type TankSummary = z.infer<typeof tankSummary>;
