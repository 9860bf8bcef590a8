import { Router } from 'express';
import { idParams } from '@shared/schemas/manufacturing';
import {
  drillReportFormatSchema,
  exportFormatSchema,
  openRecallInputSchema,
  recallListQuerySchema,
  type RecallListQuery,
} from '@shared/schemas/recall';
import type { z } from 'zod';
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { recallExport } from './recall-exports';
import { drillReportExport } from './drill-report-exports';
import { listRecalls, openRecall, recallDetail, rerunRecall } from './recall.service';

/** Recall investigations: open from a trace start, freeze, hold, re-run, export; closing is a signature. */
export function recallRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;
  const recallId = (res: { locals: Record<string, unknown> }) =>
    (res.locals.valid as { params: { recallId: number } }).params.recallId;

  router.get(
    '/recalls',
    requireAction('recall.read'),
    validate({ query: recallListQuerySchema }),
    async (_req, res) => {
      res.json(await listRecalls(data(), (res.locals.valid as { query: RecallListQuery }).query));
    },
  );
  router.post(
    '/recalls',
    requireAction('recall.manage'),
    validate({ body: openRecallInputSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(await openRecall(data(), req.body, currentPerson(req)!, actorOf(req, 'recall.manage'), originOf(req)));
    },
  );
  router.get(
    '/recalls/:recallId',
    requireAction('recall.read'),
    validate({ params: idParams('recallId') }),
    async (_req, res) => {
      res.json(await recallDetail(data(), recallId(res)));
    },
  );
  router.post(
    '/recalls/:recallId/reruns',
    requireAction('recall.manage'),
    validate({ params: idParams('recallId') }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await rerunRecall(data(), recallId(res), currentPerson(req)!, actorOf(req, 'recall.manage'), originOf(req)),
        );
    },
  );
  router.get(
    '/recalls/:recallId/export',
    requireAction('recall.read'),
    validate({ params: idParams('recallId'), query: exportFormatSchema }),
    async (req, res) => {
      const { format, snapshot } = (res.locals.valid as { query: z.infer<typeof exportFormatSchema> }).query;
      const exported = await recallExport(
        data(),
        recallId(res),
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
    },
  );
  router.get(
    '/recalls/:recallId/drill-report',
    requireAction('recall.read'),
    validate({ params: idParams('recallId'), query: drillReportFormatSchema }),
    async (req, res) => {
      const { format } = (res.locals.valid as { query: z.infer<typeof drillReportFormatSchema> }).query;
      const exported = await drillReportExport(
        data(),
        recallId(res),
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
    },
  );
  return router;
}
