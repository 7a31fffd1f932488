import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

/*
 * Form fields: a visible label, an optional hint, the error read out with the field, and targets
 * at least 48 px tall for a wet thumb.
 */

const controlClass = (error?: string) =>
  `mt-1 min-h-12 w-full min-w-0 rounded-lg border-2 bg-white px-3 text-base text-ink-950 ${
    error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
  }`;

interface FieldFrameProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  children: (described: string | undefined) => ReactNode;
  className?: string;
}

function FieldFrame({ id, label, hint, error, children, className = '' }: FieldFrameProps) {
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const described = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`min-w-0 ${className}`}>
      <label htmlFor={id} className="block font-bold text-ink-900">
        {label}
      </label>
      {hint && (
        <p id={hintId} className="mt-0.5 text-sm text-ink-700">
          {hint}
        </p>
      )}
      {children(described)}
      {error && (
        <FieldError id={errorId} className="mt-1">
          {error}
        </FieldError>
      )}
    </div>
  );
}

/**
 * A field's problem, beside the field, marked by a shape and bold text as well as colour. The
 * fields in this file sit it closer to their control (`mt-1`) than a free-standing message.
 */
export function FieldError({
  id,
  className = 'mt-2',
  children,
}: {
  id?: string;
  className?: string;
  children: ReactNode;
}) {
  return (
    <p id={id} className={`${className} flex items-start gap-2 text-sm font-bold text-alert-700`}>
      <span
        aria-hidden="true"
        className="mt-0.5 flex h-4 w-4 shrink-0 items-center justify-center rounded-full bg-alert-700 text-xs text-white"
      >
        !
      </span>
      <span>{children}</span>
    </p>
  );
}

type TextFieldProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'onChange' | 'value'> & {
  label: ReactNode;
  value: string;
  onChange: (value: string) => void;
  hint?: ReactNode;
  error?: string;
  className?: string;
};

export function TextField({ label, value, onChange, hint, error, className, ...input }: TextFieldProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      {(described) => (
        <input
          id={id}
          value={value}
          onChange={(event) => onChange(event.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={described}
          className={controlClass(error)}
          {...input}
        />
      )}
    </FieldFrame>
  );
}

export function TextAreaField({
  label,
  value,
  onChange,
  hint,
  error,
  rows = 3,
  maxLength,
}: {
  label: ReactNode;
  value: string;
  onChange: (value: string) => void;
  hint?: ReactNode;
  error?: string;
  rows?: number;
  maxLength?: number;
}) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error}>
      {(described) => (
        <textarea
          id={id}
          value={value}
          rows={rows}
          maxLength={maxLength}
          onChange={(event) => onChange(event.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={described}
          className={`${controlClass(error)} py-2`}
        />
      )}
    </FieldFrame>
  );
}

type SelectFieldProps = Omit<SelectHTMLAttributes<HTMLSelectElement>, 'onChange' | 'value'> & {
  label: ReactNode;
  value: string;
  onChange: (value: string) => void;
  options: readonly { value: string; label: string }[];
  hint?: ReactNode;
  error?: string;
  className?: string;
};

export function SelectField({
  label,
  value,
  onChange,
  options,
  hint,
  error,
  className,
  ...select
}: SelectFieldProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      {(described) => (
        <select
          id={id}
          value={value}
          onChange={(event) => onChange(event.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={described}
          className={controlClass(error)}
          {...select}
        >
          {options.map((option) => (
            <option key={option.value} value={option.value}>
              {option.label}
            </option>
          ))}
        </select>
      )}
    </FieldFrame>
  );
}

export function CheckboxField({
  label,
  checked,
  onChange,
  hint,
}: {
  label: ReactNode;
  checked: boolean;
  onChange: (checked: boolean) => void;
  hint?: ReactNode;
}) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="flex min-h-11 cursor-pointer items-center gap-3 font-bold text-ink-900">
        <input
          id={id}
          type="checkbox"
          checked={checked}
          onChange={(event) => onChange(event.target.checked)}
          aria-describedby={hint ? `${id}-hint` : undefined}
          className="h-6 w-6 shrink-0 accent-brine-700"
        />
        {label}
      </label>
      {hint && (
        <p id={`${id}-hint`} className="ml-9 text-sm text-ink-700">
          {hint}
        </p>
      )}
    </div>
  );
}
