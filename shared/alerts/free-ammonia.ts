import { unionizedAmmonia, unionizedAmmoniaFraction } from '@shared/chemistry/index';
import { dayMs } from '@shared/parameters/catalogue';
import type { LimitSeverity } from '@shared/parameters/limits';

/**
 * Free (un-ionised) ammonia, mg/L NH3, above which an alert opens. Common practice, from memory:
 * long-term exposure above about 0.02 mg/L NH3 is widely treated as harmful to fish, and 0.05 as
 * needing action the same day.
 */
export const freeAmmoniaThresholds = { warning: 0.02, critical: 0.05 } as const;

/**
 * How long before an ammonia test a pH, temperature or salinity reading still counts for it: a
 * week, the pH's home-test interval (common practice: the three are tested together). An older
 * reading says little about the water the ammonia came from, so no free-ammonia verdict is drawn.
 */
export const freeAmmoniaCompanionMaxAgeMs = 7 * dayMs;

export interface FreeAmmoniaOutcome {
  /** On the same basis as the total (as NH3 for kits that report NH3/NH4+ as NH3). */
  readonly freeAmmonia: number;
  readonly fraction: number;
  readonly severity: LimitSeverity | null;
  readonly limit: number | null;
}

/**
 * @param pH on the total scale for salt water (see shared/chemistry/ammonia); hobby probes are calibrated
 *   with NBS buffers, which in seawater read roughly a tenth of a unit off the total scale (from
 *   memory), so the thresholds are rounded guidance, not fine lines.
 * @param salinity 0 for fresh water.
 */
export function evaluateFreeAmmonia(
  totalAmmonia: number,
  pH: number,
  tempC: number,
  salinity = 0,
): FreeAmmoniaOutcome {
  const freeAmmonia = unionizedAmmonia(totalAmmonia, pH, tempC, salinity);
  const fraction = unionizedAmmoniaFraction(pH, tempC, salinity);
  const { warning, critical } = freeAmmoniaThresholds;
  if (freeAmmonia > critical) return { freeAmmonia, fraction, severity: 'critical', limit: critical };
  if (freeAmmonia > warning) return { freeAmmonia, fraction, severity: 'warning', limit: warning };
  return { freeAmmonia, fraction, severity: null, limit: null };
}
