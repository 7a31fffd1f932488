import { Router } from 'express';
import { getHealth } from '../services/health';

export const healthRouter = Router();

healthRouter.get('/', async (req, res) => {
  const health = await getHealth(req.app.locals.deps.pool);
  res.status(health.db === 'ok' ? 200 : 503).json(health);
});
