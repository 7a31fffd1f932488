import { useState } from 'react';
import {
  celsiusFromFahrenheit,
  conductivityFromSalinity,
  salinityFromConductivity,
  salinityFromSpecificGravity,
  seawaterDensity,
  specificGravity,
} from '@shared/chemistry/index';
import { formatFixed, formatPlain } from '../utils/format-number';
import { attempt, type ArgumentMap, type Attempt } from '../utils/range-message';
import { readFields, type FieldErrors, type FieldSpec } from '../utils/read-fields';
import { hasErrors, notReady, type ResultStatus } from '../utils/result-status';
import { convertTemperatureText, fromCelsius, toCelsius, type TemperatureUnit } from '../utils/temperature';
import { temperatureUnits } from '../utils/temperature';
import { CalculatorCard } from './calculator-card';
import { RadioGroup } from '../../../components/radio-group';
import { NumberField } from './number-field';
import { ResultList, ResultPanel, ResultUnavailable, ResultValue } from './result-panel';
import { SourceNote } from './source-note';

type Measured = 'salinity' | 'specificGravity' | 'conductivity';
type Reference = '25' | '20' | '60F' | '4' | 'other';
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
  temperature: string;
  reference: Reference;
  otherReference: string;
  reading: string;
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

interface SalinityOutcome {
  status: ResultStatus;
  errors: FieldErrors<Field>;
  result?: SalinityResult;
}

function workOutSalinity(inputs: SalinityInputs): SalinityOutcome {
  const { measured, unit, reference } = inputs;
  const spec: Partial<Record<Field, FieldSpec>> = {
    [measured]: { raw: inputs.reading, label: measuredLabels[measured] },
    temperature: { raw: inputs.temperature, label: 'Water temperature' },
  };
  if (reference === 'other')
    spec.otherReference = { raw: inputs.otherReference, label: 'Reference temperature' };
  const read = readFields(spec as Record<Field, FieldSpec>);
  if (!read.ok) return { status: notReady(read.errors, read.missing), errors: read.errors };
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
  if (!sample.ok || !referenceFromField.ok) return { status: notReady(errors, []), errors };
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
      status: salinity.field ? notReady(errors, []) : { kind: 'problem', message: salinity.message },
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
  return { status: hasErrors(errors) ? notReady(errors, []) : { kind: 'ready' }, errors, result };
}

export function SalinityCalculator() {
  const [measured, setMeasured] = useState<Measured>('salinity');
  const [unit, setUnit] = useState<TemperatureUnit>('°C');
  const [temperature, setTemperature] = useState('25');
  const [reference, setReference] = useState<Reference>('25');
  const [otherReference, setOtherReference] = useState('');
  const [readings, setReadings] = useState<Record<Measured, string>>({
    salinity: '35',
    specificGravity: '1.026',
    conductivity: '53',
  });

  const reading = readings[measured];
  const { status, errors, result } = workOutSalinity({
    measured,
    unit,
    temperature,
    reference,
    otherReference,
    reading,
  });

  const changeUnit = (next: TemperatureUnit) => {
    setTemperature(convertTemperatureText(temperature, unit, next));
    setOtherReference(convertTemperatureText(otherReference, unit, next));
    setUnit(next);
  };
  const setReading = (value: string) => setReadings({ ...readings, [measured]: value });
  const temperatureText = (celsius: number) => `${formatPlain(fromCelsius(celsius, unit), 2)} ${unit}`;

  return (
    <CalculatorCard
      id="salinity"
      title="Salinity"
      intro="Enter what your instrument shows — salinity, specific gravity or conductivity — and see the others, with the water’s density."
    >
      <RadioGroup
        legend="What did you measure?"
        value={measured}
        onChange={setMeasured}
        options={measuredChoices}
      />
      {measured === 'salinity' && (
        <NumberField
          label="Practical salinity"
          value={reading}
          onChange={setReading}
          hint="Practical salinity has no unit; it is close to parts per thousand (ppt). Natural seawater is about 35."
          error={errors.salinity}
        />
      )}
      {measured === 'specificGravity' && (
        <NumberField
          label="Specific gravity"
          value={reading}
          onChange={setReading}
          hint="As the hydrometer or refractometer reads, e.g. 1.025."
          error={errors.specificGravity}
        />
      )}
      {measured === 'conductivity' && (
        <NumberField
          label="Conductivity"
          unit="mS/cm"
          unitSpoken="millisiemens per centimetre"
          value={reading}
          onChange={setReading}
          hint="As the meter shows it. If the meter already corrects to 25 °C, enter 25 °C as the water temperature."
          error={errors.conductivity}
        />
      )}
      <RadioGroup legend="Temperatures in" value={unit} onChange={changeUnit} options={temperatureUnits} />
      <NumberField
        label="Water temperature"
        unit={unit}
        value={temperature}
        onChange={setTemperature}
        hint={
          measured === 'specificGravity'
            ? 'The sample’s temperature when read. A refractometer that corrects for temperature itself usually reads as if at its reference temperature — check its manual and enter that.'
            : 'The temperature of the water when you took the reading.'
        }
        error={errors.temperature}
      />
      <RadioGroup
        legend="Specific gravity reference temperature"
        hint="Hydrometers and refractometers compare the sample with pure water at a stated temperature, printed on the instrument or in its manual."
        value={reference}
        onChange={setReference}
        options={referenceChoices}
      />
      {reference === 'other' && (
        <NumberField
          label="Reference temperature"
          unit={unit}
          value={otherReference}
          onChange={setOtherReference}
          error={errors.otherReference}
        />
      )}
      <ResultPanel
        status={status}
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
