import { useId, type Ref } from 'react';
import { FieldError } from '../../../components/form-fields';

interface NoteFieldProps {
  label: string;
  hint?: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  required?: boolean;
  ref?: Ref<HTMLTextAreaElement>;
}

export function NoteField({ label, hint, value, onChange, error, required, ref }: NoteFieldProps) {
  const id = useId();
  const describedBy = [hint && `${id}-hint`, error && `${id}-error`].filter(Boolean).join(' ');
  return (
    <div>
      <label htmlFor={id} className="block font-bold text-ink-900">
        {label}
      </label>
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-sm text-ink-700">
          {hint}
        </p>
      )}
      <textarea
        ref={ref}
        id={id}
        value={value}
        onChange={(event) => onChange(event.target.value)}
        rows={3}
        maxLength={1000}
        aria-required={required || undefined}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy || undefined}
        className={`mt-2 w-full min-w-0 rounded-lg border-2 bg-white px-3 py-2 text-base text-ink-950 ${
          error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
        }`}
      />
      {error && <FieldError id={`${id}-error`}>{error}</FieldError>}
    </div>
  );
}
