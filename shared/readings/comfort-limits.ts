import type { ParameterLimits } from '@shared/parameters/limits';

/**
 * "Use comfort range": the warning band becomes the range every inhabitant tolerates. Critical
 * bounds stay where the company put them unless the new band would cross them; then they move out
 * to the band's edge (that side goes straight to critical), so the limits stay valid.
 */
export function limitsFromComfort(
  current: ParameterLimits | null,
  comfort: { readonly min: number; readonly max: number },
): ParameterLimits {
  const critLow = current?.critLow ?? null;
  const critHigh = current?.critHigh ?? null;
  return {
    warnLow: comfort.min,
    warnHigh: comfort.max,
    critLow: critLow === null ? null : Math.min(critLow, comfort.min),
    critHigh: critHigh === null ? null : Math.max(critHigh, comfort.max),
  };
}
