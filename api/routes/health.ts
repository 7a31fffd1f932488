import { Router, type Request, type Response } from 'express';
import { depsOf } from '../deps';
import { publicRoute } from '../policy/index';
import { getHealth } from '../services/health';

export const healthRouter = Router();

healthRouter.get('/', publicRoute, getHealthStatus);

async function getHealthStatus(req: Request, res: Response) {
  const health = await getHealth(depsOf(req).pool);
  res.status(health.db === 'ok' ? 200 : 503).json(health);
}
