import { Router } from 'express';
import type { AppContext } from '../../app-context';
import { AppError } from '../../errors';
import { findOrganisation } from './organisation.repository';
import { allowPublic } from '../../middleware/access';

export function organisationRouter(context: AppContext): Router {
  const router = Router();
  router.get('/organisation', allowPublic(), async (_req, res) => {
    const organisation = await findOrganisation(await context.database.connect());
    if (!organisation) throw new AppError('NOT_FOUND', 'No organisation is set up yet; run the seed or the setup');
    res.json(organisation);
  });
  return router;
}
