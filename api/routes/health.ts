import { Router } from 'express';
import { databaseRetryAfterS } from '../lib/database-errors';
import { openRoute, withStatus } from '../lib/route';
import { publicRoute } from '../policy/index';
import { getHealth } from '../services/health';

export const healthRouter = Router();

healthRouter.get(
  '/',
  publicRoute,
  openRoute({}, async ({ deps, setHeader }) => {
    const health = await getHealth(deps.pool);
    if (health.db === 'ok') return withStatus(200, health);
    setHeader('Retry-After', String(databaseRetryAfterS));
    return withStatus(503, health);
  }),
);
