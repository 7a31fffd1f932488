import { ApiError } from './api-client';

/** One sentence for a failed change, in the API's own words where it gave some. */
export function problemMessage(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 0) return 'Brinewatch could not be reached. Check your connection and try again.';
    if (error.status >= 400 && error.status < 500 && error.message) return error.message;
  }
  return 'That did not work. Please try again in a moment.';
}
