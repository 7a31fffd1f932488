import { z } from 'zod';
import {
  commonPracticeMaxDailyRise,
  doseGrams,
  dosingCompounds,
  litresFromImperialGallons,
  litresFromUsGallons,
  type DoseRiseUnit,
  type DosingCompound,
} from '@shared/chemistry/index';
import { Form } from '../../../components/form';
import { DecimalField, RadioGroupField, SelectField } from '../../../components/form-fields';
import {
  entry,
  filledIn,
  problemsAt,
  resultIsLive,
  useCalculatorForm,
  type Outcome,
} from '../utils/calculator-form';
import { formatFixed } from '../../../lib/format';
import { formatGrams, formatPlain } from '../utils/format-number';
import { attempt } from '../utils/range-message';
import type { FieldErrors } from '../utils/result-status';
import { CalculatorCard } from './calculator-card';
import { ChemicalCaution } from './chemical-caution';
import { ResultList, ResultPanel, ResultValue } from './result-panel';
import { SourceNote } from './source-note';
import { UnitLabel, UnitSuffix } from './unit-label';

type Field = 'display' | 'sump' | 'rise';
const volumeUnit = z.enum(['L', 'US gal', 'imp gal']);
type VolumeUnit = z.infer<typeof volumeUnit>;

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

const dosingForm = z
  .object({
    compound: z.enum(dosingCompounds),
    volumeUnit,
    display: entry,
    sump: entry,
    rise: entry,
  })
  .transform(({ compound, volumeUnit: unit, display, sump = 0, rise }, context): Outcome<Dose> => {
    const dailyStep = commonPracticeMaxDailyRise[compound];
    const raised = raises[dailyStep.unit];
    const read = filledIn<Field>(
      { display, sump, rise },
      { display: 'Display tank volume', sump: 'Sump volume', rise: 'Rise wanted' },
    );
    if (!read.ok) return { status: { kind: 'missing', labels: read.missing } };
    const { values } = read;
    const errors: FieldErrors<Field> = {};
    for (const field of ['display', 'sump'] as const) {
      if (values[field] < 0) errors[field] = 'A volume can’t be below 0.';
    }
    const worked = attempt(
      () => {
        const litres = toLitres(values.display, unit) + toLitres(values.sump, unit);
        return { litres, grams: doseGrams(compound, litres, values.rise) };
      },
      { rise: { field: 'rise', label: 'Rise wanted', unit: raised.unit } },
    );
    if (!worked.ok && worked.field) errors[worked.field] = worked.message;
    if (Object.keys(errors).length > 0) return problemsAt(context, errors);
    if (!worked.ok) return { status: { kind: 'problem', message: worked.message } };
    return {
      status: { kind: 'ready' },
      result: { ...worked.value, days: Math.ceil(values.rise / dailyStep.rise) },
    };
  });
type DosingValues = z.input<typeof dosingForm>;

export function DosingCalculator() {
  const { form, values, outcome } = useCalculatorForm(dosingForm, {
    compound: 'sodium bicarbonate',
    volumeUnit: 'L',
    display: '100',
    sump: '',
    rise: '1',
  });
  const { compound, volumeUnit } = values;
  const dailyStep = commonPracticeMaxDailyRise[compound];
  const raised = raises[dailyStep.unit];
  const dose = outcome.result;

  return (
    <CalculatorCard
      id="dosing"
      title="Dosing"
      intro="How many grams of a dry compound raise the whole system’s water by the amount you want."
    >
      <Form form={form} onSubmit={resultIsLive} className="space-y-5">
        <SelectField<DosingValues>
          name="compound"
          label="Compound"
          options={compoundOptions}
          hint={`${compounds[compound].formula}, dry — raises ${raised.parameter}.`}
        />
        <RadioGroupField<DosingValues> name="volumeUnit" label="Volumes in" options={volumeChoices} />
        <div className="grid gap-5 sm:grid-cols-2">
          <DecimalField<DosingValues>
            name="display"
            label={
              <UnitLabel unit={volumeUnit} spoken={volumeSpoken[volumeUnit]}>
                Display tank volume
              </UnitLabel>
            }
            suffix={<UnitSuffix unit={volumeUnit} />}
            hint="The water, not the glass size: less rock and sand."
          />
          <DecimalField<DosingValues>
            name="sump"
            label={
              <UnitLabel unit={volumeUnit} spoken={volumeSpoken[volumeUnit]}>
                Sump volume
              </UnitLabel>
            }
            suffix={<UnitSuffix unit={volumeUnit} />}
            hint="Water in the sump when running. Leave blank if there is none."
          />
        </div>
        <DecimalField<DosingValues>
          name="rise"
          label={
            <UnitLabel unit={raised.unit} spoken={raised.unitSpoken}>
              Rise in {raised.parameter} wanted
            </UnitLabel>
          }
          suffix={<UnitSuffix unit={raised.unit} />}
        />
      </Form>
      <ResultPanel
        status={outcome.status}
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
              Daily step of about {dailyStep.rise} {raised.unit} {raised.parameter}: a general guide, not a
              published limit.
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
                  Raise {raised.parameter} by no more than about {dailyStep.rise} {raised.unit} a day. Split
                  this over {dose.days} days: about {formatGrams(dose.grams / dose.days)} g a day, testing
                  before each dose.
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
