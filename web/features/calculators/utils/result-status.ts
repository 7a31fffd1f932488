import type { FieldErrors } from './read-fields';

export type ResultStatus =
  { kind: 'ready' } | { kind: 'missing'; labels: string[] } | { kind: 'problem'; message: string };

export function hasErrors<F extends string>(errors: FieldErrors<F>): boolean {
  return Object.keys(errors).length > 0;
}

/** What the result panel says while the fields can't be worked out yet. */
export function notReady<F extends string>(errors: FieldErrors<F>, missing: string[]): ResultStatus {
  if (hasErrors(errors)) return { kind: 'problem', message: 'Check the entries marked above.' };
  return { kind: 'missing', labels: missing };
}
