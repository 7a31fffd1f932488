import { describe, expect, it } from 'vitest';
import * as chemistry from '@shared/chemistry';

describe('@shared/chemistry public surface', () => {
  it('exports exactly the documented functions and constants', () => {
    expect(Object.keys(chemistry).sort()).toEqual(
      [
        'celsiusFromFahrenheit',
        'commonPracticeMaxDailyRise',
        'concentrationAfterWaterChanges',
        'conductivityFromSalinity',
        'convertAlkalinity',
        'describeBounds',
        'doseGrams',
        'dosingCompounds',
        'fahrenheitFromCelsius',
        'litresFromImperialGallons',
        'litresFromUsGallons',
        'nitrateAsNFromNO3',
        'nitrateAsNO3FromN',
        'outOfRangeDetails',
        'phosphateAsPFromPO4',
        'phosphateAsPO4FromP',
        'practicalSalinity',
        'salinityFromConductivity',
        'salinityFromSpecificGravity',
        'seawaterDensity',
        'specificGravity',
        'unionizedAmmonia',
        'unionizedAmmoniaFraction',
        'usGallonsFromLitres',
        'waterChangeFractionFor',
        'waterChangesNeeded',
      ].sort(),
    );
  });
});
