import { useId } from 'react';

interface Choice<V extends string> {
  value: V;
  label: string;
  hint: string;
}

/** Radio buttons as whole-row targets, each with a line saying what the choice means. */
export function ChoiceField<V extends string>({
  legend,
  name,
  value,
  onChange,
  choices,
}: {
  legend: string;
  name: string;
  value: V;
  onChange: (value: V) => void;
  choices: readonly Choice<V>[];
}) {
  const id = useId();
  return (
    <fieldset>
      <legend className="font-bold text-ink-900">{legend}</legend>
      <div className="mt-2 grid gap-2">
        {choices.map((choice) => (
          <label
            key={choice.value}
            htmlFor={`${id}-${choice.value}`}
            className="grid min-h-11 cursor-pointer grid-cols-[auto_1fr] items-start gap-x-3 rounded-lg border-2 border-ink-300 bg-white p-3 has-checked:border-brine-700 has-checked:bg-brine-100"
          >
            <input
              id={`${id}-${choice.value}`}
              type="radio"
              name={name}
              value={choice.value}
              checked={value === choice.value}
              onChange={() => onChange(choice.value)}
              className="row-span-2 mt-0.5 h-5 w-5 accent-brine-700"
            />
            <span className="font-bold text-ink-900">{choice.label}</span>
            <span className="text-sm text-ink-700">{choice.hint}</span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}
