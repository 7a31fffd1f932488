import {
  checkEos80Salinity,
  checkEos80Temperature,
  pureWaterDensityIpts68,
  seawaterDensityIpts68,
} from './density';
import { checkNumber } from './range-check';
import type { TemperatureScaleOptions } from './temperature-scale';

/**
 * Specific gravity as hydrometers report it: density of the sample at its own
 * temperature over the density of pure water at the instrument's reference temperature, both from
 * EOS-80 (the pure-water term is the SMOW polynomial of the same equation).
 */
export function specificGravity(
  salinity: number,
  sampleTempC: number,
  referenceTempC: number = sampleTempC,
  opts?: TemperatureScaleOptions,
): number {
  const s = checkEos80Salinity('salinity', salinity);
  const sample68 = checkEos80Temperature('sampleTempC', sampleTempC, opts);
  const reference68 = checkEos80Temperature('referenceTempC', referenceTempC, opts);
  return seawaterDensityIpts68(s, sample68) / pureWaterDensityIpts68(reference68);
}

// Bounds shown in messages are rounded outward, so a value accepted by the message is accepted here.
const floor6 = (x: number): number => Math.floor(x * 1e6) / 1e6;
const ceil6 = (x: number): number => Math.ceil(x * 1e6) / 1e6;

/**
 * Density rises monotonically with salinity at every EOS-80 temperature (∂ρ/∂S ≈ 0.75–0.82), so
 * bisection over the validity range 0…42 converges without a starting guess; 1e-10 in salinity
 * is far inside the 1e-6 the callers need.
 */
export function salinityFromSpecificGravity(
  sg: number,
  sampleTempC: number,
  referenceTempC: number = sampleTempC,
  opts?: TemperatureScaleOptions,
): number {
  const sample68 = checkEos80Temperature('sampleTempC', sampleTempC, opts);
  const reference68 = checkEos80Temperature('referenceTempC', referenceTempC, opts);
  const referenceDensity = pureWaterDensityIpts68(reference68);
  checkNumber('sg', sg, {
    min: floor6(seawaterDensityIpts68(0, sample68) / referenceDensity),
    max: ceil6(seawaterDensityIpts68(42, sample68) / referenceDensity),
    basis: `EOS-80 salinity 0 to 42 at sample ${sampleTempC} °C, reference ${referenceTempC} °C`,
  });
  const targetDensity = sg * referenceDensity;
  let low = 0;
  let high = 42;
  while (high - low > 1e-10) {
    const middle = (low + high) / 2;
    if (seawaterDensityIpts68(middle, sample68) < targetDensity) low = middle;
    else high = middle;
  }
  return Math.min(42, Math.max(0, (low + high) / 2));
}
