import { zodResolver } from '@hookform/resolvers/zod';
import type { FormHTMLAttributes, ReactNode } from 'react';
import {
  FormProvider,
  useForm,
  useFormContext,
  type FieldValues,
  type UseFormProps,
  type UseFormReturn,
} from 'react-hook-form';
import type { z } from 'zod';
import { applyServerIssues } from '../lib/form-issues';
import { Button } from './button';
import { FieldError } from './field-error';

/*
 * The one form pattern: react-hook-form with the zod resolver over a shared schema (or a form
 * schema that turns typed text into the shared schema's values), fields from form-fields.tsx bound
 * by name, and the API's 400 `issues` put under their fields by `applyServerIssues`.
 */

type FormSchema = z.ZodType<FieldValues, FieldValues>;

export type ZodForm<S extends FormSchema> = UseFormReturn<z.input<S>, unknown, z.output<S>>;

/** A react-hook-form form checked by `schema`; errors show on submit and clear as they are fixed. */
export function useZodForm<S extends FormSchema>(
  schema: S,
  options: Omit<UseFormProps<z.input<S>, unknown, z.output<S>>, 'resolver'> = {},
): ZodForm<S> {
  return useForm<z.input<S>, unknown, z.output<S>>({
    resolver: zodResolver(schema),
    // Checked on submit, then again as a refused field is corrected. Checking as a field is left
    // would show its message and push the submit button down between press and release, so a
    // tap on the button would miss it.
    mode: 'onSubmit',
    reValidateMode: 'onChange',
    ...options,
  });
}

/**
 * Wraps a form: provides it to the fields, checks it with its schema, hands `onSubmit` the parsed
 * values, and puts any error `onSubmit` throws (an ApiError from a mutation) under the fields it
 * names, or above the submit button when it names none.
 */
export function Form<TInput extends FieldValues, TOutput extends FieldValues>({
  form,
  onSubmit,
  fieldFor,
  children,
  ...props
}: Omit<FormHTMLAttributes<HTMLFormElement>, 'onSubmit'> & {
  form: UseFormReturn<TInput, unknown, TOutput>;
  onSubmit: (values: TOutput) => unknown;
  /** Renames a server issue's path where the form is shaped differently from the request. */
  fieldFor?: (path: string) => string | null;
  children: ReactNode;
}) {
  return (
    <FormProvider {...form}>
      <form
        noValidate
        {...props}
        onSubmit={(event) =>
          void form.handleSubmit(async (values) => {
            try {
              await onSubmit(values);
            } catch (error) {
              applyServerIssues(form, error, fieldFor);
            }
          })(event)
        }
      >
        {children}
      </form>
    </FormProvider>
  );
}

/** The form-wide problem (a failed request, an issue no field owns), read out when it appears. */
export function FormProblem({ className = '' }: { className?: string }) {
  const {
    formState: { errors },
  } = useFormContext();
  const message = errors.root?.server?.message ?? errors.root?.message;
  return (
    <div role="alert" className={className}>
      {message && <FieldError>{String(message)}</FieldError>}
    </div>
  );
}

/** The submit button: disabled and relabelled while the form is being sent. */
export function SubmitButton({
  children,
  pending,
  tone,
  className,
  disabled = false,
}: {
  children: ReactNode;
  /** What it says while sending, e.g. "Saving…". */
  pending: ReactNode;
  tone?: 'primary' | 'secondary' | 'danger';
  className?: string;
  /** Held back until the form can be sent, e.g. until warnings are acknowledged. */
  disabled?: boolean;
}) {
  const {
    formState: { isSubmitting },
  } = useFormContext();
  return (
    <Button type="submit" tone={tone} disabled={disabled || isSubmitting} className={className}>
      {isSubmitting ? pending : children}
    </Button>
  );
}
