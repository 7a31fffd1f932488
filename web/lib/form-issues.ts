import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import { ApiError } from './api-client';
import { problemMessage } from './problem-message';

/**
 * Puts a failed request's problems on the form: each of a 400's `issues` under the field its path
 * names (server paths carry the request part, `body.displayVolume.value`, which is dropped), focus
 * on the first such field, and whatever names no field of this form in the form-wide problem.
 * Field names follow the shared request schema, so a form whose fields mirror it needs no mapping;
 * `fieldFor` renames a server path where the form is shaped differently.
 */
export function applyServerIssues<T extends FieldValues>(
  form: Pick<UseFormReturn<T, unknown, FieldValues>, 'setError' | 'getValues'>,
  error: unknown,
  fieldFor: (path: string) => string | null = (path) => path,
): void {
  const unplaced: string[] = [];
  const placed = new Set<string>();
  if (error instanceof ApiError && error.status === 400 && error.issues.length > 0) {
    const values = form.getValues() as Record<string, unknown>;
    for (const issue of error.issues) {
      const field = fieldFor(issue.path.replace(/^(body|query|params)\.?/, ''));
      if (field && hasPath(values, field)) {
        // The first message for a field is the one shown; focus goes to the first field named.
        if (placed.has(field)) continue;
        form.setError(
          field as Path<T>,
          { type: 'server', message: issue.message },
          { shouldFocus: placed.size === 0 },
        );
        placed.add(field);
      } else unplaced.push(issue.message);
    }
    if (unplaced.length === 0) return;
  }
  form.setError('root.server', {
    type: 'server',
    message: unplaced.length > 0 ? unplaced.join(' ') : problemMessage(error),
  });
}

function hasPath(values: Record<string, unknown>, path: string): boolean {
  let current: unknown = values;
  for (const part of path.split('.')) {
    if (current === null || typeof current !== 'object' || !(part in current)) return false;
    current = (current as Record<string, unknown>)[part];
  }
  return true;
}
