import { Router } from 'express';
import { idParams } from '@shared/schemas/manufacturing';
import {
  fieldActionInputSchema,
  fieldActionReportQuerySchema,
  returnedGoodsInputSchema,
} from '@shared/schemas/field-action';
import { fieldActionReport } from './field-action-report';
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { findOrganisation } from '../organisation/organisation.repository';
import {
  fieldActionView,
  noticePreview,
  prepareNotices,
  receiveReturnedGoods,
  setStrategy,
} from './field-action.service';
import { noticePdf } from './notice-document';

/** A recall's field action: strategy, consignee notices (issued by signature), returned goods, effectiveness. */
export function fieldActionRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;

  router.get(
    '/recalls/:recallId/field-action',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId') }, async (input, _req, res) => {
      res.json(await fieldActionView(data(), input.params.recallId));
    }),
  );
  router.get(
    '/recalls/:recallId/field-action/report',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId'), query: fieldActionReportQuerySchema }, async (input, req, res) => {
      const report = await fieldActionReport(
        data(),
        input.params.recallId,
        input.query.format,
        actorOf(req, 'recall.read'),
        originOf(req),
      );
      res
        .type(report.contentType)
        .set('X-Content-Type-Options', 'nosniff')
        .attachment(report.fileName)
        .send(report.body);
    }),
  );
  router.put(
    '/recalls/:recallId/field-action',
    requireAction('recall.notify'),
    ...validated({ params: idParams('recallId'), body: fieldActionInputSchema }, async (input, req, res) => {
      res.json(
        await setStrategy(
          data(),
          input.params.recallId,
          input.body,
          currentPerson(req)!,
          actorOf(req, 'recall.notify'),
          originOf(req),
        ),
      );
    }),
  );
  router.post(
    '/recalls/:recallId/notices',
    requireAction('recall.notify'),
    ...validated({ params: idParams('recallId') }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await prepareNotices(
            data(),
            input.params.recallId,
            currentPerson(req)!,
            actorOf(req, 'recall.notify'),
            originOf(req),
          ),
        );
    }),
  );
  router.get(
    '/recalls/:recallId/notices/:noticeId',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId', 'noticeId') }, async (input, _req, res) => {
      res.json(await noticePreview(data(), input.params.recallId, input.params.noticeId));
    }),
  );
  router.get(
    '/recalls/:recallId/notices/:noticeId/pdf',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId', 'noticeId') }, async (input, _req, res) => {
      const preview = await noticePreview(data(), input.params.recallId, input.params.noticeId);
      const organisation = await findOrganisation(data());
      res
        .type('application/pdf')
        .set('X-Content-Type-Options', 'nosniff')
        .attachment(`${preview.content.recallNumber}-notice-${preview.id}.pdf`)
        .send(await noticePdf(preview.content, organisation?.name ?? '', preview.sha256));
    }),
  );
  router.post(
    '/recalls/:recallId/returned-goods',
    requireAction('recall.manage'),
    ...validated({ params: idParams('recallId'), body: returnedGoodsInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await receiveReturnedGoods(
            data(),
            input.params.recallId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'recall.manage'),
            originOf(req),
          ),
        );
    }),
  );
  return router;
}
