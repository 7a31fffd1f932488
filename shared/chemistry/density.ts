import { checkNumber } from './range-check';
import { toIpts68, type TemperatureScaleOptions } from './temperature-scale';

/**
 * EOS-80 one-atmosphere density of seawater (Millero & Poisson 1981, Deep-Sea Res. 28A:625–629),
 * with the coefficients and the SMOW pure-water polynomial as printed in Fofonoff & Millard (1983),
 * UNESCO Technical Papers in Marine Science 44. Evaluated on IPTS-68 temperatures.
 */

const eos80 = 'EOS-80 validity';
const salinityRange = { min: 0, max: 42, basis: eos80, roundingAllowance: 1e-9 } as const;
const temperatureRange = { min: -2, max: 40, basis: eos80 } as const;

// Density of Standard Mean Ocean Water, kg/m³, in powers of t68, as printed in UNESCO 44
// (attributed there to Bigg 1967 — from memory).
const smow = [999.842594, 6.793952e-2, -9.09529e-3, 1.001685e-4, -1.120083e-6, 6.536332e-9] as const;
// ρ(S, t, 0) = ρw + A·S + B·S^1.5 + C·S², A and B in powers of t68.
const saltA = [8.24493e-1, -4.0899e-3, 7.6438e-5, -8.2467e-7, 5.3875e-9] as const;
const saltB = [-5.72466e-3, 1.0227e-4, -1.6546e-6] as const;
const saltC = 4.8314e-4;

function polynomial(coefficients: readonly number[], x: number): number {
  return coefficients.reduceRight((sum, coefficient) => sum * x + coefficient, 0);
}

export function pureWaterDensityIpts68(t68: number): number {
  return polynomial(smow, t68);
}

export function seawaterDensityIpts68(salinity: number, t68: number): number {
  return (
    pureWaterDensityIpts68(t68) +
    polynomial(saltA, t68) * salinity +
    polynomial(saltB, t68) * salinity ** 1.5 +
    saltC * salinity * salinity
  );
}

/** Returns the salinity to evaluate: the rounding allowance below 0 is clamped, as S^1.5 needs S ≥ 0. */
export function checkEos80Salinity(name: string, salinity: number): number {
  return Math.max(0, checkNumber(name, salinity, salinityRange));
}

export function checkEos80Temperature(
  name: string,
  tempC: number,
  opts: TemperatureScaleOptions | undefined,
): number {
  checkNumber(name, tempC, temperatureRange);
  return toIpts68(tempC, opts);
}

export function seawaterDensity(salinity: number, tempC: number, opts?: TemperatureScaleOptions): number {
  const s = checkEos80Salinity('salinity', salinity);
  return seawaterDensityIpts68(s, checkEos80Temperature('tempC', tempC, opts));
}
