import { pino, type DestinationStream, type Logger } from 'pino';

export type { DestinationStream, Logger };

/**
 * Every log line goes through here (OWASP ASVS 5.0 V16: logs hold no secrets or personal data
 * beyond what an investigation needs). Beside the serializers below, which keep secrets out of
 * what we log, e-mail addresses are masked in the finished line whatever wrote them.
 */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  return pino(
    {
      level,
      serializers: { err: safeError },
      redact: {
        paths: [
          'req.headers.cookie',
          'req.headers.authorization',
          'res.headers["set-cookie"]',
          '*.password',
          '*.token',
          '*.params',
          '*.parameters',
        ],
        remove: true,
      },
    },
    withoutEmailAddresses(destination ?? pino.destination(1)),
  );
}

const emailAddress = /[\w.+-]+@[a-z\d-]+(\.[a-z\d-]+)*\.[a-z]{2,}/gi;

export function maskEmailAddresses(text: string): string {
  return text.replace(emailAddress, '[email]');
}

function withoutEmailAddresses(destination: DestinationStream & { flush?: () => void }) {
  return {
    write: (line: string) => destination.write(maskEmailAddresses(line)),
    flush: () => destination.flush?.(),
  };
}

/** Paths whose query or last segment carries a secret: the invitation link, the calendar feed, the OIDC callback. */
const secretSegment = /^(\/auth\/invitation\/|\/api\/calendar\/)[^/?#]+/;
const queryNamesOnly = /^\/auth\//;
const secretQueryName = /token|code|state|secret|password|key|auth|sig|email|nonce|session/i;

/**
 * A request URL fit for the log: the invitation and calendar feed tokens leave the path; under /auth/ (the OIDC
 * callback's `code` and `state`, a login's `returnTo`) only the names of query parameters stay;
 * elsewhere the values of parameters whose names suggest a secret are dropped.
 */
export function loggableUrl(url: string): string {
  const queryAt = url.indexOf('?');
  const path = (queryAt === -1 ? url : url.slice(0, queryAt)).replace(secretSegment, '$1[token]');
  if (queryAt === -1) return path;
  const query = new URLSearchParams(url.slice(queryAt + 1));
  const namesOnly = queryNamesOnly.test(path);
  const parts = [...query].map(([name, value]) =>
    namesOnly || secretQueryName.test(name)
      ? `${encodeURIComponent(name)}=[redacted]`
      : `${encodeURIComponent(name)}=${encodeURIComponent(value)}`,
  );
  return `${path}?${parts.join('&')}`;
}

/**
 * PostgreSQL error fields that name what failed without repeating the data. `detail` ("Key
 * (email)=(…) already exists"), `where` and `internalQuery` can quote values, so they stay out.
 */
const databaseFields = ['code', 'severity', 'constraint', 'table', 'column', 'schema', 'routine'] as const;

interface SafeError {
  type: string;
  message: string;
  stack?: string;
  code?: unknown;
  query?: string;
  cause?: SafeError;
  [field: string]: unknown;
}

/**
 * The `err` serializer. A failed Drizzle query carries its bound parameters (`params`, and its
 * message ends with them), which hold token hashes, e-mail addresses and push endpoints: they are
 * cut. Only a known set of fields is copied, so an error from a mail or HTTP client cannot bring
 * its recipients or headers along.
 */
export function safeError(value: unknown, depth = 0): unknown {
  // pino-http hands its serializer pino's own serialization, with the error itself as `raw`.
  const raw = (value as { raw?: unknown } | null)?.raw;
  const error = isErrorLike(raw) ? raw : value;
  if (!isErrorLike(error)) return error;
  const message = maskEmailAddresses(withoutParams(error.message));
  const safe: SafeError = {
    type: error.constructor?.name ?? error.name ?? 'Error',
    message,
  };
  if (typeof error.stack === 'string') {
    // The stack's first lines repeat the message, parameters and all.
    safe.stack = maskEmailAddresses(error.stack.replace(error.message, message));
  }
  const fields = error as unknown as Record<string, unknown>;
  for (const field of databaseFields) {
    if (typeof fields[field] === 'string' || typeof fields[field] === 'number') safe[field] = fields[field];
  }
  // Drizzle's SQL text uses $1, $2… placeholders, never the values.
  if (typeof fields.query === 'string') safe.query = fields.query;
  if (depth < 3 && isErrorLike(fields.cause)) safe.cause = safeError(fields.cause, depth + 1) as SafeError;
  return safe;
}

function isErrorLike(value: unknown): value is Error {
  return typeof value === 'object' && value !== null && typeof (value as Error).message === 'string';
}

/** DrizzleQueryError's message is "Failed query: <sql>\nparams: <values>". */
function withoutParams(message: string): string {
  const at = message.search(/\n\s*(params|parameters):/);
  return at === -1 ? message : message.slice(0, at);
}
