import { Router } from 'express';
import {
  activationChangeSchema,
  peopleQuerySchema,
  personIdParamsSchema,
  roleChangeSchema,
  type ActivationChange,
  type PeopleQuery,
  type RoleChange,
} from '@shared/schemas/people';
import type { AppContext } from '../../app-context';
import { actorOf, originOf, requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { changeActivation, changeRoles, listPeople, peopleSettings } from './people.service';

export function peopleRouter(context: AppContext): Router {
  const router = Router();
  const dataSource = () => context.database.dataSource;

  router.get('/people', requireAction('people.read'), validate({ query: peopleQuerySchema }), async (_req, res) => {
    res.json(await listPeople(dataSource(), res.locals.valid.query as PeopleQuery));
  });

  router.get('/people/settings', requireAction('people.read'), async (_req, res) => {
    res.json(await peopleSettings(dataSource()));
  });

  router.put(
    '/people/:personId/roles',
    requireAction('people.manage'),
    validate({ params: personIdParamsSchema, body: roleChangeSchema }),
    async (req, res) => {
      const { personId } = res.locals.valid.params as { personId: number };
      const outcome = await changeRoles(
        dataSource(),
        personId,
        res.locals.valid.body as RoleChange,
        actorOf(req, 'people.manage'),
        originOf(req),
      );
      res.status(outcome.applied ? 200 : 202).json(outcome);
    },
  );

  router.put(
    '/people/:personId/activation',
    requireAction('people.manage'),
    validate({ params: personIdParamsSchema, body: activationChangeSchema }),
    async (req, res) => {
      const { personId } = res.locals.valid.params as { personId: number };
      res.json(
        await changeActivation(
          dataSource(),
          personId,
          res.locals.valid.body as ActivationChange,
          actorOf(req, 'people.manage'),
          originOf(req),
        ),
      );
    },
  );

  return router;
}
