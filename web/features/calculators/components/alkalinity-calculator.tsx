import { useState } from 'react';
import { convertAlkalinity, type AlkalinityUnit } from '@shared/chemistry/index';
import { formatFixed } from '../utils/format-number';
import { attempt } from '../utils/range-message';
import { readFields } from '../utils/read-fields';
import { notReady, type ResultStatus } from '../utils/result-status';
import { CalculatorCard } from './calculator-card';
import { RadioGroup } from '../../../components/radio-group';
import { NumberField } from './number-field';
import { ResultList, ResultPanel, ResultValue } from './result-panel';
import { SourceNote } from './source-note';

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

export function AlkalinityCalculator() {
  const [value, setValue] = useState('8');
  const [unit, setUnit] = useState<AlkalinityUnit>('dKH');

  const read = readFields({ value: { raw: value, label: 'Alkalinity' } });
  let status: ResultStatus = { kind: 'ready' };
  let error: string | undefined;
  let meq: number | undefined;
  if (!read.ok) {
    status = notReady(read.errors, read.missing);
    error = read.errors.value;
  } else {
    const converted = attempt(() => convertAlkalinity(read.values.value, unit, 'meq/L'), {
      value: { field: 'value', label: 'Alkalinity', unit: shownAs[unit].unit },
    });
    if (converted.ok) meq = converted.value;
    else {
      error = converted.message;
      status = notReady({ value: error }, []);
    }
  }

  return (
    <CalculatorCard
      id="alkalinity"
      title="Alkalinity units"
      intro="Test kits and labs report alkalinity in different units. Enter one to see all three."
    >
      <RadioGroup legend="Your reading is in" value={unit} onChange={setUnit} options={unitChoices} />
      <NumberField
        label="Alkalinity"
        unit={shownAs[unit].unit}
        value={value}
        onChange={setValue}
        error={error}
      />
      <ResultPanel
        status={status}
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
