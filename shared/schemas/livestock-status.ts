import { z } from 'zod';

export const livestockStatuses = ['thriving', 'stable', 'watch', 'sick', 'removed', 'died'] as const;
export const livestockStatus = z.enum(livestockStatuses);
export type LivestockStatus = z.infer<typeof livestockStatus>;

/** Removed and dead livestock no longer shape the tank's comfort range or its warnings. */
export const presentStatuses: readonly LivestockStatus[] = ['thriving', 'stable', 'watch', 'sick'];
