import { useId } from 'react';

interface SegmentedChoiceProps<V extends string> {
  legend: string;
  value: V;
  onChange: (value: V) => void;
  options: readonly { value: V; label: string }[];
  /** Hide the legend visually when the context already says it (it stays for screen readers). */
  hideLegend?: boolean;
}

/** A row of radio buttons drawn as 44-px tiles; the chosen one is filled and ticked, not just coloured. */
export function SegmentedChoice<V extends string>({
  legend,
  value,
  onChange,
  options,
  hideLegend,
}: SegmentedChoiceProps<V>) {
  const name = useId();
  return (
    <fieldset className="min-w-0">
      <legend className={hideLegend ? 'sr-only' : 'mb-1 text-sm font-bold text-ink-900'}>{legend}</legend>
      <div className="flex flex-wrap gap-1">
        {options.map((option) => (
          <label
            key={option.value}
            className="relative inline-flex min-h-11 min-w-11 cursor-pointer items-center justify-center gap-1 rounded-lg border-2 border-ink-300 bg-white px-2.5 text-sm font-bold text-ink-900 hover:border-ink-700 has-checked:border-ink-800 has-checked:bg-ink-800 has-checked:text-white has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-brine-500"
          >
            <input
              type="radio"
              name={name}
              value={option.value}
              checked={value === option.value}
              onChange={() => onChange(option.value)}
              className="peer absolute inset-0 h-full w-full cursor-pointer appearance-none rounded-lg opacity-0"
            />
            <span aria-hidden="true" className="hidden peer-checked:inline">
              ✓
            </span>
            {option.label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
