import { parseDecimal } from '../../../lib/decimal';

export interface FieldSpec {
  raw: string;
  label: string;
  /** Value used when the field is left blank; without it the field is required. */
  whenBlank?: number;
}

export type FieldErrors<F extends string> = Partial<Record<F, string>>;

export type ReadFields<F extends string> =
  { ok: true; values: Record<F, number> } | { ok: false; errors: FieldErrors<F>; missing: string[] };

/** Parses every field of a calculator at once, so all typing mistakes show together. */
export function readFields<F extends string>(spec: Record<F, FieldSpec>): ReadFields<F> {
  const values: Partial<Record<F, number>> = {};
  const errors: FieldErrors<F> = {};
  const missing: string[] = [];
  for (const field of Object.keys(spec) as F[]) {
    const { raw, label, whenBlank } = spec[field];
    const parsed = parseDecimal(raw);
    if (parsed.state === 'number') values[field] = parsed.value;
    else if (parsed.state === 'invalid') errors[field] = parsed.reason;
    else if (whenBlank !== undefined) values[field] = whenBlank;
    else missing.push(label);
  }
  if (Object.keys(errors).length > 0 || missing.length > 0) return { ok: false, errors, missing };
  return { ok: true, values: values as Record<F, number> };
}
