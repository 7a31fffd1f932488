import { useEffect, useRef } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { litresFrom, volumeIn, volumeUnitLabels, volumeUnits, type VolumeUnit } from '@shared/tanks/volume';
import { DecimalField, SelectField } from '../../../components/form-fields';
import { parseDecimal } from '../../../lib/decimal';
import { capitalise, formatNumber } from '../../../lib/format';

/** The part of the tank form these fields are bound to. */
export interface VolumeValues {
  unit: VolumeUnit;
  displayVolume: { value: string };
  sumpVolume: { value: string };
}

const volumeOf = (text: string): number | null => {
  const parsed = parseDecimal(text);
  return parsed.state === 'number' && parsed.value >= 0 ? parsed.value : null;
};

/** Rewrites an entered volume in another unit, to one decimal, so the picker converts as it changes. */
export function convertEntry(text: string, from: VolumeUnit, to: VolumeUnit): string {
  const value = volumeOf(text);
  if (value === null) return text;
  return String(Math.round(volumeIn(litresFrom(value, from), to) * 10) / 10);
}

function VolumeInput({ name, label }: { name: 'displayVolume.value' | 'sumpVolume.value'; label: string }) {
  const unit = useWatch<VolumeValues, 'unit'>({ name: 'unit' });
  const text = useWatch<VolumeValues, typeof name>({ name });
  const value = volumeOf(text);
  const litres = value === null ? null : litresFrom(value, unit);
  return (
    <div className="min-w-0">
      <DecimalField<VolumeValues>
        name={name}
        label={
          <>
            {label} <span className="sr-only">({volumeUnitLabels[unit].long})</span>
          </>
        }
        suffix={<span aria-hidden="true">{volumeUnitLabels[unit].short}</span>}
      />
      <p className="mt-1 text-sm text-ink-700" aria-live="polite">
        {unit === 'litres' || litres === null ? '\u00a0' : `= ${formatNumber(litres)} litres`}
      </p>
    </div>
  );
}

/** Display and sump volumes with one unit picker; changing the unit converts what is typed. */
export function VolumeFields() {
  const { getValues, setValue, watch } = useFormContext<VolumeValues>();
  const previous = useRef<VolumeUnit>(getValues('unit'));
  useEffect(() => {
    const subscription = watch((values, { name }) => {
      if (name !== 'unit' || !values.unit || values.unit === previous.current) return;
      const [from, to] = [previous.current, values.unit];
      previous.current = to;
      for (const field of ['displayVolume.value', 'sumpVolume.value'] as const) {
        setValue(field, convertEntry(getValues(field), from, to));
      }
    });
    return () => subscription.unsubscribe();
  }, [watch, getValues, setValue]);

  return (
    <fieldset className="rounded-lg border border-ink-100 p-4">
      <legend className="px-1 font-bold text-ink-900">Volumes</legend>
      <div className="grid gap-4 sm:grid-cols-3">
        <SelectField<VolumeValues>
          name="unit"
          label="Enter in"
          hint="Stored in litres."
          options={volumeUnits.map((option) => ({
            value: option,
            label: capitalise(volumeUnitLabels[option].long),
          }))}
        />
        <VolumeInput name="displayVolume.value" label="Display tank" />
        <VolumeInput name="sumpVolume.value" label="Sump" />
      </div>
    </fieldset>
  );
}
