export {
  celsiusFromFahrenheit,
  fahrenheitFromCelsius,
  litresFromImperialGallons,
  litresFromUsGallons,
  usGallonsFromLitres,
} from './units';
export type { TemperatureScale, TemperatureScaleOptions } from './temperature-scale';
export { conductivityFromSalinity, practicalSalinity, salinityFromConductivity } from './salinity';
export type { PracticalSalinityOptions } from './salinity';
export { seawaterDensity } from './density';
export { salinityFromSpecificGravity, specificGravity } from './specific-gravity';
export { unionizedAmmonia, unionizedAmmoniaFraction } from './ammonia';
export { convertAlkalinity } from './alkalinity';
export type { AlkalinityUnit } from './alkalinity';
export { nitrateAsNFromNO3, nitrateAsNO3FromN, phosphateAsPFromPO4, phosphateAsPO4FromP } from './nutrients';
export { commonPracticeMaxDailyRise, doseGrams, dosingCompounds } from './dosing';
export type { DailyRiseLimit, DoseRiseUnit, DosingCompound } from './dosing';
export { concentrationAfterWaterChanges, waterChangeFractionFor, waterChangesNeeded } from './water-change';
export { describeBounds, outOfRangeDetails } from './range-check';
export type { OutOfRange } from './range-check';
