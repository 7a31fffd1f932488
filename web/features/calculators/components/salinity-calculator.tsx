import { useEffect } from 'react';
import { z } from 'zod';
import {
  celsiusFromFahrenheit,
  conductivityFromSalinity,
  salinityFromConductivity,
  salinityFromSpecificGravity,
  seawaterDensity,
  specificGravity,
} from '@shared/chemistry/index';
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
import { formatPlain } from '../utils/format-number';
import { attempt, type ArgumentMap, type Attempt } from '../utils/range-message';
import { hasErrors, type FieldErrors } from '../utils/result-status';
import {
  convertTemperatureText,
  fromCelsius,
  otherTemperatureUnit,
  temperatureUnit,
  temperatureUnits,
  toCelsius,
  type TemperatureUnit,
} from '../utils/temperature';
import { CalculatorCard } from './calculator-card';
import { ResultList, ResultPanel, ResultUnavailable, ResultValue } from './result-panel';
import { SourceNote } from './source-note';
import { UnitLabel, UnitSuffix } from './unit-label';

const measured = z.enum(['salinity', 'specificGravity', 'conductivity']);
type Measured = z.infer<typeof measured>;
const reference = z.enum(['25', '20', '60F', '4', 'other']);
type Reference = z.infer<typeof reference>;
type Field = 'temperature' | 'otherReference' | Measured;

const measuredChoices = [
  { value: 'salinity', label: 'Salinity' },
  { value: 'specificGravity', label: 'Specific gravity' },
  { value: 'conductivity', label: 'Conductivity' },
] as const;

const referenceChoices = [
  { value: '25', label: '25 °C (77 °F)' },
  { value: '20', label: '20 °C (68 °F)' },
  { value: '60F', label: '15.56 °C (60 °F)' },
  { value: '4', label: '4 °C (39.2 °F)' },
  { value: 'other', label: 'Other' },
] as const;

const referenceCelsius: Record<Exclude<Reference, 'other'>, number> = {
  '25': 25,
  '20': 20,
  '60F': celsiusFromFahrenheit(60),
  '4': 4,
};

const measuredLabels: Record<Measured, string> = {
  salinity: 'Practical salinity',
  specificGravity: 'Specific gravity',
  conductivity: 'Conductivity',
};

interface SalinityInputs {
  measured: Measured;
  unit: TemperatureUnit;
  reference: Reference;
  temperature: number | undefined;
  otherReference: number | undefined;
  reading: number | undefined;
}

interface SalinityResult {
  salinity: number;
  sampleC: number;
  referenceC: number;
  gravity: Attempt<number, Field>;
  conductivityAt25: Attempt<number, Field>;
  conductivityAtSample?: Attempt<number, Field>;
  density: Attempt<number, Field>;
}

/** Works out salinity from what was measured, with every other figure it gives, or the problems found. */
function workOutSalinity(inputs: SalinityInputs): {
  status: Outcome<SalinityResult>['status'];
  errors: FieldErrors<Field>;
  result?: SalinityResult;
} {
  const { measured, unit, reference } = inputs;
  const entries: Partial<Record<Field, number | undefined>> = {
    [measured]: inputs.reading,
    temperature: inputs.temperature,
  };
  const labels: Partial<Record<Field, string>> = {
    [measured]: measuredLabels[measured],
    temperature: 'Water temperature',
  };
  if (reference === 'other') {
    entries.otherReference = inputs.otherReference;
    labels.otherReference = 'Reference temperature';
  }
  const read = filledIn(entries as Record<Field, number | undefined>, labels as Record<Field, string>);
  if (!read.ok) return { status: { kind: 'missing', labels: read.missing }, errors: {} };
  const values = read.values;

  const inUnit = { unit, fromModule: (celsius: number) => fromCelsius(celsius, unit) };
  const temperature = { field: 'temperature', label: 'Water temperature', ...inUnit } as const;
  const referenceArg = {
    field: reference === 'other' ? 'otherReference' : undefined,
    label: 'Reference temperature',
    ...inUnit,
  } as const;
  const temperatures: ArgumentMap<Field> = {
    f: temperature,
    tempC: temperature,
    sampleTempC: temperature,
    referenceTempC: referenceArg,
  };

  const errors: FieldErrors<Field> = {};
  const sample = attempt(() => toCelsius(values.temperature, unit), temperatures);
  if (!sample.ok && sample.field) errors[sample.field] = sample.message;
  const referenceFromField =
    reference === 'other'
      ? attempt(() => toCelsius(values.otherReference, unit), {
          f: { ...referenceArg, field: 'otherReference' },
        })
      : ({ ok: true, value: referenceCelsius[reference] } as const);
  if (!referenceFromField.ok) errors.otherReference = referenceFromField.message;
  if (!sample.ok || !referenceFromField.ok) return { status: marked, errors };
  const sampleC = sample.value;
  const referenceC = referenceFromField.value;

  const salinityArgs: ArgumentMap<Field> = {
    ...temperatures,
    salinity: { field: 'salinity', label: 'Salinity' },
    sg: { field: 'specificGravity', label: 'Specific gravity', decimals: 5 },
    mSPerCm: { field: 'conductivity', label: 'Conductivity', unit: 'mS/cm' },
    'practical salinity from mSPerCm': {
      field: 'conductivity',
      label: 'The salinity from this conductivity',
      derived: true,
    },
  };
  const salinity = attempt((): number => {
    if (measured === 'specificGravity')
      return salinityFromSpecificGravity(values.specificGravity, sampleC, referenceC);
    if (measured === 'conductivity') return salinityFromConductivity(values.conductivity, sampleC);
    seawaterDensity(values.salinity, sampleC);
    return values.salinity;
  }, salinityArgs);
  if (!salinity.ok) {
    if (salinity.field) errors[salinity.field] = salinity.message;
    return {
      status: salinity.field ? marked : { kind: 'problem', message: salinity.message },
      errors,
    };
  }

  const s = salinity.value;
  // A worked-out salinity is not a field, so its limits read as reasons beside the result line.
  const outputArgs: ArgumentMap<Field> = { ...temperatures, salinity: { label: 'Salinity' } };
  const sampleOnly: ArgumentMap<Field> = { ...outputArgs, tempC: { ...temperature, field: undefined } };
  const result: SalinityResult = {
    salinity: s,
    sampleC,
    referenceC,
    gravity: attempt(() => specificGravity(s, sampleC, referenceC), outputArgs),
    conductivityAt25: attempt(() => conductivityFromSalinity(s, 25), outputArgs),
    conductivityAtSample:
      Math.abs(sampleC - 25) < 1e-9
        ? undefined
        : attempt(() => conductivityFromSalinity(s, sampleC), sampleOnly),
    density: attempt(() => seawaterDensity(s, sampleC), outputArgs),
  };
  if (!result.gravity.ok && result.gravity.field) errors[result.gravity.field] = result.gravity.message;
  return { status: hasErrors(errors) ? marked : { kind: 'ready' }, errors, result };
}

const marked = { kind: 'problem', message: 'Check the entries marked above.' } as const;

const salinityFields = z.object({
  measured,
  unit: temperatureUnit,
  temperature: entry,
  reference,
  otherReference: entry,
  salinity: entry,
  specificGravity: entry,
  conductivity: entry,
});
type SalinityValues = z.input<typeof salinityFields>;

/** Only the entries on screen count: the readings of the other instruments and an unused reference are kept, not read. */
const salinityForm = z
  .preprocess(
    (values: SalinityValues): SalinityValues => ({
      ...values,
      ...Object.fromEntries(
        measured.options.filter((kind) => kind !== values.measured).map((kind) => [kind, '']),
      ),
      otherReference: values.reference === 'other' ? values.otherReference : '',
    }),
    salinityFields,
  )
  .transform((values, context): Outcome<SalinityResult> => {
    const { status, errors, result } = workOutSalinity({
      measured: values.measured,
      unit: values.unit,
      reference: values.reference,
      temperature: values.temperature,
      otherReference: values.otherReference,
      reading: values[values.measured],
    });
    if (hasErrors(errors)) return problemsAt(context, errors);
    return { status, result };
  });

export function SalinityCalculator() {
  const { form, values, outcome } = useCalculatorForm(salinityForm, {
    measured: 'salinity',
    unit: '°C',
    temperature: '25',
    reference: '25',
    otherReference: '',
    salinity: '35',
    specificGravity: '1.026',
    conductivity: '53',
  });
  const { measured: shown, unit, reference: chosenReference } = values;
  const result = outcome.result;

  // Typed temperatures stay the same physical values when the unit changes: 25 °C ↔ 77 °F.
  useEffect(() => {
    const { unsubscribe } = form.watch((changed, { name }) => {
      if (name !== 'unit' || !changed.unit) return;
      const from = otherTemperatureUnit(changed.unit);
      for (const field of ['temperature', 'otherReference'] as const) {
        form.setValue(field, convertTemperatureText(changed[field] ?? '', from, changed.unit));
      }
    });
    return unsubscribe;
  }, [form]);
  const temperatureText = (celsius: number) => `${formatPlain(fromCelsius(celsius, unit), 2)} ${unit}`;

  return (
    <CalculatorCard
      id="salinity"
      title="Salinity"
      intro="Enter what your instrument shows — salinity, specific gravity or conductivity — and see the others, with the water’s density."
    >
      <Form form={form} onSubmit={resultIsLive} className="space-y-5">
        <RadioGroupField<SalinityValues>
          name="measured"
          label="What did you measure?"
          options={measuredChoices}
        />
        {shown === 'salinity' && (
          <DecimalField<SalinityValues>
            name="salinity"
            label="Practical salinity"
            hint="Practical salinity has no unit; it is close to parts per thousand (ppt). Natural seawater is about 35."
          />
        )}
        {shown === 'specificGravity' && (
          <DecimalField<SalinityValues>
            name="specificGravity"
            label="Specific gravity"
            hint="As the hydrometer or refractometer reads, e.g. 1.025."
          />
        )}
        {shown === 'conductivity' && (
          <DecimalField<SalinityValues>
            name="conductivity"
            label={
              <UnitLabel unit="mS/cm" spoken="millisiemens per centimetre">
                Conductivity
              </UnitLabel>
            }
            suffix={<UnitSuffix unit="mS/cm" />}
            hint="As the meter shows it. If the meter already corrects to 25 °C, enter 25 °C as the water temperature."
          />
        )}
        <RadioGroupField<SalinityValues> name="unit" label="Temperatures in" options={temperatureUnits} />
        <DecimalField<SalinityValues>
          name="temperature"
          label={<UnitLabel unit={unit}>Water temperature</UnitLabel>}
          suffix={<UnitSuffix unit={unit} />}
          hint={
            shown === 'specificGravity'
              ? 'The sample’s temperature when read. A refractometer that corrects for temperature itself usually reads as if at its reference temperature — check its manual and enter that.'
              : 'The temperature of the water when you took the reading.'
          }
        />
        <RadioGroupField<SalinityValues>
          name="reference"
          label="Specific gravity reference temperature"
          hint="Hydrometers and refractometers compare the sample with pure water at a stated temperature, printed on the instrument or in its manual."
          options={referenceChoices}
        />
        {chosenReference === 'other' && (
          <DecimalField<SalinityValues>
            name="otherReference"
            label={<UnitLabel unit={unit}>Reference temperature</UnitLabel>}
            suffix={<UnitSuffix unit={unit} />}
          />
        )}
      </Form>
      <ResultPanel
        status={outcome.status}
        source={
          <SourceNote>
            <p>
              Salinity and conductivity: Practical Salinity Scale 1978 (PSS-78), UNESCO Technical Paper 44
              (Fofonoff &amp; Millard 1983); standard seawater is 42.914 mS/cm at 15 °C (Culkin &amp; Smith
              1980).
            </p>
            <p>
              Density and specific gravity: EOS-80 one-atmosphere equation of state (Millero &amp; Poisson
              1981), with pure water from the same equation.
            </p>
            <p>Temperatures are read as ITS-90 and converted to the equations’ IPTS-68 scale.</p>
          </SourceNote>
        }
      >
        {result && (
          <ResultList>
            <ResultValue
              label="Practical salinity"
              value={formatFixed(result.salinity, 2)}
              testId="salinity-salinity"
            />
            {result.gravity.ok ? (
              <ResultValue
                label="Specific gravity"
                detail={`water at ${temperatureText(result.sampleC)}, reference ${temperatureText(result.referenceC)}`}
                value={formatFixed(result.gravity.value, 4)}
                testId="salinity-gravity"
              />
            ) : (
              <ResultUnavailable
                label="Specific gravity"
                reason={result.gravity.message}
                testId="salinity-gravity"
              />
            )}
            {result.conductivityAt25.ok ? (
              <ResultValue
                label="Conductivity at 25 °C"
                detail={unit === '°F' ? '77 °F' : undefined}
                value={formatFixed(result.conductivityAt25.value, 2)}
                unit="mS/cm"
                testId="salinity-conductivity-25"
              />
            ) : (
              <ResultUnavailable
                label="Conductivity at 25 °C"
                reason={result.conductivityAt25.message}
                testId="salinity-conductivity-25"
              />
            )}
            {result.conductivityAtSample &&
              (result.conductivityAtSample.ok ? (
                <ResultValue
                  label={`Conductivity at ${temperatureText(result.sampleC)}`}
                  value={formatFixed(result.conductivityAtSample.value, 2)}
                  unit="mS/cm"
                  testId="salinity-conductivity-sample"
                />
              ) : (
                <ResultUnavailable
                  label={`Conductivity at ${temperatureText(result.sampleC)}`}
                  reason={result.conductivityAtSample.message}
                  testId="salinity-conductivity-sample"
                />
              ))}
            {result.density.ok ? (
              <ResultValue
                label={`Density at ${temperatureText(result.sampleC)}`}
                value={formatFixed(result.density.value, 2)}
                unit="kg/m³"
                testId="salinity-density"
              />
            ) : (
              <ResultUnavailable label="Density" reason={result.density.message} testId="salinity-density" />
            )}
          </ResultList>
        )}
      </ResultPanel>
    </CalculatorCard>
  );
}
