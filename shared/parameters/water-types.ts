import { z } from 'zod';

export const waterTypes = ['marine', 'fresh', 'brackish'] as const;
export const waterType = z.enum(waterTypes);
export type WaterType = z.infer<typeof waterType>;
