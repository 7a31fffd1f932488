import { checkNumber } from './range-check';
import { toIpts68, type TemperatureScaleOptions } from './temperature-scale';

/**
 * Practical Salinity Scale 1978 with the coefficients printed in Fofonoff & Millard (1983),
 * UNESCO Technical Papers in Marine Science 44, §2 (after Lewis 1980, IEEE J. Oceanic Eng. OE-5).
 * All temperatures inside this file are IPTS-68, as the equations were fitted on that scale.
 */

export interface PracticalSalinityOptions extends TemperatureScaleOptions {
  /**
   * Skip the temperature validity check (−2…35 °C). PSS-78 was fitted only in that range; UNESCO
   * Technical Paper 44 nevertheless prints its arithmetic check value at 40 °C, so this exists to
   * reproduce that check, not for readings.
   */
  readonly allowOutsideValidity?: boolean;
}

/** C(35, 15 °C, 0) of standard seawater, mS/cm (Culkin & Smith 1980, IEEE J. Oceanic Eng. OE-5:22). */
export const standardSeawaterConductivity = 42.914;

const pss78 = 'PSS-78 validity';
const salinityRange = { min: 2, max: 42, basis: pss78, roundingAllowance: 1e-9 } as const;
const temperatureRange = { min: -2, max: 35, basis: pss78 } as const;
const pressureRange = { min: 0, max: 10_000, basis: pss78 } as const;

// S = Σ a_i Rt^(i/2) + ΔS (UNESCO 44, eq. for SAL78); Σ a_i = 35 exactly, which makes R = 1 at 15 °C give 35.
const a = [0.008, -0.1692, 25.3851, 14.0941, -7.0261, 2.7081] as const;
// ΔS = (t − 15)/(1 + k(t − 15)) · Σ b_i Rt^(i/2); Σ b_i = 0 so ΔS vanishes at Rt = 1.
const b = [0.0005, -0.0056, -0.0066, -0.0375, 0.0636, -0.0144] as const;
const k = 0.0162;
// rt(t): conductivity ratio of standard seawater at temperature t to that at 15 °C.
const c = [0.6766097, 2.00564e-2, 1.104259e-4, -6.9698e-7, 1.0031e-9] as const;
// Rp(p, t, R): pressure correction of the conductivity ratio.
const d = [3.426e-2, 4.464e-4, 4.215e-1, -3.107e-3] as const;
const e = [2.07e-5, -6.37e-10, 3.989e-15] as const;

function polynomial(coefficients: readonly number[], x: number): number {
  return coefficients.reduceRight((sum, coefficient) => sum * x + coefficient, 0);
}

function standardSeawaterRatio(t68: number): number {
  return polynomial(c, t68);
}

function pressureRatio(conductivityRatio: number, t68: number, pressureDbar: number): number {
  const [d1, d2, d3, d4] = d;
  const numerator = pressureDbar * polynomial(e, pressureDbar);
  const denominator = 1 + d1 * t68 + d2 * t68 * t68 + (d3 + d4 * t68) * conductivityRatio;
  return 1 + numerator / denominator;
}

function salinityFromRt(rt: number, t68: number): number {
  const root = Math.sqrt(rt);
  const dt = t68 - 15;
  return polynomial(a, root) + (dt / (1 + k * dt)) * polynomial(b, root);
}

function checkTemperature(tempC: number, opts: PracticalSalinityOptions | undefined): number {
  checkNumber('tempC', tempC, opts?.allowOutsideValidity ? {} : temperatureRange);
  return toIpts68(tempC, opts);
}

export function practicalSalinity(
  conductivityRatio: number,
  tempC: number,
  pressureDbar = 0,
  opts?: PracticalSalinityOptions,
): number {
  checkNumber('conductivityRatio', conductivityRatio, { min: 0, minExclusive: true });
  checkNumber('pressureDbar', pressureDbar, pressureRange);
  const t68 = checkTemperature(tempC, opts);
  const rt =
    conductivityRatio / (pressureRatio(conductivityRatio, t68, pressureDbar) * standardSeawaterRatio(t68));
  const salinity = salinityFromRt(rt, t68);
  return checkNumber(
    `practical salinity from conductivityRatio ${conductivityRatio}`,
    salinity,
    salinityRange,
  );
}

export function salinityFromConductivity(
  mSPerCm: number,
  tempC: number,
  opts?: PracticalSalinityOptions,
): number {
  checkNumber('mSPerCm', mSPerCm, { min: 0, minExclusive: true });
  const ratio = mSPerCm / standardSeawaterConductivity;
  const t68 = checkTemperature(tempC, opts);
  const salinity = salinityFromRt(ratio / standardSeawaterRatio(t68), t68);
  return checkNumber(`practical salinity from mSPerCm ${mSPerCm}`, salinity, salinityRange);
}

/**
 * PSS-78 has no closed-form inverse. S(Rt) rises monotonically over the whole validity range
 * (Rt ≈ 0.06…1.2), so bisection on Rt is exact to rounding and cannot diverge as Newton can near
 * Rt → 0. The bracket [1e-4, 3] spans S ≈ 0.01…130 at every valid temperature.
 */
export function conductivityFromSalinity(
  salinity: number,
  tempC: number,
  opts?: PracticalSalinityOptions,
): number {
  checkNumber('salinity', salinity, salinityRange);
  const t68 = checkTemperature(tempC, opts);
  let low = 1e-4;
  let high = 3;
  while (high - low > 1e-14) {
    const middle = (low + high) / 2;
    if (salinityFromRt(middle, t68) < salinity) low = middle;
    else high = middle;
  }
  const rt = (low + high) / 2;
  return rt * standardSeawaterRatio(t68) * standardSeawaterConductivity;
}
