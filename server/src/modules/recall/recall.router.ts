import { Router } from 'express';
import { idParams } from '@shared/schemas/manufacturing';
import { exportFormatSchema, openRecallInputSchema, recallListQuerySchema, type RecallListQuery } from '@shared/schemas/recall';
import type { z } from 'zod';
import type { AppContext } from '../../app-context';
import { inTransaction } from '../../db/transaction';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { appendLedgerEvent } from '../ledger/ledger.repository';
import { recallCsv, recallPdf } from './recall-exports';
import { findRecallRow, listRecalls, openRecall, recallDetail, rerunRecall, snapshotContent } from './recall.service';
import { AppError } from '../../errors';

/** Recall investigations: open from a trace start, freeze, hold, re-run, export; closing is a signature. */
export function recallRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;
  const recallId = (res: { locals: Record<string, unknown> }) => (res.locals.valid as { params: { recallId: number } }).params.recallId;

  router.get('/recalls', requireAction('recall.read'), validate({ query: recallListQuerySchema }), async (_req, res) => {
    res.json(await listRecalls(data(), (res.locals.valid as { query: RecallListQuery }).query));
  });
  router.post('/recalls', requireAction('recall.manage'), validate({ body: openRecallInputSchema }), async (req, res) => {
    res.status(201).json(await openRecall(data(), req.body, currentPerson(req)!, actorOf(req, 'recall.manage'), originOf(req)));
  });
  router.get('/recalls/:recallId', requireAction('recall.read'), validate({ params: idParams('recallId') }), async (_req, res) => {
    res.json(await recallDetail(data(), recallId(res)));
  });
  router.post('/recalls/:recallId/reruns', requireAction('recall.manage'), validate({ params: idParams('recallId') }), async (req, res) => {
    res.status(201).json(await rerunRecall(data(), recallId(res), currentPerson(req)!, actorOf(req, 'recall.manage'), originOf(req)));
  });
  router.get('/recalls/:recallId/export', requireAction('recall.read'), validate({ params: idParams('recallId'), query: exportFormatSchema }), async (req, res) => {
    const { format, snapshot } = (res.locals.valid as { query: z.infer<typeof exportFormatSchema> }).query;
    const id = recallId(res);
    const recall = await findRecallRow(data().manager, id);
    if (!recall) throw AppError.notFound('Recall investigation');
    const frozen = await snapshotContent(data().manager, id, snapshot);
    const [organisation]: Array<{ name: string }> = await data().query('SELECT name FROM organisation ORDER BY id LIMIT 1');
    const body = format === 'csv' ? Buffer.from(recallCsv(frozen.meta, frozen.content), 'utf8') : await recallPdf(frozen.meta, frozen.content, organisation?.name ?? '', recall.reason);
    await inTransaction(data(), (manager) =>
      appendLedgerEvent(manager, { actor: actorOf(req, 'recall.read'), action: 'recall.exported', entity: { type: 'recall', id }, after: { format, snapshotId: frozen.meta.id, snapshotSha256: frozen.meta.sha256 }, origin: originOf(req) }),
    );
    const name = `${recall.recall_number}-${frozen.meta.kind === 'opening' ? 'opening' : `rerun-${frozen.meta.id}`}.${format}`;
    res
      .type(format === 'csv' ? 'text/csv; charset=utf-8' : 'application/pdf')
      .set('X-Content-Type-Options', 'nosniff')
      .set('X-Snapshot-SHA256', frozen.meta.sha256)
      .attachment(name)
      .send(body);
  });
  return router;
}
