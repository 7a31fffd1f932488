import { z } from 'zod';
import { hourMs, isPlausible, parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKey, type ParameterKey } from '@shared/parameters/keys';
import { parameterLimits, type ParameterLimits, type RateRule } from '@shared/parameters/limits';

/**
 * A rate rule as staff set it for one tank: alert when the value changes by more than `maxChange`
 * (stored unit) within `perHours`, from a quarter of an hour (any shorter and probe noise looks
 * like a climb) to a week.
 */
export const tankRateRule = z.object({
  maxChange: z.number().positive('the change must be more than 0'),
  perHours: z
    .number()
    .min(0.25, 'the period must be at least 0.25 hours (15 minutes)')
    .max(168, 'the period must be at most 168 hours (a week)'),
});
export type TankRateRule = z.infer<typeof tankRateRule>;

export const rateRuleFromHours = ({ maxChange, perHours }: TankRateRule): RateRule => ({
  maxChange,
  perMs: Math.round(perHours * hourMs),
});

export const rateRuleInHours = ({ maxChange, perMs }: RateRule): TankRateRule => ({
  maxChange,
  perHours: perMs / hourMs,
});

/**
 * Changes to a tank's limits, per parameter: new limits (all four bounds null = not watched), or
 * null to drop the tank's own limits and fall back to its style's template. `rates` sets the
 * tank's own rate rule, or null for the catalogue default. A parameter left out is unchanged.
 */
export const updateLimitsInput = z
  .object({
    limits: z.partialRecord(parameterKey, parameterLimits.nullable()).optional(),
    rates: z.partialRecord(parameterKey, tankRateRule.nullable()).optional(),
  })
  .superRefine(({ limits = {}, rates = {} }, ctx) => {
    for (const [parameter, bounds] of Object.entries(limits) as [ParameterKey, ParameterLimits | null][]) {
      if (bounds === null) continue;
      const { label, bounds: plausible } = parameterCatalogue[parameter];
      for (const [field, value] of Object.entries(bounds)) {
        if (value !== null && !isPlausible(parameter, value)) {
          ctx.addIssue({
            code: 'custom',
            path: ['limits', parameter, field],
            message: `${label} limits must lie between ${plausible.min} and ${plausible.max}`,
          });
        }
      }
    }
    for (const [parameter, rule] of Object.entries(rates) as [ParameterKey, TankRateRule | null][]) {
      if (rule === null) continue;
      const { label, bounds: plausible, symbol } = parameterCatalogue[parameter];
      // A change wider than anything the parameter can read would never alert: a typing slip.
      const span = plausible.max - plausible.min;
      if (rule.maxChange > span) {
        ctx.addIssue({
          code: 'custom',
          path: ['rates', parameter, 'maxChange'],
          message: `${label} cannot change by more than ${span}${symbol ? ` ${symbol}` : ''}`,
        });
      }
    }
  });
export type UpdateLimitsInput = z.infer<typeof updateLimitsInput>;

export interface ComfortBandView {
  min: number;
  max: number;
  /** Common names of the inhabitants that set each end. */
  limitedBy: { low: string[]; high: string[] };
}

export interface ParameterLimitsView {
  parameter: ParameterKey;
  /** What is in force: the tank's own limits, else the template's, else none. */
  limits: ParameterLimits | null;
  source: 'tank' | 'template' | null;
  /** The style's common-practice default, shown beside the tank's own. */
  template: ParameterLimits | null;
  comfort: ComfortBandView | null;
  /** When the inhabitants' ranges leave no common ground. */
  comfortConflict: string | null;
  /** The tank's own rate rule; null when the default applies. */
  rate: TankRateRule | null;
  /** The catalogue's common-practice rate rule; null where the parameter has none. */
  defaultRate: TankRateRule | null;
  updatedAt: string | null;
}

export interface TankLimitsView {
  style: string;
  /** Where the defaults come from (common practice, not a standard). */
  templateSource: string;
  /** Where the care ranges behind the comfort range come from. */
  comfortSource: string;
  /** How many present inhabitants the comfort range is drawn from. */
  inhabitants: number;
  parameters: ParameterLimitsView[];
}
