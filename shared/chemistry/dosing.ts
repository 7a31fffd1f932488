import { convertAlkalinity } from './alkalinity';
import { molarMass } from './molar-mass';
import { checkNumber, checkOneOf } from './range-check';

export const dosingCompounds = [
  'sodium bicarbonate',
  'sodium carbonate',
  'calcium chloride dihydrate',
  'magnesium chloride hexahydrate',
  'magnesium sulfate heptahydrate',
] as const;

export type DosingCompound = (typeof dosingCompounds)[number];

/** What `rise` is measured in for each compound. */
export type DoseRiseUnit = 'dKH' | 'mg/L Ca' | 'mg/L Mg';

export interface DailyRiseLimit {
  readonly rise: number;
  readonly unit: DoseRiseUnit;
}

/**
 * Largest rise per day before the UI warns. Common practice, not a published limit: about
 * 1 dKH/day alkalinity, 20 mg/L/day calcium, 100 mg/L/day magnesium.
 */
export const commonPracticeMaxDailyRise: Readonly<Record<DosingCompound, DailyRiseLimit>> = {
  'sodium bicarbonate': { rise: 1, unit: 'dKH' },
  'sodium carbonate': { rise: 1, unit: 'dKH' },
  'calcium chloride dihydrate': { rise: 20, unit: 'mg/L Ca' },
  'magnesium chloride hexahydrate': { rise: 100, unit: 'mg/L Mg' },
  'magnesium sulfate heptahydrate': { rise: 100, unit: 'mg/L Mg' },
};

/**
 * Milligrams of compound per litre of tank water for a rise of one unit, from the CIAAW 2021
 * molar masses (g/mol = mg/mmol):
 * - NaHCO3, 84.006 g/mol, 1 eq/mol: 1 dKH = 0.35665 meq/L → 0.35665 · 84.006 = 29.96 mg/L
 * - Na2CO3, 105.988 g/mol, 2 eq/mol: 0.35665 / 2 · 105.988 = 18.90 mg/L per dKH
 * - CaCl2·2H2O, 147.008 g/mol per 40.078 g Ca: 3.668 mg per mg/L Ca
 * - MgCl2·6H2O, 203.295 g/mol per 24.305 g Mg: 8.364 mg per mg/L Mg
 * - MgSO4·7H2O, 246.466 g/mol per 24.305 g Mg: 10.141 mg per mg/L Mg
 * e.g. 100 L raised 1 dKH with bicarbonate: 100 · 29.96 mg = 2.996 g.
 */
const meqPerDkh = convertAlkalinity(1, 'dKH', 'meq/L');
const milligramsPerLitrePerUnit: Record<DosingCompound, number> = {
  'sodium bicarbonate': meqPerDkh * molarMass.NaHCO3,
  'sodium carbonate': (meqPerDkh / 2) * molarMass.Na2CO3,
  'calcium chloride dihydrate': molarMass.CaCl2_2H2O / molarMass.Ca,
  'magnesium chloride hexahydrate': molarMass.MgCl2_6H2O / molarMass.Mg,
  'magnesium sulfate heptahydrate': molarMass.MgSO4_7H2O / molarMass.Mg,
};

/**
 * Grams of dry compound that raise `volumeLitres` of water by `rise` (dKH for the carbonates,
 * mg/L Ca or Mg for the salts), assuming it all dissolves and nothing is consumed meanwhile.
 */
export function doseGrams(compound: DosingCompound, volumeLitres: number, rise: number): number {
  checkOneOf('compound', compound, dosingCompounds);
  checkNumber('volumeLitres', volumeLitres, { min: 0 });
  checkNumber('rise', rise, { min: 0 });
  return (volumeLitres * rise * milligramsPerLitrePerUnit[compound]) / 1000;
}
