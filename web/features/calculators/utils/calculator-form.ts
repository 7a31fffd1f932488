import { useEffect } from 'react';
import { useWatch, type FieldValues } from 'react-hook-form';
import { z } from 'zod';
import { useZodForm } from '../../../components/form';
import { decimalText } from '../../../lib/form-values';
import type { FieldErrors, ResultStatus } from './result-status';

/*
 * A calculator is a form that is never sent: its schema reads the typed text, works the result out
 * and puts each problem under the field it concerns, and the page shows that result as it is typed.
 */

/** What a calculator's schema hands back: the result, or why there is none yet. */
export type Outcome<R> = {
  status: ResultStatus;
  result?: R;
};

/** A calculator entry: a number, or nothing yet (the result panel then asks for it, not the field). */
export const entry = decimalText(z.number().optional());

/** All entries filled in, or the labels of those still empty, in the order given. */
export function filledIn<F extends string>(
  values: Record<F, number | undefined>,
  labels: Record<F, string>,
): { ok: true; values: Record<F, number> } | { ok: false; missing: string[] } {
  const missing = (Object.keys(labels) as F[])
    .filter((field) => values[field] === undefined)
    .map((field) => labels[field]);
  return missing.length > 0 ? { ok: false, missing } : { ok: true, values: values as Record<F, number> };
}

/** Puts worked-out problems under their fields; the schema then has no result to give. */
export function problemsAt<F extends string>(context: z.RefinementCtx, errors: FieldErrors<F>): never {
  for (const [field, message] of Object.entries(errors)) {
    context.addIssue({ code: 'custom', path: [field], message: String(message) });
  }
  return z.NEVER;
}

const marked: ResultStatus = { kind: 'problem', message: 'Check the entries marked above.' };

/**
 * The calculator's form (checked as typed) and its outcome for the values on screen. Every field is
 * checked again on each change, as a problem often comes from another field than the one typed in
 * (a temperature out of range once the salinity says fresh water).
 */
export function useCalculatorForm<I extends FieldValues, R>(
  schema: z.ZodType<Outcome<R>, I>,
  defaultValues: NoInfer<I>,
) {
  const form = useZodForm(schema, { mode: 'onChange', defaultValues: defaultValues as never });
  // Every field has a default, so the watched values are whole.
  const values = useWatch({ control: form.control }) as I;
  useEffect(() => {
    const { unsubscribe } = form.watch(() => void form.trigger());
    return unsubscribe;
  }, [form]);
  const parsed = schema.safeParse(values);
  const outcome: Outcome<R> = parsed.success ? parsed.data : { status: marked };
  return { form, values, outcome };
}

/** Enter in a field sends nothing — the result is already shown — but moves to an entry marked wrong. */
export const resultIsLive = () => undefined;
