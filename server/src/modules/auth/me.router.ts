import { Router, type Request } from 'express';
import { allowedActions } from '@shared/auth/permissions';
import type { Me } from '@shared/schemas/people';
import { reauthenticationIdSchema, reauthenticationStartSchema } from '@shared/schemas/reauthentication';
import type { AppContext } from '../../app-context';
import { currentPerson, originOf, requireSignedIn } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { limitRate } from '../../middleware/rate-limits';
import {
  cancelReauthentication,
  REAUTHENTICATION_START_LIMIT,
  reauthenticationStatus,
  startReauthentication,
} from './reauthentication.service';

/** The signed-in person, their permitted actions and CSRF token; and starting a re-authentication. */
export function meRouter(context: AppContext, generateCsrfToken: (req: Request) => string): Router {
  const router = Router();

  router.get('/me', requireSignedIn(), (req, res) => {
    const person = currentPerson(req)!;
    const body: Me = {
      person: { id: person.id, name: person.name, email: person.email, roles: person.roles },
      actions: allowedActions(person.roles),
      csrfToken: generateCsrfToken(req),
      session: {
        idleMinutes: context.config.SESSION_IDLE_MINUTES,
        absoluteExpiresAt: new Date(
          (req.session.signedInAt ?? Date.now()) + context.config.SESSION_ABSOLUTE_HOURS * 3600_000,
        ).toISOString(),
      },
    };
    res.set('Cache-Control', 'no-store').json(body);
  });

  // Each re-authentication opens a password prompt at the identity provider: counted per person.
  const starts = limitRate({
    name: REAUTHENTICATION_START_LIMIT,
    limit: context.config.SIGNING_ATTEMPTS_PER_15_MIN,
    connect: () => context.database.connect(),
    key: 'person',
    message: (minutes) =>
      `Too many password confirmations begun in a short time; try again in ${minutes} ` +
      `minute${minutes === 1 ? '' : 's'}`,
    answer: 'json',
  });

  router.post(
    '/reauthentications',
    requireSignedIn(),
    starts,
    ...validated({ body: reauthenticationStartSchema }, async (input, req, res) => {
      const start = input.body;
      res.status(201).json(await startReauthentication(context.database.dataSource, currentPerson(req)!, start));
    }),
  );

  router.get(
    '/reauthentications/:reauthenticationId',
    requireSignedIn(),
    ...validated({ params: reauthenticationIdSchema }, async (input, req, res) => {
      const { reauthenticationId } = input.params;
      res
        .set('Cache-Control', 'no-store')
        .json(await reauthenticationStatus(context.database.dataSource, reauthenticationId, currentPerson(req)!));
    }),
  );

  router.post(
    '/reauthentications/:reauthenticationId/cancel',
    requireSignedIn(),
    ...validated({ params: reauthenticationIdSchema }, async (input, req, res) => {
      const { reauthenticationId } = input.params;
      res.json(
        await cancelReauthentication(
          context.database.dataSource,
          reauthenticationId,
          currentPerson(req)!,
          originOf(req),
        ),
      );
    }),
  );

  return router;
}
