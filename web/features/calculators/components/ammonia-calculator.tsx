import { useEffect } from 'react';
import { z } from 'zod';
import { unionizedAmmonia, unionizedAmmoniaFraction } from '@shared/chemistry/index';
import { Form } from '../../../components/form';
import { DecimalField, RadioGroupField } from '../../../components/form-fields';
import {
  entry,
  filledIn,
  problemsAt,
  resultIsLive,
  useCalculatorForm,
  type Outcome,
} from '../utils/calculator-form';
import { formatFixed } from '../../../lib/format';
import { attempt, type ArgumentMap } from '../utils/range-message';
import {
  convertTemperatureText,
  fromCelsius,
  otherTemperatureUnit,
  temperatureUnit,
  temperatureUnits,
  toCelsius,
} from '../utils/temperature';
import { CalculatorCard } from './calculator-card';
import { ResultList, ResultPanel, ResultValue } from './result-panel';
import { SourceNote } from './source-note';
import { UnitLabel, UnitSuffix } from './unit-label';

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

const labels: Record<Field, string> = {
  total: 'Total ammonia',
  pH: 'pH',
  temperature: 'Water temperature',
  salinity: 'Salinity',
};

interface Toxicity {
  nh3: number;
  fraction: number;
  seawater: boolean;
}

const ammoniaForm = z
  .object({ total: entry, pH: entry, unit: temperatureUnit, temperature: entry, salinity: entry })
  .transform(({ unit, ...entries }, context): Outcome<Toxicity> => {
    const read = filledIn(entries, labels);
    if (!read.ok) return { status: { kind: 'missing', labels: read.missing } };
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
    if (worked.ok) return { status: { kind: 'ready' }, result: worked.value };
    if (worked.field) return problemsAt(context, { [worked.field]: worked.message });
    return { status: { kind: 'problem', message: worked.message } };
  });
type AmmoniaValues = z.input<typeof ammoniaForm>;

export function AmmoniaCalculator() {
  const { form, values, outcome } = useCalculatorForm(ammoniaForm, {
    total: '0.25',
    pH: '8.1',
    unit: '°C',
    temperature: '25',
    salinity: '35',
  });
  const result = outcome.result;
  const { unit } = values;

  // The typed temperature stays the same physical value when the unit changes: 25 °C ↔ 77 °F.
  useEffect(() => {
    const { unsubscribe } = form.watch((changed, { name }) => {
      if (name !== 'unit' || !changed.unit) return;
      const from = otherTemperatureUnit(changed.unit);
      form.setValue('temperature', convertTemperatureText(changed.temperature ?? '', from, changed.unit));
    });
    return unsubscribe;
  }, [form]);

  return (
    <CalculatorCard
      id="ammonia"
      title="Toxic ammonia"
      intro="Test kits measure total ammonia. How much of it is the toxic, un-ionised form (NH₃) depends on pH, temperature and salinity."
    >
      <Form form={form} onSubmit={resultIsLive} className="space-y-5">
        <DecimalField<AmmoniaValues>
          name="total"
          label={
            <UnitLabel unit="mg/L" spoken="milligrams per litre">
              Total ammonia
            </UnitLabel>
          }
          suffix={<UnitSuffix unit="mg/L" />}
          hint="As your test kit reports it (NH₃ + NH₄⁺). The result is on the same basis: if the kit reports ammonia as nitrogen, so is the result."
        />
        <DecimalField<AmmoniaValues>
          name="pH"
          label="pH"
          hint="In seawater, use pH on the total scale — the scale the seawater equation was fitted on. A meter calibrated with ordinary buffers reads on a different scale."
        />
        <RadioGroupField<AmmoniaValues> name="unit" label="Temperatures in" options={temperatureUnits} />
        <DecimalField<AmmoniaValues>
          name="temperature"
          label={<UnitLabel unit={unit}>Water temperature</UnitLabel>}
          suffix={<UnitSuffix unit={unit} />}
        />
        <DecimalField<AmmoniaValues>
          name="salinity"
          label="Salinity"
          hint="Practical salinity; enter 0 for fresh water."
        />
      </Form>
      <ResultPanel
        status={outcome.status}
        source={
          <SourceNote>
            {result?.seawater !== true && <p>Fresh water: Emerson, Russo, Lund &amp; Thurston (1975).</p>}
            {result?.seawater !== false && (
              <p>Seawater: Clegg &amp; Whitfield (1995), pH on the total scale.</p>
            )}
            <p>
              Danger levels ({watchFrom} and {harmfulAbove} mg/L NH₃) are a general guide, not a published
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
