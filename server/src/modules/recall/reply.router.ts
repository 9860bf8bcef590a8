import express, { Router } from 'express';
import { noticeReplyInputSchema, replyTokenParamsSchema } from '@shared/schemas/field-action';
import type { AppContext } from '../../app-context';
import { allowPublic, originOf } from '../../middleware/access';
import { limitRate } from '../../middleware/rate-limits';
import { validated } from '../../middleware/validate';
import { replyPage, submitReply } from './reply.service';

/**
 * A consignee's reply page, reached by the random token in its notice and no account: it shows
 * that notice's lots only and takes answers until the recall closes. No session, so no CSRF
 * token: the link's secret is the only credential, and guessing is limited per address.
 */
export function replyRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;
  router.use(express.json({ limit: '256kb' }));
  router.use(
    limitRate({
      name: 'reply-link',
      limit: 120,
      connect: () => context.database.connect(),
      key: 'address',
      message: (minutes) => `Too many requests from this address; try again in ${minutes} minute(s)`,
      answer: 'json',
    }),
  );
  router.get(
    '/:token',
    allowPublic(),
    ...validated({ params: replyTokenParamsSchema }, async (input, _req, res) => {
      res.set('Cache-Control', 'no-store').json(await replyPage(data(), input.params.token));
    }),
  );
  router.post(
    '/:token',
    allowPublic(),
    ...validated({ params: replyTokenParamsSchema, body: noticeReplyInputSchema }, async (input, req, res) => {
      res
        .set('Cache-Control', 'no-store')
        .json(await submitReply(data(), input.params.token, input.body, originOf(req)));
    }),
  );
  return router;
}
