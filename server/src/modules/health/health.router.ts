import { Router } from 'express';
import type { AppContext } from '../../app-context';
import { checkHealth } from './health.service';

export function healthRouter(context: AppContext): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    res.set('Cache-Control', 'no-store').json(await checkHealth(context.database, context.version));
  });
  return router;
}
