import { useId } from 'react';
import { litresFrom, volumeIn, volumeUnitLabels, volumeUnits, type VolumeUnit } from '@shared/schemas/tanks';
import { FieldError } from '../../../components/form-fields';
import { parseUnsignedDecimal } from '../../../lib/decimal';
import { formatNumber } from '../utils/format';

/** Rewrites an entered volume in another unit, to one decimal, so the picker converts as it changes. */
export function convertEntry(text: string, from: VolumeUnit, to: VolumeUnit): string {
  const value = parseUnsignedDecimal(text);
  if (value === null) return text;
  return String(Math.round(volumeIn(litresFrom(value, from), to) * 10) / 10);
}

function VolumeInput({
  label,
  value,
  unit,
  onChange,
  error,
}: {
  label: string;
  value: string;
  unit: VolumeUnit;
  onChange: (value: string) => void;
  error?: string;
}) {
  const id = useId();
  const parsed = parseUnsignedDecimal(value);
  const litres = parsed === null ? null : litresFrom(parsed, unit);
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block font-bold text-ink-900">
        {label} <span className="sr-only">({volumeUnitLabels[unit].long})</span>
      </label>
      <div className="mt-1 flex">
        <input
          id={id}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          value={value}
          onChange={(event) => onChange(event.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={`${id}-litres${error ? ` ${id}-error` : ''}`}
          className={`min-h-12 w-full min-w-0 rounded-l-lg border-2 bg-white px-3 text-base text-ink-950 ${
            error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
          }`}
        />
        <span
          aria-hidden="true"
          className="flex min-w-16 shrink-0 items-center justify-center rounded-r-lg border-2 border-l-0 border-ink-300 bg-ink-50 px-2 text-sm font-bold text-ink-700"
        >
          {volumeUnitLabels[unit].short}
        </span>
      </div>
      <p id={`${id}-litres`} className="mt-1 text-sm text-ink-700" aria-live="polite">
        {unit === 'litres' || litres === null ? '\u00a0' : `= ${formatNumber(litres)} litres`}
      </p>
      {error && (
        <FieldError id={`${id}-error`} className="mt-1">
          {error}
        </FieldError>
      )}
    </div>
  );
}

/** Display and sump volumes with one unit picker; changing the unit converts what is typed. */
export function VolumeFields({
  unit,
  display,
  sump,
  onChange,
  errors,
}: {
  unit: VolumeUnit;
  display: string;
  sump: string;
  onChange: (next: { unit: VolumeUnit; display: string; sump: string }) => void;
  errors: Record<string, string>;
}) {
  const unitId = useId();
  return (
    <fieldset className="rounded-lg border border-ink-100 p-4">
      <legend className="px-1 font-bold text-ink-900">Volumes</legend>
      <div className="grid gap-4 sm:grid-cols-3">
        <div>
          <label htmlFor={unitId} className="block font-bold text-ink-900">
            Enter in
          </label>
          <select
            id={unitId}
            value={unit}
            onChange={(event) => {
              const next = event.target.value as VolumeUnit;
              onChange({
                unit: next,
                display: convertEntry(display, unit, next),
                sump: convertEntry(sump, unit, next),
              });
            }}
            className="mt-1 min-h-12 w-full rounded-lg border-2 border-ink-300 bg-white px-3 text-base text-ink-950 focus:border-ink-700"
          >
            {volumeUnits.map((option) => (
              <option key={option} value={option}>
                {volumeUnitLabels[option].long.replace(/^./, (c) => c.toUpperCase())}
              </option>
            ))}
          </select>
          <p className="mt-1 text-sm text-ink-700">Stored in litres.</p>
        </div>
        <VolumeInput
          label="Display tank"
          value={display}
          unit={unit}
          onChange={(value) => onChange({ unit, display: value, sump })}
          error={errors['displayVolume.value'] ?? errors.displayVolume}
        />
        <VolumeInput
          label="Sump"
          value={sump}
          unit={unit}
          onChange={(value) => onChange({ unit, display, sump: value })}
          error={errors['sumpVolume.value'] ?? errors.sumpVolume}
        />
      </div>
    </fieldset>
  );
}
