import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { describeBounds, outOfRangeDetails } from '@shared/chemistry/index';
import { databaseProblem, databaseRetryAfterS } from '../lib/database-errors';
import { HttpError } from '../lib/http-error';
import { issuesFrom } from '../lib/route';

/** Errors raised by body-parser carry a `type` and a status; we name them in our own words. */
interface ParserError {
  type: string;
  status?: number;
  limit?: number;
}

function isParserError(error: unknown): error is ParserError {
  return typeof error === 'object' && error !== null && typeof (error as ParserError).type === 'string';
}

function outOfRangeMessage(error: RangeError): string {
  const refused = outOfRangeDetails(error);
  const bounds = refused && describeBounds(refused.bounds);
  if (!refused || bounds === undefined) {
    return 'A value is outside what Brinewatch can work with. Check the numbers and their units.';
  }
  return `A value of ${refused.value} is outside what Brinewatch can work with: it must be ${bounds}. Check the numbers and their units.`;
}

function toHttpError(error: unknown): HttpError | null {
  if (error instanceof HttpError) return error;
  if (error instanceof ZodError) {
    return new HttpError(400, 'invalid_request', 'Some fields need attention.', issuesFrom(error, 'body'));
  }
  // The chemistry core throws RangeError for values outside an equation's validity. Its message
  // names the equation and the argument's code name; the answer says what a person can act on.
  if (error instanceof RangeError) return new HttpError(400, 'out_of_range', outOfRangeMessage(error));
  if (isParserError(error)) {
    switch (error.type) {
      case 'entity.parse.failed':
        return new HttpError(400, 'malformed_json', 'The request body is not valid JSON.');
      case 'entity.too.large':
        return new HttpError(413, 'payload_too_large', 'The request body is too large.');
      case 'encoding.unsupported':
      case 'charset.unsupported':
        return new HttpError(415, 'unsupported_encoding', 'The request body encoding is not supported.');
      default:
        if (error.status && error.status >= 400 && error.status < 500) {
          return new HttpError(error.status, 'bad_request', 'The request could not be read.');
        }
    }
  }
  // The router's own refusals, such as a path segment that is not valid percent-encoding, carry a 4xx.
  const status = (error as { status?: unknown } | null)?.status;
  if (error instanceof Error && typeof status === 'number' && status >= 400 && status < 500) {
    return new HttpError(status, 'bad_request', 'The request could not be read.');
  }
  return null;
}

export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  let known = toHttpError(error);
  if (!known) {
    const database = databaseProblem(error);
    if (database) {
      known = database.error;
      // A 503 is the outage itself; a 400/409 from PostgreSQL means a schema let something through.
      req.log.warn({ dbCode: database.code, status: known.status }, 'database refused the request');
      if (known.status === 503 && !res.headersSent) res.setHeader('Retry-After', String(databaseRetryAfterS));
    } else req.log.error({ err: error }, 'unhandled error');
  }
  const status = known?.status ?? 500;
  const body = known
    ? { code: known.code, message: known.message, ...(known.issues ? { issues: known.issues } : {}) }
    : { code: 'internal_error', message: 'Something went wrong on our side. Please try again.' };
  if (res.headersSent) return;
  res.status(status).json({ error: body });
};

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'route_not_found', `No API route for ${req.method} ${req.path}.`));
};

const bodyMethods = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** A body we cannot read is refused up front rather than silently ignored. */
export function requireContentType(allowed: string[]): RequestHandler {
  return (req, _res, next) => {
    const hasBody =
      Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined;
    if (bodyMethods.has(req.method) && hasBody && !req.is(allowed)) {
      next(new HttpError(415, 'unsupported_media_type', `Send the body as ${allowed.join(' or ')}.`));
      return;
    }
    next();
  };
}
