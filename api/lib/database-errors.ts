import { HttpError } from './http-error';

/** How long a client should wait before trying again while PostgreSQL is out of reach. */
export const databaseRetryAfterS = 5;

/** Node's socket errors for a server that is down, restarting or unreachable. */
const unreachableCodes = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'ENOTFOUND',
  'EAI_AGAIN',
]);

/*
 * SQLSTATEs from the PostgreSQL documentation, Appendix A "PostgreSQL Error Codes": class 08
 * (connection exception), 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now,
 * 53300 too_many_connections.
 */
const unavailableStates = new Set(['57P01', '57P02', '57P03', '53300']);

// node-postgres raises these without a code when the server goes away mid-conversation.
const lostConnection =
  /^(Connection terminated|Client has encountered a connection error|timeout exceeded when trying to connect)/;

interface Coded {
  code?: unknown;
  message?: unknown;
  cause?: unknown;
  errors?: unknown;
}

/** The error and what it wraps (Drizzle's DrizzleQueryError carries the driver's error as `cause`). */
function* chain(error: unknown): Generator<Coded> {
  let current: unknown = error;
  for (let depth = 0; depth < 5 && typeof current === 'object' && current !== null; depth++) {
    const coded = current as Coded;
    yield coded;
    // Node's happy-eyeballs connect reports each address it tried in an AggregateError.
    if (Array.isArray(coded.errors))
      for (const inner of coded.errors) if (typeof inner === 'object' && inner) yield inner as Coded;
    current = coded.cause;
  }
}

function isUnavailable({ code, message }: Coded): boolean {
  if (typeof code === 'string') {
    if (unreachableCodes.has(code) || unavailableStates.has(code) || /^08[0-9A-Z]{3}$/.test(code))
      return true;
  }
  return typeof message === 'string' && lostConnection.test(message);
}

function fromState(code: string): HttpError | null {
  // Class 22 "data exception": a value PostgreSQL cannot take (bad UTF-8 or NUL 22021, bad
  // text representation 22P02, out of range 22003, bad date/time 22007/22008, too long 22001).
  if (code.startsWith('22')) {
    return new HttpError(400, 'invalid_request', 'A value in the request cannot be stored.');
  }
  switch (code) {
    case '23505': // unique_violation
      return new HttpError(409, 'conflict', 'That already exists.');
    case '23503': // foreign_key_violation: refers to something gone, or is still referred to
      return new HttpError(
        409,
        'conflict',
        'That refers to something that does not exist or is still in use.',
      );
    case '23514': // check_violation
      return new HttpError(400, 'invalid_request', 'A value in the request is not allowed.');
    default:
      return null;
  }
}

export interface DatabaseProblem {
  error: HttpError;
  /** The SQLSTATE or socket code, for the log line (never the values, which may be personal). */
  code: string;
}

/**
 * A database error that escaped the schemas, as the answer it deserves: 503 while PostgreSQL is
 * out of reach (the caller retries), 400/409 for input it refused. Anything else is not ours to
 * name and stays a logged 500.
 */
export function databaseProblem(error: unknown): DatabaseProblem | null {
  for (const link of chain(error)) {
    if (isUnavailable(link)) {
      return {
        code: typeof link.code === 'string' ? link.code : 'connection-lost',
        error: new HttpError(
          503,
          'service_unavailable',
          'The service is briefly unavailable. Please try again in a few seconds.',
        ),
      };
    }
    // SQLSTATEs are five characters; Node's own codes start with E or ERR_.
    if (typeof link.code === 'string' && /^[0-9A-Z]{5}$/.test(link.code)) {
      const mapped = fromState(link.code);
      if (mapped) return { code: link.code, error: mapped };
    }
  }
  return null;
}
