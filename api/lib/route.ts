import { pipeline } from 'node:stream/promises';
import { Readable } from 'node:stream';
import type { Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import { depsOf, type AppDeps } from '../deps';
import { requireActor } from '../policy/index';
import type { Actor } from '../services/actors';
import type { DeviceIdentity } from '../services/devices';
import { HttpError, unauthorized, type ErrorIssue } from './http-error';

/** The shared zod schemas a route parses its request parts with. */
export interface Schemas {
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
}

type PartOf<S, K extends keyof Schemas> = S extends { [P in K]: infer T extends z.ZodType }
  ? z.infer<T>
  : undefined;

/** The parsed request parts, typed from the schemas; a part without a schema is `undefined`. */
export interface Parsed<S extends Schemas> {
  params: PartOf<S, 'params'>;
  query: PartOf<S, 'query'>;
  body: PartOf<S, 'body'>;
}

/** What every handler may use besides its parsed input: the deps and the few request facts some need. */
export interface RequestContext<S extends Schemas> extends Parsed<S> {
  deps: AppDeps;
  requestId: string;
  /** The caller's address (behind the trusted proxy, its X-Forwarded-For) and browser, for the audit trail. */
  ip: string | null;
  userAgent: string | null;
  /** The request's logger (its lines carry the request id). */
  log: Request['log'];
  /** The express-session data; read through a getter, as regenerating replaces it. */
  readonly session: Request['session'];
  /** The uploaded file, where a multipart middleware ran before the handler. */
  file: Request['file'];
  originalUrl: string;
  /** The body's bytes as received, where a raw parser ran (the payment provider's signed webhook). */
  rawBody: Buffer | undefined;
  header(name: string): string | undefined;
  setHeader(name: string, value: string): void;
}

export type SignedInContext<S extends Schemas> = RequestContext<S> & { actor: Actor };
export type OpenContext<S extends Schemas> = RequestContext<S> & { actor: Actor | null };
export type DeviceContext<S extends Schemas> = RequestContext<S> & { device: DeviceIdentity };

/**
 * An answer other than "200 with this JSON". Handlers return one of the helpers below; anything
 * else they return is sent as JSON with status 200.
 */
export class Reply {
  constructor(readonly send: (res: Response, req: Request) => void | Promise<void>) {}
}

export const withStatus = (status: number, body: unknown) =>
  new Reply((res) => void res.status(status).json(body));
export const created = (body: unknown) => withStatus(201, body);
export const noContent = () => new Reply((res) => void res.status(204).end());
/** 303, so the browser follows with a GET whatever method brought it here. */
export const redirect = (location: string) => new Reply((res) => res.redirect(303, location));

/**
 * A body too large to hold in memory (a photo, a CSV export), written with back-pressure. A reader
 * who goes away mid-body closes the source too, so no storage connection or query is left open.
 */
export function streamed(headers: Record<string, string>, body: Readable | AsyncIterable<string>): Reply {
  return new Reply(async (res) => {
    for (const [name, value] of Object.entries(headers)) res.setHeader(name, value);
    const source = body instanceof Readable ? body : Readable.from(body);
    try {
      await pipeline(source, res);
    } catch (error) {
      if ((error as { code?: string }).code === 'ERR_STREAM_PREMATURE_CLOSE') return;
      throw error;
    }
  });
}

const sseHeartbeatMs = 25_000;

/** Ends the subscription; null where this process has nothing to stream. */
export type Unsubscribe = () => void;
export type SendEvent = (event: string, data: unknown) => void;

/**
 * Server-Sent Events: the frames, the reconnect delay and a heartbeat that keeps proxies from
 * closing a quiet stream. `subscribe` starts the events and returns how to stop them.
 */
export function eventStream(subscribe: (send: SendEvent) => Unsubscribe | null): Reply {
  return new Reply((res, req) => {
    res.writeHead(200, {
      'Content-Type': 'text/event-stream; charset=utf-8',
      'Cache-Control': 'no-store',
      Connection: 'keep-alive',
      'X-Accel-Buffering': 'no',
    });
    res.write('retry: 5000\n\n');
    res.write(`event: ready\ndata: {}\n\n`);
    const stop = subscribe((event, data) => res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`));
    if (!stop) return;
    const heartbeat = setInterval(() => res.write(': keep-alive\n\n'), sseHeartbeatMs);
    req.on('close', () => {
      clearInterval(heartbeat);
      stop();
    });
  });
}

type Answer = NonNullable<unknown>;
type Handler<C> = (ctx: C) => Answer | Promise<Answer>;

export function issuesFrom(error: z.ZodError, prefix: string): ErrorIssue[] {
  return error.issues.map((issue) => ({
    path: [prefix, ...issue.path.map(String)].join('.'),
    message: issue.message,
  }));
}

const loneSurrogate = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function textProblem(text: string): string | null {
  if (text.includes('\u0000')) return 'must not contain a NUL character (U+0000)';
  if (loneSurrogate.test(text)) return 'must be valid Unicode text (it holds half of a surrogate pair)';
  return null;
}

/**
 * Text PostgreSQL refuses to store: NUL in text columns, lone UTF-16 surrogates in json/jsonb (and,
 * written as UTF-8, anywhere). Checked here, before any schema, for every part a route reads, so no
 * route can forget it and each issue names its field. Walked with a stack, not recursion, so a
 * deeply nested body cannot overflow it. (OWASP ASVS 5.0, V1 Encoding and Sanitization / V2
 * Validation and Business Logic: input is checked against what the data store accepts.)
 */
export function unstorableText(value: unknown, prefix: string): ErrorIssue[] {
  const issues: ErrorIssue[] = [];
  const stack: Array<{ value: unknown; path: string }> = [{ value, path: prefix }];
  while (stack.length > 0) {
    const { value: item, path } = stack.pop()!;
    if (typeof item === 'string') {
      const problem = textProblem(item);
      if (problem) issues.push({ path, message: problem });
    } else if (Array.isArray(item)) {
      item.forEach((entry, index) => stack.push({ value: entry, path: `${path}.${index}` }));
    } else if (typeof item === 'object' && item !== null) {
      for (const [key, entry] of Object.entries(item)) {
        const problem = textProblem(key);
        if (problem) issues.push({ path, message: `a field name ${problem}` });
        else stack.push({ value: entry, path: `${path}.${key}` });
      }
    }
  }
  return issues;
}

/** Parses the request parts; every issue of every part is reported at once, as `body.name` paths. */
function parseRequest<S extends Schemas>(schemas: S, req: Request): Parsed<S> {
  const valid: Record<string, unknown> = {};
  const issues: ErrorIssue[] = [];
  for (const part of ['params', 'query', 'body'] as const) {
    const schema = schemas[part];
    if (!schema) continue;
    const unstorable = unstorableText(req[part], part);
    if (unstorable.length > 0) {
      issues.push(...unstorable);
      continue;
    }
    const result = schema.safeParse(req[part] ?? {});
    if (result.success) valid[part] = result.data;
    else issues.push(...issuesFrom(result.error, part));
  }
  if (issues.length > 0) throw new HttpError(400, 'invalid_request', 'Some fields need attention.', issues);
  return valid as unknown as Parsed<S>;
}

function contextOf<S extends Schemas>(schemas: S, req: Request, res: Response): RequestContext<S> {
  return {
    ...parseRequest(schemas, req),
    deps: depsOf(req),
    requestId: String(req.id),
    ip: req.ip ?? null,
    userAgent: req.get('user-agent') ?? null,
    log: req.log,
    get session() {
      return req.session;
    },
    file: req.file,
    originalUrl: req.originalUrl,
    rawBody: Buffer.isBuffer(req.body) ? req.body : undefined,
    header: (name) => req.get(name),
    setHeader: (name, value) => void res.setHeader(name, value),
  };
}

function handle(
  who: (req: Request) => (base: RequestContext<Schemas>) => object,
  schemas: Schemas,
  handler: Handler<object>,
) {
  const run: RequestHandler = async (req, res) => {
    const caller = who(req);
    const answer = await handler(caller(contextOf(schemas, req, res)));
    if (answer instanceof Reply) await answer.send(res, req);
    else res.json(answer);
  };
  return run;
}

// The caller is settled before the input is parsed, so a signed-out request is a 401, not a 400.
const withActor = (req: Request) => {
  const actor = requireActor(req.actor);
  return (base: RequestContext<Schemas>) => Object.assign(base, { actor });
};

const withOptionalActor = (req: Request) => (base: RequestContext<Schemas>) =>
  Object.assign(base, { actor: req.actor ?? null });

const withDevice = (req: Request) => {
  const device = req.device;
  if (!device) throw unauthorized('No device.');
  return (base: RequestContext<Schemas>) => Object.assign(base, { device });
};

/**
 * The last step of every signed-in route: parses the request with the shared schemas (400 with
 * every issue), then hands the handler the parsed parts, the actor and the deps. Its return value
 * is the answer: JSON with 200, or a `Reply` (`created`, `noContent`, `streamed`…).
 */
export function route<S extends Schemas>(schemas: S, handler: Handler<SignedInContext<S>>): RequestHandler {
  return handle(withActor, schemas, handler as Handler<object>);
}

/** As `route`, for the few public routes: the actor is there when someone is signed in. */
export function openRoute<S extends Schemas>(schemas: S, handler: Handler<OpenContext<S>>): RequestHandler {
  return handle(withOptionalActor, schemas, handler as Handler<object>);
}

/** As `route`, for routes a device calls with its bearer token (after `deviceToken`). */
export function deviceRoute<S extends Schemas>(
  schemas: S,
  handler: Handler<DeviceContext<S>>,
): RequestHandler {
  return handle(withDevice, schemas, handler as Handler<object>);
}
