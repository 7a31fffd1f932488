import { useId, type ReactNode } from 'react';

interface SelectFieldProps<V extends string> {
  label: string;
  value: V;
  onChange: (value: V) => void;
  options: readonly { value: V; label: string }[];
  hint?: ReactNode;
}

export function SelectField<V extends string>({
  label,
  value,
  onChange,
  options,
  hint,
}: SelectFieldProps<V>) {
  const id = useId();
  const hintId = `${id}-hint`;
  return (
    <div>
      <label htmlFor={id} className="block font-bold text-ink-900">
        {label}
      </label>
      {hint && (
        <p id={hintId} className="mt-1 text-sm text-ink-700">
          {hint}
        </p>
      )}
      <select
        id={id}
        value={value}
        onChange={(event) => {
          const chosen = options.find((option) => option.value === event.target.value);
          if (chosen) onChange(chosen.value);
        }}
        aria-describedby={hint ? hintId : undefined}
        className="mt-2 min-h-12 w-full rounded-lg border-2 border-ink-300 bg-white px-3 text-base text-ink-950 focus:border-ink-700"
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </div>
  );
}
