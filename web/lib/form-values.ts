import { z } from 'zod';
import { parseDecimal } from './decimal';

/*
 * Form fields hold text; the shared request schemas want numbers and leave optional values out.
 * These turn one into the other inside a form's schema, so the resolver hands `onSubmit` exactly
 * what the API accepts.
 */

/**
 * A form field's text read as a number with `parseDecimal`, then checked by `number` (the shared
 * schema's own rule for that value). Empty text is `undefined`, so an optional value stays optional
 * and a required one says "Enter a number".
 */
export function decimalText<S extends z.ZodType = z.ZodNumber>(number?: S) {
  const read = z.string().transform((raw, context) => {
    const parsed = parseDecimal(raw);
    if (parsed.state === 'invalid') {
      context.addIssue({ code: 'custom', message: parsed.reason });
      return z.NEVER;
    }
    return parsed.state === 'empty' ? undefined : parsed.value;
  });
  const check =
    number ?? z.number({ error: (issue) => (issue.input === undefined ? 'Enter a number.' : undefined) });
  return read.pipe(check as unknown as z.ZodType<z.output<S>, number | undefined>);
}

/** A number as the text its field starts with ("" for none). */
export const decimalDefault = (value: number | null | undefined): string =>
  value === null || value === undefined ? '' : String(value);

/** Text where blank means "not given": "" and whitespace become `undefined` before `schema` runs. */
export function blankAsUndefined<S extends z.ZodType>(schema: S) {
  return z.preprocess(
    (value) => (typeof value === 'string' && value.trim() === '' ? undefined : value),
    schema,
  );
}

/**
 * Text where blank means "none": "" and whitespace become `null` before `schema` runs. For a change
 * (PATCH) a left-out value keeps the old one, so clearing a field has to send null.
 */
export function blankAsNull<S extends z.ZodType>(schema: S) {
  return z.preprocess((value) => (typeof value === 'string' && value.trim() === '' ? null : value), schema);
}
