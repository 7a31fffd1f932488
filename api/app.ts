import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import type { ServerResponse } from 'node:http';
import path from 'node:path';
import { constants as zlibConstants } from 'node:zlib';
import compression from 'compression';
import express, { type RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';
import helmet, { strictTransportSecurity } from 'helmet';
import { pinoHttp } from 'pino-http';
import type { AppDeps } from './deps';
import { createClientShell } from './lib/client-shell';
import { loggableUrl, safeError } from './lib/logger';
import { appOrigin } from './env';
import { loadActor } from './middleware/actor';
import { sameOriginOnly } from './middleware/csrf';
import { apiNotFound, errorHandler, requireContentType } from './middleware/error-handler';
import { createSessionMiddleware, isHttps, sessionCookieName } from './middleware/session';
import { authRouter } from './routes/auth';
import { apiRouters, paymentWebhookPath, sessionlessRouters } from './routes/index';

export type { AppDeps } from './deps';

const requestIdPattern = /^[\w.-]{8,64}$/;

const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  next();
};

/**
 * JSON and the app shell, compressed as they are sent: brotli where the browser takes it (quality 4
 * is fast enough per request; 11 is for the build), else gzip, above the default 1 kB. Never an
 * event stream: the compressor holds what it is given until a block fills, which would keep each
 * live event from the browser.
 */
const compressResponses = compression({
  brotli: { params: { [zlibConstants.BROTLI_PARAM_QUALITY]: 4 } },
  level: 6,
  filter: (req, res) => {
    const type = res.getHeader('Content-Type');
    if (typeof type === 'string' && type.startsWith('text/event-stream')) return false;
    return compression.filter(req, res);
  },
});

export function createApp(deps: AppDeps) {
  const app = express();
  app.locals.deps = deps;
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  app.use(
    pinoHttp({
      logger: deps.logger,
      genReqId: (req, res) => {
        const incoming = req.headers['x-request-id'];
        const id = typeof incoming === 'string' && requestIdPattern.test(incoming) ? incoming : randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      serializers: {
        // Headers (cookie, authorization) stay out entirely; the URL loses its tokens.
        req: (req: { id: string; method: string; url: string }) => ({
          id: req.id,
          method: req.method,
          url: loggableUrl(req.url),
        }),
        res: (res: { statusCode: number }) => ({ status: res.statusCode }),
        err: safeError,
      },
    }),
  );
  app.use(
    fixedHeaders(
      helmet({
        contentSecurityPolicy: {
          directives: {
            // Fonts and styles ship with the app: nothing is fetched from elsewhere.
            // Vite inlines the smallest font files as data: URIs.
            'font-src': ["'self'", 'data:'],
            'style-src': ["'self'", "'unsafe-inline'"],
            'img-src': ["'self'", 'data:', 'blob:'],
            'worker-src': ["'self'"],
            // The sign-in form posts to the identity provider and comes back through redirects.
            'form-action': ["'self'", deps.env.OIDC_ISSUER],
            // Plain http on localhost in the demo: upgrading would break every request.
            'upgrade-insecure-requests': null,
          },
        },
        strictTransportSecurity: false,
      }),
    ),
  );
  app.use(onlyOverHttps(deps.env, strictTransportSecurity()));

  const sessions = createSessionMiddleware(deps.env, deps.pool);
  const sameOrigin = sameOriginOnly(appOrigin(deps.env));

  const api = express.Router();
  api.use(requireContentType(['application/json', 'multipart/form-data']));
  // The provider signs the webhook's exact bytes, so that one path keeps them (express.json then skips it).
  api.use(paymentWebhookPath, express.raw({ type: 'application/json', limit: '1mb' }));
  api.use(express.json({ limit: '1mb' }));
  api.use(noStore);
  for (const [mountPath, router] of sessionlessRouters) api.use(mountPath, router);
  api.use(sessions, sameOrigin, loadActor);
  for (const [mountPath, router] of apiRouters) api.use(mountPath, router);
  api.use(apiNotFound);
  app.use('/api', compressResponses, api);
  app.use('/auth', noStore, sessions, sameOrigin, authRouter);

  if (deps.webDist && existsSync(deps.webDist))
    serveClient(app, deps.webDist, sessionCookieName(isHttps(deps.env)));

  app.use(errorHandler);
  return app;
}

/**
 * Helmet's headers depend on nothing in the request (no directive here is a function, no nonce):
 * they are worked out once, at start, by running helmet against a recorder, and every response
 * gets them in one loop instead of a chain of thirteen middlewares.
 */
function fixedHeaders(middleware: RequestHandler): RequestHandler {
  const headers = new Map<string, string | number | readonly string[]>();
  const recorder = {
    setHeader: (name: string, value: string | number | readonly string[]) => headers.set(name, value),
    removeHeader: (name: string) => headers.delete(name),
  };
  let failed: unknown = null;
  middleware({} as never, recorder as never, (error?: unknown) => (failed = error ?? null));
  if (failed) throw failed instanceof Error ? failed : new Error(String(failed));
  const entries = [...headers];
  return (_req, res, next) => {
    for (const [name, value] of entries) res.setHeader(name, value);
    next();
  };
}

/**
 * HSTS means something only over TLS (RFC 6797 §7.2: not sent over plain http). It goes out when
 * the request arrived secure (directly, or per X-Forwarded-Proto from a loopback proxy) or when
 * the app's public origin is https, as behind a TLS proxy the app cannot see.
 */
function onlyOverHttps(env: AppDeps['env'], middleware: RequestHandler): RequestHandler {
  const httpsOrigin = isHttps(env);
  return (req, res, next) => (httpsOrigin || req.secure ? middleware(req, res, next) : next());
}

function serveClient(app: express.Express, webDist: string, sessionCookie: string) {
  // Build files go out as built: the .br or .gz written beside each (vite.config.ts), whichever
  // the browser takes, brotli first; the file itself otherwise.
  app.use(
    expressStaticGzip(webDist, {
      enableBrotli: true,
      orderPreference: ['br', 'gzip'],
      index: false,
      serveStatic: { index: false, maxAge: '1h', setHeaders: setCacheHeaders },
    }),
  );
  const shellFor = createClientShell(webDist);
  // A session cookie is enough to guess: one that has expired costs a few unused preloads, and
  // looking the session up would put a database read in front of every page.
  const hasSession = new RegExp(`(?:^|;\\s*)${sessionCookie}=`);
  // Client-side routes: any other GET that wants a page gets the app shell. A build file that is
  // not there is a 404, never the shell, which the service worker would keep as that file.
  app.get(/^\/(?!api\/|auth\/|assets\/).*/, compressResponses, (req, res, next) => {
    if (!req.accepts('html')) return next();
    const url = new URL(req.originalUrl, 'http://shell');
    const signedIn = hasSession.test(req.headers.cookie ?? '');
    res.setHeader('Cache-Control', 'no-cache');
    // The preloads differ with and without a session: a shared cache must not hand one to the other.
    res.vary('Cookie');
    res.type('html').send(shellFor(url.pathname, url.search, { signedIn }));
  });
}

function setCacheHeaders(res: ServerResponse, filePath: string) {
  // A precompressed file's rules are its original's: sw.js.br is sw.js.
  const served = filePath.replace(/\.(br|gz)$/, '');
  if (served.includes(`${path.sep}assets${path.sep}`)) {
    res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
  } else if (path.basename(served) === 'sw.js') {
    // Browsers look for a new service worker through this file: a cached copy would hold a release back.
    res.setHeader('Cache-Control', 'no-cache');
  }
}
