import type { ParameterLimits } from './limits';
import type { ParameterKey } from './keys';
import { limitTemplates, type TankStyle } from './limit-templates';

/** A tank's own limit row for one parameter, as stored; any other columns are ignored. */
export interface OwnLimits extends ParameterLimits {
  readonly parameter: ParameterKey;
}

export interface ParameterLimitsInForce {
  readonly limits: ParameterLimits;
  /** 'tank' for the tank's own row, 'template' for its style's common-practice defaults. */
  readonly source: 'tank' | 'template';
}

/**
 * The limits that judge a tank's readings: per parameter, the tank's own row wins whole (its four
 * bounds, even when all are empty: that is how staff stop watching a parameter), else the
 * style's template; a parameter in neither has no limits and is left out. The SQL in
 * api/services/tank-health.ts follows the same rule and is tested against this one.
 */
export function limitsInForce(
  style: TankStyle,
  own: readonly OwnLimits[],
): Partial<Record<ParameterKey, ParameterLimitsInForce>> {
  const inForce: Partial<Record<ParameterKey, ParameterLimitsInForce>> = {};
  for (const [parameter, limits] of Object.entries(limitTemplates[style]))
    inForce[parameter as ParameterKey] = { limits, source: 'template' };
  for (const { parameter, warnLow, warnHigh, critLow, critHigh } of own)
    inForce[parameter] = { limits: { warnLow, warnHigh, critLow, critHigh }, source: 'tank' };
  return inForce;
}
