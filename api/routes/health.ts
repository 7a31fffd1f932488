import { Router } from 'express';
import { openRoute, withStatus } from '../lib/route';
import { publicRoute } from '../policy/index';
import { getHealth } from '../services/health';

export const healthRouter = Router();

healthRouter.get(
  '/',
  publicRoute,
  openRoute({}, async ({ deps }) => {
    const health = await getHealth(deps.pool);
    return withStatus(health.db === 'ok' ? 200 : 503, health);
  }),
);
