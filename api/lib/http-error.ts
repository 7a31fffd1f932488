export interface ErrorIssue {
  path: string;
  message: string;
}

/** The one error type handlers throw; the error handler turns it into `{ error: { code, message, issues? } }`. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues?: ErrorIssue[],
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const notFound = (what = 'resource') => new HttpError(404, 'not_found', `No such ${what}.`);
export const forbidden = (message = 'You are not allowed to do that.') =>
  new HttpError(403, 'forbidden', message);
export const unauthorized = (message = 'Sign in to continue.') =>
  new HttpError(401, 'unauthenticated', message);
export const conflict = (code: string, message: string) => new HttpError(409, code, message);
export const badRequest = (code: string, message: string, issues?: ErrorIssue[]) =>
  new HttpError(400, code, message, issues);
