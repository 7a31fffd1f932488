import { useId, type ReactNode } from 'react';

export interface RadioOption<V extends string> {
  value: V;
  label: ReactNode;
  /** A line under the label saying what the choice means (shown in the `rows` look). */
  hint?: ReactNode;
}

const looks = {
  // Whole-row targets with a line of explanation each.
  rows: {
    list: 'mt-2 grid gap-2',
    option:
      'grid min-h-11 cursor-pointer grid-cols-[auto_1fr] items-start gap-x-3 rounded-lg border-2 border-ink-300 bg-white p-3 has-checked:border-brine-700 has-checked:bg-brine-100 has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-brine-500',
  },
  // Large tiles in a wrapping row; the chosen one is filled and ticked.
  tiles: {
    list: 'mt-2 flex flex-wrap gap-2',
    option:
      'relative inline-flex min-h-12 cursor-pointer items-center gap-2 rounded-lg border-2 border-ink-300 bg-white px-4 py-2 font-bold text-ink-900 hover:border-ink-700 has-checked:border-ink-800 has-checked:bg-ink-800 has-checked:text-white has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-brine-500',
  },
  // Pictures in a grid, each a whole tile with its tick in a corner (choosing a photo).
  photos: {
    list: 'mt-2 grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-4',
    option:
      'relative block min-h-12 cursor-pointer overflow-hidden rounded-lg border-2 border-ink-300 bg-white text-ink-900 hover:border-ink-700 has-checked:border-brine-700 has-checked:ring-3 has-checked:ring-brine-700 has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-brine-500',
  },
  // A compact row of 44-px tiles, for view switches (chart window, units).
  compact: {
    list: 'flex flex-wrap gap-1',
    option:
      'relative inline-flex min-h-11 min-w-11 cursor-pointer items-center justify-center gap-1 rounded-lg border-2 border-ink-300 bg-white px-2.5 text-sm font-bold text-ink-900 hover:border-ink-700 has-checked:border-ink-800 has-checked:bg-ink-800 has-checked:text-white has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-brine-500',
  },
} as const;

/**
 * The one radio group: a fieldset of real radio inputs drawn as large targets. In the `tiles`,
 * `photos` and `compact` looks the input lies transparent over its whole tile, so a tap anywhere
 * lands on it.
 */
export function RadioGroup<V extends string>({
  legend,
  value,
  onChange,
  options,
  look = 'tiles',
  hint,
  error,
  hideLegend,
  name: givenName,
  className = '',
}: {
  legend: ReactNode;
  value: V | undefined;
  onChange: (value: V) => void;
  options: readonly RadioOption<V>[];
  look?: keyof typeof looks;
  hint?: ReactNode;
  error?: ReactNode;
  /** Hide the legend visually when the context already says it (screen readers still hear it). */
  hideLegend?: boolean;
  name?: string;
  className?: string;
}) {
  const id = useId();
  const name = givenName ?? id;
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const described = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ') || undefined;
  const { list, option } = looks[look];
  return (
    // The error is read with the group (aria-describedby); a radio input takes no aria-invalid.
    <fieldset
      className={`min-w-0 ${className}`}
      aria-describedby={described}
      aria-invalid={error ? true : undefined}
    >
      <legend
        className={
          hideLegend
            ? 'sr-only'
            : look === 'compact'
              ? 'mb-1 text-sm font-bold text-ink-900'
              : 'font-bold text-ink-900'
        }
      >
        {legend}
      </legend>
      {hint && (
        <p id={hintId} className="mt-1 text-sm text-ink-700">
          {hint}
        </p>
      )}
      <div className={list}>
        {options.map((choice) => (
          <label key={choice.value} className={option}>
            <input
              type="radio"
              name={name}
              value={choice.value}
              checked={value === choice.value}
              onChange={() => onChange(choice.value)}
              className={
                look === 'rows'
                  ? 'row-span-2 mt-0.5 h-5 w-5 accent-brine-700'
                  : 'peer absolute inset-0 h-full w-full cursor-pointer appearance-none rounded-lg opacity-0'
              }
            />
            {look === 'rows' ? (
              <>
                <span className="font-bold text-ink-900">{choice.label}</span>
                {choice.hint && <span className="text-sm text-ink-700">{choice.hint}</span>}
              </>
            ) : (
              <>
                <span
                  aria-hidden="true"
                  className={
                    look === 'photos'
                      ? 'absolute top-1.5 right-1.5 z-10 hidden h-8 w-8 items-center justify-center rounded-full bg-brine-700 font-bold text-white shadow-card peer-checked:flex'
                      : 'hidden peer-checked:inline'
                  }
                >
                  ✓
                </span>
                {choice.label}
              </>
            )}
          </label>
        ))}
      </div>
      {error && (
        <p id={errorId} className="mt-1 text-sm font-bold text-alert-700">
          {error}
        </p>
      )}
    </fieldset>
  );
}
