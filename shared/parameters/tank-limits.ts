import { z } from 'zod';
import { isPlausible, parameterCatalogue } from './catalogue';
import { parameterKey, type ParameterKey } from './keys';
import { parameterLimits, type ParameterLimits } from './limits';

/** Limits for a tank, each bound inside what its parameter can plausibly read. */
export const tankLimits = z.partialRecord(parameterKey, parameterLimits).superRefine((byParameter, ctx) => {
  for (const [parameter, limits] of Object.entries(byParameter) as [ParameterKey, ParameterLimits][]) {
    const { label, bounds } = parameterCatalogue[parameter];
    for (const [field, value] of Object.entries(limits)) {
      if (value !== null && !isPlausible(parameter, value)) {
        ctx.addIssue({
          code: 'custom',
          path: [parameter, field],
          message: `${label} limits must lie between ${bounds.min} and ${bounds.max}`,
        });
      }
    }
  }
});
export type TankLimits = z.infer<typeof tankLimits>;
