import { useId, type ReactNode } from 'react';

interface NumberFieldProps {
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** Shown beside the input and read out with the label. */
  unit?: string;
  /** How a screen reader should say the unit when the symbol reads badly, e.g. "millisiemens per centimetre". */
  unitSpoken?: string;
  hint?: ReactNode;
  error?: string;
}

/**
 * A decimal input sized for a thumb (and a wet one): a text field with the decimal keypad rather
 * than type="number", which rejects a decimal comma and changes value on a stray scroll.
 */
export function NumberField({ label, value, onChange, unit, unitSpoken, hint, error }: NumberFieldProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint ? hintId : undefined, error ? errorId : undefined].filter(Boolean).join(' ');
  return (
    <div>
      <label htmlFor={id} className="block font-bold text-ink-900">
        {label}
        {unit && <span className="sr-only"> ({unitSpoken ?? unit})</span>}
      </label>
      {hint && (
        <p id={hintId} className="mt-1 text-sm text-ink-700">
          {hint}
        </p>
      )}
      <div className="mt-2 flex">
        <input
          id={id}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          spellCheck={false}
          value={value}
          onChange={(event) => onChange(event.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy || undefined}
          className={`min-h-12 w-full min-w-0 border-2 bg-white px-3 text-lg text-ink-950 ${
            unit ? 'rounded-l-lg' : 'rounded-lg'
          } ${error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'}`}
        />
        {unit && (
          <span
            aria-hidden="true"
            className={`flex min-w-14 shrink-0 items-center justify-center rounded-r-lg border-2 border-l-0 bg-ink-50 px-3 font-bold text-ink-700 ${
              error ? 'border-alert-700' : 'border-ink-300'
            }`}
          >
            {unit}
          </span>
        )}
      </div>
      {error && (
        <p id={errorId} className="mt-2 flex items-start gap-2 text-sm font-bold text-alert-700">
          <span
            aria-hidden="true"
            className="mt-0.5 flex h-4 w-4 shrink-0 items-center justify-center rounded-full bg-alert-700 text-xs text-white"
          >
            !
          </span>
          {error}
        </p>
      )}
    </div>
  );
}
