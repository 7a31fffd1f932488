import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';
import { useController, useFormContext, type FieldValues, type Path } from 'react-hook-form';
import { FieldError } from './field-error';
import { RadioGroup, type RadioOption } from './radio-group';

/*
 * The one set of form fields. Each sits inside a `<Form>` (components/form.tsx) and is bound by
 * `name` to a field of its schema, so its value, its error (from the schema or the server) and
 * its focus on error come from the form. A visible label, an optional hint, the error read out
 * with the field, and targets at least 48 px tall for a wet thumb.
 */

const controlClass = (error?: string) =>
  `mt-1 min-h-12 w-full min-w-0 rounded-lg border-2 bg-white px-3 text-base text-ink-950 disabled:bg-ink-50 ${
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

/** The bound field's value, change handler, ref and error message. */
function useBoundField<T extends FieldValues>(name: Path<T>) {
  const { control } = useFormContext<T>();
  const { field, fieldState } = useController<T>({ name, control });
  return { field, error: fieldState.error?.message };
}

interface BoundProps<T extends FieldValues> {
  name: Path<T>;
  label: ReactNode;
  hint?: ReactNode;
  className?: string;
}

type InputProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'name' | 'value' | 'onChange' | 'onBlur'>;

export function TextField<T extends FieldValues = FieldValues>({
  name,
  label,
  hint,
  className,
  suffix,
  ...input
}: BoundProps<T> & InputProps & { suffix?: ReactNode }) {
  const id = useId();
  const { field, error } = useBoundField<T>(name);
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      {(described) => {
        const control = (
          <input
            id={id}
            name={field.name}
            ref={field.ref}
            value={(field.value as string | undefined) ?? ''}
            onChange={(event) => field.onChange(event.target.value)}
            onBlur={field.onBlur}
            aria-invalid={error ? true : undefined}
            aria-describedby={described}
            className={controlClass(error)}
            {...input}
          />
        );
        if (!suffix) return control;
        return (
          <div className="flex items-end gap-2">
            {control}
            <span className="mb-3 shrink-0 font-bold text-ink-700">{suffix}</span>
          </div>
        );
      }}
    </FieldFrame>
  );
}

/**
 * A number typed as text, so a phone's decimal comma ("7,5") works; the form schema reads it with
 * `decimalText` (lib/decimal.ts). `suffix` shows the unit beside the box.
 */
export function DecimalField<T extends FieldValues = FieldValues>(
  props: BoundProps<T> & InputProps & { suffix?: ReactNode },
) {
  return <TextField<T> inputMode="decimal" autoComplete="off" spellCheck={false} {...props} />;
}

export function TextAreaField<T extends FieldValues = FieldValues>({
  name,
  label,
  hint,
  className,
  rows = 3,
  maxLength,
  placeholder,
  required,
}: BoundProps<T> & { rows?: number; maxLength?: number; placeholder?: string; required?: boolean }) {
  const id = useId();
  const { field, error } = useBoundField<T>(name);
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      {(described) => (
        <textarea
          id={id}
          name={field.name}
          ref={field.ref}
          value={(field.value as string | undefined) ?? ''}
          onChange={(event) => field.onChange(event.target.value)}
          onBlur={field.onBlur}
          rows={rows}
          maxLength={maxLength}
          placeholder={placeholder}
          aria-required={required || undefined}
          aria-invalid={error ? true : undefined}
          aria-describedby={described}
          className={`${controlClass(error)} py-2`}
        />
      )}
    </FieldFrame>
  );
}

export function SelectField<T extends FieldValues = FieldValues>({
  name,
  label,
  hint,
  className,
  options,
  ...select
}: BoundProps<T> &
  Omit<SelectHTMLAttributes<HTMLSelectElement>, 'name' | 'value' | 'onChange' | 'onBlur'> & {
    options: readonly { value: string; label: string }[];
  }) {
  const id = useId();
  const { field, error } = useBoundField<T>(name);
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      {(described) => (
        <select
          id={id}
          name={field.name}
          ref={field.ref}
          value={(field.value as string | undefined) ?? ''}
          onChange={(event) => field.onChange(event.target.value)}
          onBlur={field.onBlur}
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

export function CheckboxField<T extends FieldValues = FieldValues>({
  name,
  label,
  hint,
  className = '',
}: BoundProps<T>) {
  const id = useId();
  const { field, error } = useBoundField<T>(name);
  // Taken apart first: the React Compiler's lint reads every property of an object holding a ref as a ref.
  const { ref, value, onChange, onBlur } = field;
  const described = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <div className={className}>
      <label htmlFor={id} className="flex min-h-11 cursor-pointer items-center gap-3 font-bold text-ink-900">
        <input
          id={id}
          type="checkbox"
          name={name}
          ref={ref}
          checked={Boolean(value)}
          onChange={(event) => onChange(event.target.checked)}
          onBlur={onBlur}
          aria-invalid={error ? true : undefined}
          aria-describedby={described || undefined}
          className="h-6 w-6 shrink-0 accent-brine-700"
        />
        {label}
      </label>
      {hint && (
        <p id={`${id}-hint`} className="ml-9 text-sm text-ink-700">
          {hint}
        </p>
      )}
      {error && (
        <FieldError id={`${id}-error`} className="mt-1 ml-9">
          {error}
        </FieldError>
      )}
    </div>
  );
}

/** Several ticks bound to one array field (the tank's owners, a species' waters): it holds the ticked values. */
export function CheckboxGroupField<T extends FieldValues = FieldValues>({
  name,
  label,
  hint,
  className = '',
  options,
  columns = '',
}: BoundProps<T> & {
  options: readonly { value: string; label: ReactNode }[];
  /** Classes laying the ticks out, e.g. "grid gap-1 sm:grid-cols-2". */
  columns?: string;
}) {
  const id = useId();
  const { field, error } = useBoundField<T>(name);
  const chosen = (field.value as string[] | undefined) ?? [];
  const described = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <fieldset className={`min-w-0 ${className}`} aria-describedby={described || undefined}>
      <legend className="px-1 font-bold text-ink-900">{label}</legend>
      {hint && (
        <p id={`${id}-hint`} className="text-sm text-ink-700">
          {hint}
        </p>
      )}
      <div className={columns}>
        {options.map((option, index) => (
          <label
            key={option.value}
            className="flex min-h-11 cursor-pointer items-center gap-3 font-bold text-ink-900"
          >
            <input
              type="checkbox"
              name={field.name}
              value={option.value}
              ref={index === 0 ? field.ref : undefined}
              checked={chosen.includes(option.value)}
              onChange={(event) =>
                field.onChange(
                  event.target.checked
                    ? [...chosen, option.value]
                    : chosen.filter((value) => value !== option.value),
                )
              }
              onBlur={field.onBlur}
              className="h-6 w-6 shrink-0 accent-brine-700"
            />
            {option.label}
          </label>
        ))}
      </div>
      {error && (
        <FieldError id={`${id}-error`} className="mt-1">
          {error}
        </FieldError>
      )}
    </fieldset>
  );
}

/** The one radio group (components/radio-group.tsx) bound to a form field. */
export function RadioGroupField<T extends FieldValues = FieldValues, V extends string = string>({
  name,
  label,
  hint,
  className,
  options,
  look,
}: BoundProps<T> & {
  options: readonly RadioOption<V>[];
  look?: 'rows' | 'tiles' | 'compact';
}) {
  const { field, error } = useBoundField<T>(name);
  return (
    <RadioGroup<V>
      legend={label}
      hint={hint}
      error={error}
      className={className}
      look={look}
      name={field.name}
      value={field.value as V | undefined}
      onChange={field.onChange}
      options={options}
    />
  );
}
