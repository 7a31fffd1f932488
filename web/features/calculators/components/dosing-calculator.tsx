import { useState } from 'react';
import {
  commonPracticeMaxDailyRise,
  doseGrams,
  dosingCompounds,
  litresFromImperialGallons,
  litresFromUsGallons,
  type DoseRiseUnit,
  type DosingCompound,
} from '@shared/chemistry/index';
import { formatFixed, formatGrams, formatPlain } from '../utils/format-number';
import { attempt } from '../utils/range-message';
import { readFields } from '../utils/read-fields';
import { notReady, type ResultStatus } from '../utils/result-status';
import { CalculatorCard } from './calculator-card';
import { ChemicalCaution } from './chemical-caution';
import { RadioGroup } from '../../../components/radio-group';
import { NumberField } from './number-field';
import { ResultList, ResultPanel, ResultValue } from './result-panel';
import { SelectField } from './select-field';
import { SourceNote } from './source-note';

type Field = 'display' | 'sump' | 'rise';
type VolumeUnit = 'L' | 'US gal' | 'imp gal';

const compounds: Record<DosingCompound, { name: string; formula: string }> = {
  'sodium bicarbonate': { name: 'Sodium bicarbonate', formula: 'NaHCO₃' },
  'sodium carbonate': { name: 'Sodium carbonate', formula: 'Na₂CO₃' },
  'calcium chloride dihydrate': { name: 'Calcium chloride dihydrate', formula: 'CaCl₂·2H₂O' },
  'magnesium chloride hexahydrate': { name: 'Magnesium chloride hexahydrate', formula: 'MgCl₂·6H₂O' },
  'magnesium sulfate heptahydrate': { name: 'Magnesium sulfate heptahydrate', formula: 'MgSO₄·7H₂O' },
};

const raises: Record<DoseRiseUnit, { parameter: string; unit: string; unitSpoken: string }> = {
  dKH: { parameter: 'alkalinity', unit: 'dKH', unitSpoken: 'degrees KH' },
  'mg/L Ca': { parameter: 'calcium', unit: 'mg/L', unitSpoken: 'milligrams per litre' },
  'mg/L Mg': { parameter: 'magnesium', unit: 'mg/L', unitSpoken: 'milligrams per litre' },
};

// Names only: a phone's select shows one line, so the formula goes in the hint below it.
const compoundOptions = dosingCompounds.map((compound) => ({
  value: compound,
  label: compounds[compound].name,
}));

const volumeChoices = [
  { value: 'L', label: 'Litres' },
  { value: 'US gal', label: 'US gallons' },
  { value: 'imp gal', label: 'Imperial gallons' },
] as const;

const volumeSpoken: Record<VolumeUnit, string> = {
  L: 'litres',
  'US gal': 'US gallons',
  'imp gal': 'imperial gallons',
};

function toLitres(volume: number, unit: VolumeUnit): number {
  if (unit === 'US gal') return litresFromUsGallons(volume);
  if (unit === 'imp gal') return litresFromImperialGallons(volume);
  return volume;
}

interface Dose {
  litres: number;
  grams: number;
  days: number;
}

export function DosingCalculator() {
  const [compound, setCompound] = useState<DosingCompound>('sodium bicarbonate');
  const [volumeUnit, setVolumeUnit] = useState<VolumeUnit>('L');
  const [display, setDisplay] = useState('100');
  const [sump, setSump] = useState('');
  const [rise, setRise] = useState('1');

  const dailyStep = commonPracticeMaxDailyRise[compound];
  const raised = raises[dailyStep.unit];

  const read = readFields<Field>({
    display: { raw: display, label: 'Display tank volume' },
    sump: { raw: sump, label: 'Sump volume', whenBlank: 0 },
    rise: { raw: rise, label: 'Rise wanted' },
  });
  let status: ResultStatus = { kind: 'ready' };
  let errors: Partial<Record<Field, string>> = {};
  let dose: Dose | undefined;
  if (!read.ok) {
    errors = read.errors;
    status = notReady(read.errors, read.missing);
  } else {
    const { values } = read;
    for (const field of ['display', 'sump'] as const) {
      if (values[field] < 0) errors[field] = 'A volume can’t be below 0.';
    }
    const worked = attempt(
      () => {
        const litres = toLitres(values.display, volumeUnit) + toLitres(values.sump, volumeUnit);
        return { litres, grams: doseGrams(compound, litres, values.rise) };
      },
      { rise: { field: 'rise', label: 'Rise wanted', unit: raised.unit } },
    );
    if (!worked.ok && worked.field) errors[worked.field] = worked.message;
    if (Object.keys(errors).length > 0) status = notReady(errors, []);
    else if (!worked.ok) status = { kind: 'problem', message: worked.message };
    else dose = { ...worked.value, days: Math.ceil(values.rise / dailyStep.rise) };
  }

  return (
    <CalculatorCard
      id="dosing"
      title="Dosing"
      intro="How many grams of a dry compound raise the whole system’s water by the amount you want."
    >
      <SelectField
        label="Compound"
        value={compound}
        onChange={setCompound}
        options={compoundOptions}
        hint={`${compounds[compound].formula}, dry — raises ${raised.parameter}.`}
      />
      <RadioGroup legend="Volumes in" value={volumeUnit} onChange={setVolumeUnit} options={volumeChoices} />
      <div className="grid gap-5 sm:grid-cols-2">
        <NumberField
          label="Display tank volume"
          unit={volumeUnit}
          unitSpoken={volumeSpoken[volumeUnit]}
          value={display}
          onChange={setDisplay}
          hint="The water, not the glass size: less rock and sand."
          error={errors.display}
        />
        <NumberField
          label="Sump volume"
          unit={volumeUnit}
          unitSpoken={volumeSpoken[volumeUnit]}
          value={sump}
          onChange={setSump}
          hint="Water in the sump when running. Leave blank if there is none."
          error={errors.sump}
        />
      </div>
      <NumberField
        label={`Rise in ${raised.parameter} wanted`}
        unit={raised.unit}
        unitSpoken={raised.unitSpoken}
        value={rise}
        onChange={setRise}
        error={errors.rise}
      />
      <ResultPanel
        status={status}
        source={
          <SourceNote>
            <p>
              Grams from molar masses on the IUPAC/CIAAW 2021 atomic weights; 1 dKH = 10 mg/L of CaO. Assumes
              all of it dissolves and the tank uses none in the meantime.
            </p>
            <p>
              Gallons: US gallon {formatPlain(litresFromUsGallons(1), 9)} L (NIST SP 811), imperial gallon{' '}
              {formatPlain(litresFromImperialGallons(1), 5)} L (UK Weights and Measures Act 1985).
            </p>
            <p>
              Daily step of about {dailyStep.rise} {raised.unit} {raised.parameter}: common practice.
            </p>
          </SourceNote>
        }
      >
        {dose && (
          <div className="space-y-4">
            <ResultList>
              <ResultValue
                label="Dose"
                detail={`${compounds[compound].name}, ${compounds[compound].formula}`}
                value={formatGrams(dose.grams)}
                unit="g"
                testId="dosing-grams"
              />
              <ResultValue
                label="Water dosed"
                detail="display tank and sump"
                value={formatFixed(dose.litres, 1)}
                unit="L"
                testId="dosing-litres"
              />
            </ResultList>
            {dose.days > 1 && (
              <div className="rounded-lg border-l-4 border-watch-700 bg-watch-100 p-3 text-ink-950">
                <p className="font-bold text-watch-700">More than a day’s step</p>
                <p className="mt-1 text-sm" data-testid="dosing-split">
                  Common practice is to raise {raised.parameter} by no more than about {dailyStep.rise}{' '}
                  {raised.unit} a day. Split this over {dose.days} days: about{' '}
                  {formatGrams(dose.grams / dose.days)} g a day, testing before each dose.
                </p>
              </div>
            )}
          </div>
        )}
      </ResultPanel>
      <ChemicalCaution />
    </CalculatorCard>
  );
}
