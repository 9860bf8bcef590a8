import { Router } from 'express';
import type { AppContext } from '../../app-context';
import { currentPerson, requireSignedIn } from '../../middleware/access';
import { homeSchema } from '@shared/schemas/home';
import { homeFor } from './home.service';

/** A person's home: the work waiting for their roles, and the plant's figures. */
export function homeRouter(context: AppContext): Router {
  const router = Router();
  router.get('/home', requireSignedIn(), async (req, res) => {
    res
      .set('Cache-Control', 'no-store')
      .json(homeSchema.parse(await homeFor(context.database.dataSource, currentPerson(req)!)));
  });
  return router;
}
