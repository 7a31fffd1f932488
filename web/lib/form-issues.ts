import { ApiError, type ApiIssue } from './api-client';

/** Field name → the first message for it; anything not tied to a known field goes to `other`. */
export interface FormIssues {
  fields: Partial<Record<string, string>>;
  other: string[];
}

/**
 * Groups issues by field. Server paths carry the request part (`body.email`); the same schema
 * run in the browser gives bare paths (`email`), so both land on the same field.
 */
export function groupIssues(issues: readonly ApiIssue[], knownFields: readonly string[]): FormIssues {
  const grouped: FormIssues = { fields: {}, other: [] };
  for (const issue of issues) {
    const field = issue.path.replace(/^body\.?/, '');
    if (knownFields.includes(field)) grouped.fields[field] ??= issue.message;
    else grouped.other.push(issue.message);
  }
  return grouped;
}

/** One sentence for a failed change, in the API's own words where it gave some. */
export function problemMessage(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 0) return 'Brinewatch could not be reached. Check your connection and try again.';
    if (error.status >= 400 && error.status < 500 && error.message) return error.message;
  }
  return 'That did not work. Please try again in a moment.';
}

/** Field errors from a 400, keyed by the path under `body` ("name", "displayVolume.value"). */
export function fieldErrors(issues: readonly { path: string; message: string }[]): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.replace(/^body\./, '');
    errors[key] ??= issue.message;
  }
  return errors;
}
