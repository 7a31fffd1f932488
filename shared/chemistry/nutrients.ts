import { molarMass } from './molar-mass';
import { checkNumber } from './range-check';

/**
 * Test kits report nitrate and phosphate either as the ion (NO3, PO4) or as its nitrogen or
 * phosphorus content (NO3-N, PO4-P). One mole of ion holds one atom of N or P, so the factor is
 * the ratio of molar masses (CIAAW 2021): 62.004 / 14.007 = 4.4266 and 94.970 / 30.974 = 3.0662.
 */
const no3PerN = molarMass.NO3 / molarMass.N;
const po4PerP = molarMass.PO4 / molarMass.P;

export function nitrateAsNO3FromN(n: number): number {
  return checkNumber('n', n, { min: 0 }) * no3PerN;
}

export function nitrateAsNFromNO3(no3: number): number {
  return checkNumber('no3', no3, { min: 0 }) / no3PerN;
}

export function phosphateAsPO4FromP(p: number): number {
  return checkNumber('p', p, { min: 0 }) * po4PerP;
}

export function phosphateAsPFromPO4(po4: number): number {
  return checkNumber('po4', po4, { min: 0 }) / po4PerP;
}
