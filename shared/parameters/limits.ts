import { z } from 'zod';

export const limitSeverities = ['warning', 'critical'] as const;
export const limitSeverity = z.enum(limitSeverities);
export type LimitSeverity = z.infer<typeof limitSeverity>;

export const limitDirections = ['low', 'high'] as const;
export const limitDirection = z.enum(limitDirections);
export type LimitDirection = z.infer<typeof limitDirection>;

const bound = z.number().nullable();

/**
 * A parameter's limits in its stored unit. Any bound may be null (no limit on that side). A
 * reading exactly on a bound is inside it; the critical band lies outside the warning band, and a
 * critical bound equal to its warning bound means that side goes straight to critical.
 */
export const parameterLimits = z
  .object({ warnLow: bound, warnHigh: bound, critLow: bound, critHigh: bound })
  .superRefine((limits, ctx) => {
    const { warnLow, warnHigh, critLow, critHigh } = limits;
    const below = (
      lower: number | null,
      upper: number | null,
      strict: boolean,
      path: keyof typeof limits,
      message: string,
    ): void => {
      if (lower === null || upper === null) return;
      if (strict ? lower < upper : lower <= upper) return;
      ctx.addIssue({ code: 'custom', path: [path], message });
    };
    below(critLow, warnLow, false, 'critLow', 'critLow must be at or below warnLow');
    below(warnHigh, critHigh, false, 'critHigh', 'critHigh must be at or above warnHigh');
    below(warnLow, warnHigh, true, 'warnHigh', 'warnHigh must be above warnLow');
    // A side without a warning bound still must not cross the other side.
    below(critLow, warnHigh, true, 'warnHigh', 'warnHigh must be above critLow');
    below(warnLow, critHigh, true, 'critHigh', 'critHigh must be above warnLow');
    below(critLow, critHigh, true, 'critHigh', 'critHigh must be above critLow');
  });
export type ParameterLimits = z.infer<typeof parameterLimits>;

/**
 * Largest change allowed within `perMs`; adjustable per tank. Changes over a longer gap are
 * averaged back to `perMs` (see `evaluateRate`).
 */
export const rateRule = z.object({
  maxChange: z.number().positive(),
  perMs: z.int().positive(),
});
export type RateRule = z.infer<typeof rateRule>;
