import { useId, type InputHTMLAttributes, type Ref } from 'react';
import { FieldError } from './field-error';

type TextFieldProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'className' | 'id'> & {
  label: string;
  hint?: string;
  error?: string;
  ref?: Ref<HTMLInputElement>;
};

export function TextField({ label, hint, error, ref, ...input }: TextFieldProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint && hintId, error && errorId].filter(Boolean).join(' ');
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
      <input
        ref={ref}
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy || undefined}
        className={`mt-2 min-h-12 w-full min-w-0 rounded-lg border-2 bg-white px-3 text-base text-ink-950 ${
          error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
        }`}
        {...input}
      />
      {error && <FieldError id={errorId}>{error}</FieldError>}
    </div>
  );
}
