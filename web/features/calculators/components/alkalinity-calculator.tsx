import { z } from 'zod';
import { convertAlkalinity, type AlkalinityUnit } from '@shared/chemistry/index';
import { Form } from '../../../components/form';
import { DecimalField, RadioGroupField } from '../../../components/form-fields';
import { entry, problemsAt, resultIsLive, useCalculatorForm, type Outcome } from '../utils/calculator-form';
import { formatFixed } from '../../../lib/format';
import { attempt } from '../utils/range-message';
import { CalculatorCard } from './calculator-card';
import { ResultList, ResultPanel, ResultValue } from './result-panel';
import { SourceNote } from './source-note';
import { UnitLabel, UnitSuffix } from './unit-label';

const unitChoices = [
  { value: 'dKH', label: 'dKH' },
  { value: 'meq/L', label: 'meq/L' },
  { value: 'mg/L CaCO3', label: 'mg/L as CaCO₃' },
] as const;

const shownAs: Record<AlkalinityUnit, { label: string; unit: string; decimals: number; testId: string }> = {
  dKH: { label: 'German degrees', unit: 'dKH', decimals: 2, testId: 'alkalinity-dkh' },
  'meq/L': { label: 'Milliequivalents per litre', unit: 'meq/L', decimals: 3, testId: 'alkalinity-meq' },
  'mg/L CaCO3': {
    label: 'As calcium carbonate',
    unit: 'mg/L CaCO₃',
    decimals: 2,
    testId: 'alkalinity-caco3',
  },
};

const dkhPerMeq = convertAlkalinity(1, 'meq/L', 'dKH');
const caco3PerMeq = convertAlkalinity(1, 'meq/L', 'mg/L CaCO3');

/** The reading in milliequivalents per litre, the unit every other one is worked out from. */
const alkalinityForm = z
  .object({ unit: z.enum(['dKH', 'meq/L', 'mg/L CaCO3'] satisfies AlkalinityUnit[]), value: entry })
  .transform(({ unit, value }, context): Outcome<number> => {
    if (value === undefined) return { status: { kind: 'missing', labels: ['Alkalinity'] } };
    const converted = attempt(() => convertAlkalinity(value, unit, 'meq/L'), {
      value: { field: 'value', label: 'Alkalinity', unit: shownAs[unit].unit },
    });
    if (!converted.ok) return problemsAt(context, { value: converted.message });
    return { status: { kind: 'ready' }, result: converted.value };
  });
type AlkalinityValues = z.input<typeof alkalinityForm>;

export function AlkalinityCalculator() {
  const { form, values, outcome } = useCalculatorForm(alkalinityForm, { unit: 'dKH', value: '8' });
  const meq = outcome.result;
  const unit = shownAs[values.unit].unit;

  return (
    <CalculatorCard
      id="alkalinity"
      title="Alkalinity units"
      intro="Test kits and labs report alkalinity in different units. Enter one to see all three."
    >
      <Form form={form} onSubmit={resultIsLive} className="space-y-5">
        <RadioGroupField<AlkalinityValues> name="unit" label="Your reading is in" options={unitChoices} />
        <DecimalField<AlkalinityValues>
          name="value"
          label={<UnitLabel unit={unit}>Alkalinity</UnitLabel>}
          suffix={<UnitSuffix unit={unit} />}
        />
      </Form>
      <ResultPanel
        status={outcome.status}
        source={
          <SourceNote>
            <p>German degree: 1 dKH = 10 mg/L of calcium oxide (CaO).</p>
            <p>
              Equivalents from molar masses on the IUPAC/CIAAW 2021 atomic weights: 1 meq/L ={' '}
              {formatFixed(dkhPerMeq, 3)} dKH = {formatFixed(caco3PerMeq, 2)} mg/L as CaCO₃. Standard Methods
              (2320 B) uses 50.00 mg per meq, so a lab report may differ by about 0.1 %.
            </p>
          </SourceNote>
        }
      >
        {meq !== undefined && (
          <ResultList>
            {unitChoices.map(({ value: to }) => (
              <ResultValue
                key={to}
                label={shownAs[to].label}
                value={formatFixed(convertAlkalinity(meq, 'meq/L', to), shownAs[to].decimals)}
                unit={shownAs[to].unit}
                testId={shownAs[to].testId}
              />
            ))}
          </ResultList>
        )}
      </ResultPanel>
    </CalculatorCard>
  );
}
