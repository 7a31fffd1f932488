export type FieldErrors<F extends string> = Partial<Record<F, string>>;

export type ResultStatus =
  { kind: 'ready' } | { kind: 'missing'; labels: string[] } | { kind: 'problem'; message: string };

export function hasErrors<F extends string>(errors: FieldErrors<F>): boolean {
  return Object.keys(errors).length > 0;
}
