import { Router } from 'express';
import type { AppContext } from '../../app-context';
import { checkHealth } from './health.service';
import { allowPublic } from '../../middleware/access';

export function healthRouter(context: AppContext): Router {
  const router = Router();
  router.get('/health', allowPublic(), async (_req, res) => {
    res.set('Cache-Control', 'no-store').json(await checkHealth(context.database, context.version));
  });
  return router;
}
