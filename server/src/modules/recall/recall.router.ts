import { Router } from 'express';
import { idParams } from '@shared/schemas/manufacturing';
import {
  drillReportFormatSchema,
  exportFormatSchema,
  openRecallInputSchema,
  recallListQuerySchema,
} from '@shared/schemas/recall';
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { recallExport } from './recall-exports';
import { drillReportExport } from './drill-report-exports';
import { listRecalls, openRecall, recallDetail, rerunRecall } from './recall.service';

/** Recall investigations: open from a trace start, freeze, hold, re-run, export; closing is a signature. */
export function recallRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;

  router.get(
    '/recalls',
    requireAction('recall.read'),
    ...validated({ query: recallListQuerySchema }, async (input, _req, res) => {
      res.json(await listRecalls(data(), input.query));
    }),
  );
  router.post(
    '/recalls',
    requireAction('recall.manage'),
    ...validated({ body: openRecallInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(await openRecall(data(), input.body, currentPerson(req)!, actorOf(req, 'recall.manage'), originOf(req)));
    }),
  );
  router.get(
    '/recalls/:recallId',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId') }, async (input, _req, res) => {
      res.json(await recallDetail(data(), input.params.recallId));
    }),
  );
  router.post(
    '/recalls/:recallId/reruns',
    requireAction('recall.manage'),
    ...validated({ params: idParams('recallId') }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await rerunRecall(
            data(),
            input.params.recallId,
            currentPerson(req)!,
            actorOf(req, 'recall.manage'),
            originOf(req),
          ),
        );
    }),
  );
  router.get(
    '/recalls/:recallId/export',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId'), query: exportFormatSchema }, async (input, req, res) => {
      const { format, snapshot } = input.query;
      const exported = await recallExport(
        data(),
        input.params.recallId,
        format,
        snapshot,
        actorOf(req, 'recall.read'),
        originOf(req),
      );
      res
        .type(exported.contentType)
        .set('X-Content-Type-Options', 'nosniff')
        .set('X-Snapshot-SHA256', exported.sha256)
        .attachment(exported.fileName)
        .send(exported.body);
    }),
  );
  router.get(
    '/recalls/:recallId/drill-report',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId'), query: drillReportFormatSchema }, async (input, req, res) => {
      const { format } = input.query;
      const exported = await drillReportExport(
        data(),
        input.params.recallId,
        format,
        actorOf(req, 'recall.read'),
        originOf(req),
      );
      if (!exported.file) {
        res.json(exported.report);
        return;
      }
      res
        .type(exported.file.contentType)
        .set('X-Content-Type-Options', 'nosniff')
        .attachment(exported.file.fileName)
        .send(exported.file.body);
    }),
  );
  return router;
}
