import { useId, type ReactNode } from 'react';

export interface Choice<V extends string> {
  value: V;
  label: ReactNode;
}

interface ChoiceGroupProps<V extends string> {
  legend: string;
  value: V;
  onChange: (value: V) => void;
  choices: readonly Choice<V>[];
  hint?: ReactNode;
}

/**
 * Radio buttons drawn as large tiles; the chosen one is filled and ticked, so colour is not the only
 * cue. The real input lies transparent over its whole tile, so a tap anywhere on it lands on the input.
 */
export function ChoiceGroup<V extends string>({
  legend,
  value,
  onChange,
  choices,
  hint,
}: ChoiceGroupProps<V>) {
  const name = useId();
  const hintId = `${name}-hint`;
  return (
    <fieldset aria-describedby={hint ? hintId : undefined}>
      <legend className="font-bold text-ink-900">{legend}</legend>
      {hint && (
        <p id={hintId} className="mt-1 text-sm text-ink-700">
          {hint}
        </p>
      )}
      <div className="mt-2 flex flex-wrap gap-2">
        {choices.map((choice) => (
          <label
            key={choice.value}
            className="relative inline-flex min-h-12 cursor-pointer items-center gap-2 rounded-lg border-2 border-ink-300 bg-white px-4 py-2 font-bold text-ink-900 hover:border-ink-700 has-checked:border-ink-800 has-checked:bg-ink-800 has-checked:text-white has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-brine-500"
          >
            <input
              type="radio"
              name={name}
              value={choice.value}
              checked={value === choice.value}
              onChange={() => onChange(choice.value)}
              className="peer absolute inset-0 h-full w-full cursor-pointer appearance-none rounded-lg opacity-0"
            />
            <span aria-hidden="true" className="hidden peer-checked:inline">
              ✓
            </span>
            {choice.label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
