import { molarMass } from './molar-mass';
import { checkNumber, checkOneOf } from './range-check';

export type AlkalinityUnit = 'dKH' | 'meq/L' | 'mg/L CaCO3';

export const alkalinityUnits: readonly AlkalinityUnit[] = ['dKH', 'meq/L', 'mg/L CaCO3'];

/**
 * Everything is converted through meq/L.
 * - German degree: 1 °dKH = 10 mg/L CaO; CaO carries 2 equivalents per mole, so
 *   1 °dKH = 2 · 10 / 56.077 = 0.35665 meq/L, and 1 meq/L = 2.804 °dKH.
 * - "as CaCO3": 1 meq/L = M(CaCO3)/2 = 100.086/2 = 50.043 mg/L, from the CIAAW 2021 atomic
 *   weights. Standard Methods 2320 B uses 50.000 (its titration formula's 50 000 mg per eq); we
 *   keep the molar-mass value so every conversion here rests on the same atomic weights.
 */
const meqPerLitre: Record<AlkalinityUnit, number> = {
  dKH: (2 * 10) / molarMass.CaO,
  'meq/L': 1,
  'mg/L CaCO3': 2 / molarMass.CaCO3,
};

export function convertAlkalinity(value: number, from: AlkalinityUnit, to: AlkalinityUnit): number {
  checkNumber('value', value, { min: 0 });
  checkOneOf('from', from, alkalinityUnits);
  checkOneOf('to', to, alkalinityUnits);
  return (value * meqPerLitre[from]) / meqPerLitre[to];
}
