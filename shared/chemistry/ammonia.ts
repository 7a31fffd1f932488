import { checkNumber } from './range-check';

/**
 * Share of total ammonia (NH3 + NH4+) present as un-ionised NH3, the form that harms fish.
 *
 * Fresh water: Emerson, Russo, Lund & Thurston (1975), J. Fish. Res. Board Can. 32:2379–2383,
 * pKa = 0.09018 + 2729.92 / T, with T = t + 273.15: that offset reproduces the published fraction
 * table calculated from their data (UF/IFAS EDIS FA16) to its last digit; t + 273 does not (see
 * the ammonia tests).
 * Their fit covers 0–50 °C (the range of the Bates & Pinching data they fitted — from memory).
 *
 * Seawater: Clegg & Whitfield (1995), Geochim. Cosmochim. Acta 59:2403–2421, their fitted pK*a(T, S)
 * (eq. 18; coefficients as reproduced in the published CO2SYS carbonate-system code): total
 * hydrogen-ion scale, molality basis, valid 0–40 salinity and −2…40 °C. We deliberately do not use
 * the Khoo, Culberson & Bates (1977) expression: Bell et al. (2007, Environ. Chem. 4:183;
 * corrigendum 2008, 5:258) showed it is wrong in its temperature and ionic-strength dependence and
 * can overstate NH3 by up to 500 %.
 */

const emersonTemperatureRange = { min: 0, max: 50, basis: 'Emerson et al. 1975 fit' } as const;
const cleggWhitfield = 'Clegg & Whitfield 1995 validity';
const seawaterTemperatureRange = { min: -2, max: 40, basis: cleggWhitfield } as const;
const salinityRange = { min: 0, max: 40, basis: cleggWhitfield } as const;

function freshwaterPka(tempC: number): number {
  return 0.09018 + 2729.92 / (tempC + 273.15);
}

/**
 * pK*a on the total scale in mol/kg-seawater. Clegg & Whitfield give K*a per kg of water; total-scale
 * pH is defined per kg of seawater, so K*a is multiplied by the mass of water per kg of seawater,
 * 1 − 0.001005·S (the usual molality conversion, e.g. DOE 1994 handbook — from memory).
 */
function seawaterPka(tempC: number, salinity: number): number {
  const t = tempC + 273.15;
  const rootT = Math.sqrt(t);
  const pKaMolal =
    9.244605 -
    2729.33 * (1 / 298.15 - 1 / t) +
    (0.04203362 - 11.24742 / t) * salinity ** 0.25 +
    (-13.6416 + 1.176949 * rootT - 0.02860785 * t + 545.4834 / t) * salinity ** 0.5 +
    (-0.1462507 + 0.0090226468 * rootT - 0.0001471361 * t + 10.5425 / t) * salinity ** 1.5 +
    (0.004669309 - 0.0001691742 * rootT - 0.5677934 / t) * salinity ** 2 +
    (-2.354039e-5 + 0.009698623 / t) * salinity ** 2.5;
  return pKaMolal - Math.log10(1 - 0.001005 * salinity);
}

/**
 * @param pH on the total scale when salinity > 0 (Clegg & Whitfield's K*a is total-scale); any
 *   ordinary pH reading in fresh water.
 * @returns mole fraction NH3 / (NH3 + NH4+), 0…1.
 */
export function unionizedAmmoniaFraction(pH: number, tempC: number, salinity = 0): number {
  checkNumber('pH', pH, { min: 0, max: 14, basis: 'aqueous pH scale' });
  checkNumber('salinity', salinity, salinityRange);
  const pKa =
    salinity === 0
      ? freshwaterPka(checkNumber('tempC', tempC, emersonTemperatureRange))
      : seawaterPka(checkNumber('tempC', tempC, seawaterTemperatureRange), salinity);
  return 1 / (1 + 10 ** (pKa - pH));
}

/**
 * The fraction is a mole fraction, so it applies to whatever basis the total is reported on:
 * total ammonia as N gives NH3 as N, total ammonia as NH3 gives NH3.
 */
export function unionizedAmmonia(totalAmmonia: number, pH: number, tempC: number, salinity = 0): number {
  checkNumber('totalAmmonia', totalAmmonia, { min: 0 });
  return totalAmmonia * unionizedAmmoniaFraction(pH, tempC, salinity);
}
