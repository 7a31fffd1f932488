import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Request } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { randomUUID } from 'node:crypto';
import type pg from 'pg';
import type { Db } from './db/client';
import type { Env } from './env';
import type { Logger } from './lib/logger';
import { apiNotFound, errorHandler, requireContentType } from './middleware/error-handler';
import { healthRouter } from './routes/health';

export interface AppDeps {
  env: Env;
  db: Db;
  pool: pg.Pool;
  logger: Logger;
  /** Built client to serve; omitted in API-only tests and when Vite serves the client. */
  webDist?: string;
}

export function depsOf(req: Request): AppDeps {
  return req.app.locals.deps as AppDeps;
}

const requestIdPattern = /^[\w.-]{8,64}$/;

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
        req: (req: { id: string; method: string; url: string }) => ({
          id: req.id,
          method: req.method,
          url: req.url,
        }),
        res: (res: { statusCode: number }) => ({ status: res.statusCode }),
      },
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Fonts and styles ship with the app: nothing is fetched from elsewhere.
          'font-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'worker-src': ["'self'"],
          // Plain http on localhost in the demo: upgrading would break every request.
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );

  const api = express.Router();
  api.use(requireContentType(['application/json', 'multipart/form-data']));
  api.use(express.json({ limit: '1mb' }));
  api.use('/health', healthRouter);
  api.use(apiNotFound);
  app.use('/api', api);

  if (deps.webDist && existsSync(deps.webDist)) serveClient(app, deps.webDist);

  app.use(errorHandler);
  return app;
}

function serveClient(app: express.Express, webDist: string) {
  app.use(express.static(webDist, { index: false, maxAge: '1h', setHeaders: cacheHashedAssets }));
  const indexHtml = path.join(webDist, 'index.html');
  // Client-side routes: any other GET that wants a page gets the app shell.
  app.get(/^\/(?!api\/|auth\/).*/, (req, res, next) => {
    if (!req.accepts('html')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });
}

function cacheHashedAssets(res: express.Response, filePath: string) {
  if (filePath.includes(`${path.sep}assets${path.sep}`)) {
    res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
  }
}
