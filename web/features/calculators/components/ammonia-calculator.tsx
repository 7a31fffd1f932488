import { useState } from 'react';
import { unionizedAmmonia, unionizedAmmoniaFraction } from '@shared/chemistry/index';
import { formatFixed } from '../utils/format-number';
import { attempt, type ArgumentMap } from '../utils/range-message';
import { readFields } from '../utils/read-fields';
import { notReady, type ResultStatus } from '../utils/result-status';
import { convertTemperatureText, fromCelsius, toCelsius, type TemperatureUnit } from '../utils/temperature';
import { RadioGroup } from '../../../components/radio-group';
import { temperatureUnits } from '../utils/temperature';
import { CalculatorCard } from './calculator-card';
import { NumberField } from './number-field';
import { ResultList, ResultPanel, ResultValue } from './result-panel';
import { SourceNote } from './source-note';

type Field = 'total' | 'pH' | 'temperature' | 'salinity';
type Danger = 'low' | 'watch' | 'harmful';

/** Common practice for NH3 in mg/L, not a published limit; the page says so beside the result. */
const watchFrom = 0.02;
const harmfulAbove = 0.05;

function dangerOf(nh3: number): Danger {
  if (nh3 < watchFrom) return 'low';
  return nh3 <= harmfulAbove ? 'watch' : 'harmful';
}

const dangers: Record<Danger, { word: string; advice: string; tone: string; shape: string }> = {
  low: {
    word: 'Low',
    advice: `Below ${watchFrom} mg/L NH₃.`,
    tone: 'bg-healthy-100 text-healthy-700',
    shape: 'M8 2a6 6 0 1 1 0 12A6 6 0 0 1 8 2z',
  },
  watch: {
    word: 'Watch closely',
    advice: `Between ${watchFrom} and ${harmfulAbove} mg/L NH₃: test again soon and look for the cause, such as overfeeding or a dead animal.`,
    tone: 'bg-watch-100 text-watch-700',
    shape: 'M8 1.5 15 14H1z',
  },
  harmful: {
    word: 'Harmful — act now',
    advice: `Above ${harmfulAbove} mg/L NH₃: contact your service company now; a water change with matched water is the usual first step.`,
    tone: 'bg-alert-100 text-alert-700',
    shape: 'M5 1h6l4 4v6l-4 4H5l-4-4V5z',
  },
};

function DangerLevel({ nh3 }: { nh3: number }) {
  const danger = dangers[dangerOf(nh3)];
  return (
    <div className={`rounded-lg p-3 ${danger.tone}`}>
      <p className="flex items-center gap-2 text-lg font-bold">
        <svg viewBox="0 0 16 16" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
          <path d={danger.shape} fill="currentColor" />
        </svg>
        <span data-testid="ammonia-danger">{danger.word}</span>
      </p>
      <p className="mt-1 text-sm">{danger.advice}</p>
    </div>
  );
}

export function AmmoniaCalculator() {
  const [total, setTotal] = useState('0.25');
  const [pH, setPH] = useState('8.1');
  const [unit, setUnit] = useState<TemperatureUnit>('°C');
  const [temperature, setTemperature] = useState('25');
  const [salinity, setSalinity] = useState('35');

  const read = readFields<Field>({
    total: { raw: total, label: 'Total ammonia' },
    pH: { raw: pH, label: 'pH' },
    temperature: { raw: temperature, label: 'Water temperature' },
    salinity: { raw: salinity, label: 'Salinity' },
  });

  let status: ResultStatus = { kind: 'ready' };
  let errors: Partial<Record<Field, string>> = {};
  let result: { nh3: number; fraction: number; seawater: boolean } | undefined;
  if (!read.ok) {
    errors = read.errors;
    status = notReady(read.errors, read.missing);
  } else {
    const { values } = read;
    const temperatureArg = {
      field: 'temperature',
      label: 'Water temperature',
      unit,
      fromModule: (celsius: number) => fromCelsius(celsius, unit),
    } as const;
    const args: ArgumentMap<Field> = {
      f: temperatureArg,
      tempC: temperatureArg,
      pH: { field: 'pH', label: 'pH' },
      salinity: { field: 'salinity', label: 'Salinity' },
      totalAmmonia: { field: 'total', label: 'Total ammonia', unit: 'mg/L' },
    };
    const worked = attempt(() => {
      const tempC = toCelsius(values.temperature, unit);
      return {
        nh3: unionizedAmmonia(values.total, values.pH, tempC, values.salinity),
        fraction: unionizedAmmoniaFraction(values.pH, tempC, values.salinity),
        seawater: values.salinity > 0,
      };
    }, args);
    if (worked.ok) result = worked.value;
    else if (worked.field) {
      errors = { [worked.field]: worked.message };
      status = notReady(errors, []);
    } else status = { kind: 'problem', message: worked.message };
  }

  const changeUnit = (next: TemperatureUnit) => {
    setTemperature(convertTemperatureText(temperature, unit, next));
    setUnit(next);
  };

  return (
    <CalculatorCard
      id="ammonia"
      title="Toxic ammonia"
      intro="Test kits measure total ammonia. How much of it is the toxic, un-ionised form (NH₃) depends on pH, temperature and salinity."
    >
      <NumberField
        label="Total ammonia"
        unit="mg/L"
        unitSpoken="milligrams per litre"
        value={total}
        onChange={setTotal}
        hint="As your test kit reports it (NH₃ + NH₄⁺). The result is on the same basis: if the kit reports ammonia as nitrogen, so is the result."
        error={errors.total}
      />
      <NumberField
        label="pH"
        value={pH}
        onChange={setPH}
        hint="In seawater, use pH on the total scale — the scale the seawater equation was fitted on. A meter calibrated with ordinary buffers reads on a different scale."
        error={errors.pH}
      />
      <RadioGroup legend="Temperatures in" value={unit} onChange={changeUnit} options={temperatureUnits} />
      <NumberField
        label="Water temperature"
        unit={unit}
        value={temperature}
        onChange={setTemperature}
        error={errors.temperature}
      />
      <NumberField
        label="Salinity"
        value={salinity}
        onChange={setSalinity}
        hint="Practical salinity; enter 0 for fresh water."
        error={errors.salinity}
      />
      <ResultPanel
        status={status}
        source={
          <SourceNote>
            {result?.seawater !== true && <p>Fresh water: Emerson, Russo, Lund &amp; Thurston (1975).</p>}
            {result?.seawater !== false && (
              <p>Seawater: Clegg &amp; Whitfield (1995), pH on the total scale.</p>
            )}
            <p>
              Danger levels ({watchFrom} and {harmfulAbove} mg/L NH₃) are common practice, not a published
              limit.
            </p>
          </SourceNote>
        }
      >
        {result && (
          <div className="space-y-4">
            <ResultList>
              <ResultValue
                label="Toxic ammonia (NH₃)"
                value={formatFixed(result.nh3, 4)}
                unit="mg/L"
                testId="ammonia-nh3"
              />
              <ResultValue
                label="Share un-ionised"
                value={formatFixed(result.fraction * 100, 2)}
                unit="%"
                testId="ammonia-percent"
              />
            </ResultList>
            <DangerLevel nh3={result.nh3} />
          </div>
        )}
      </ResultPanel>
    </CalculatorCard>
  );
}
