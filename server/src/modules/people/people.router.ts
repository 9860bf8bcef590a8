import { Router } from 'express';
import {
  activationChangeSchema,
  peopleQuerySchema,
  personIdParamsSchema,
  roleChangeSchema,
} from '@shared/schemas/people';
import type { AppContext } from '../../app-context';
import { actorOf, originOf, requireAction } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { changeActivation, changeRoles, listPeople, peopleSettings } from './people.service';

export function peopleRouter(context: AppContext): Router {
  const router = Router();
  const dataSource = () => context.database.dataSource;

  router.get(
    '/people',
    requireAction('people.read'),
    ...validated({ query: peopleQuerySchema }, async (input, _req, res) => {
      res.json(await listPeople(dataSource(), input.query));
    }),
  );

  router.get('/people/settings', requireAction('people.read'), async (_req, res) => {
    res.json(await peopleSettings(dataSource()));
  });

  router.put(
    '/people/:personId/roles',
    requireAction('people.manage'),
    ...validated({ params: personIdParamsSchema, body: roleChangeSchema }, async (input, req, res) => {
      const { personId } = input.params;
      const outcome = await changeRoles(
        dataSource(),
        personId,
        input.body,
        actorOf(req, 'people.manage'),
        originOf(req),
      );
      res.status(outcome.applied ? 200 : 202).json(outcome);
    }),
  );

  router.put(
    '/people/:personId/activation',
    requireAction('people.manage'),
    ...validated({ params: personIdParamsSchema, body: activationChangeSchema }, async (input, req, res) => {
      const { personId } = input.params;
      res.json(
        await changeActivation(dataSource(), personId, input.body, actorOf(req, 'people.manage'), originOf(req)),
      );
    }),
  );

  return router;
}
