import { Router, type Response } from 'express';
import { backwardQuerySchema, forwardQuerySchema, traceStartQuerySchema } from '@shared/schemas/trace';
import { findTraceStarts } from './trace-starts.repository';
import type { AppContext } from '../../app-context';
import { actorOf, originOf, requireAction } from '../../middleware/access';
import { idParams } from '@shared/schemas/manufacturing';
import { lotEpcis, recallEpcis } from './epcis-export';
import { validated } from '../../middleware/validate';
import { backwardTrace, forwardTrace } from './trace.service';
import { backwardGraph, forwardGraph } from './genealogy-graph.service';

/**
 * Genealogy both ways: back from a unit, lot or bar to its heats; forward from a heat, bar, run or supplier to lots and
 * consignees.
 */
export function traceRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;
  const sendEpcis = (res: Response, exported: { body: string; fileName: string }) =>
    res
      .type('application/ld+json')
      .set('X-Content-Type-Options', 'nosniff')
      .attachment(exported.fileName)
      .send(exported.body);
  router.get(
    '/lots/:lotId/epcis',
    requireAction('trace.read'),
    ...validated({ params: idParams('lotId') }, async (input, req, res) => {
      sendEpcis(res, await lotEpcis(data(), input.params.lotId, actorOf(req, 'trace.read'), originOf(req)));
    }),
  );
  router.get(
    '/recalls/:recallId/epcis',
    requireAction('recall.read'),
    ...validated({ params: idParams('recallId') }, async (input, req, res) => {
      sendEpcis(res, await recallEpcis(data(), input.params.recallId, actorOf(req, 'recall.read'), originOf(req)));
    }),
  );
  router.get(
    '/trace/backward',
    requireAction('trace.read'),
    ...validated({ query: backwardQuerySchema }, async (input, _req, res) => {
      res.json(await backwardTrace(data(), input.query));
    }),
  );
  router.get(
    '/trace/starts',
    requireAction('trace.read'),
    ...validated({ query: traceStartQuerySchema }, async (input, _req, res) => {
      res.json(await findTraceStarts(data().manager, input.query.q));
    }),
  );
  router.get(
    '/trace/forward',
    requireAction('trace.read'),
    ...validated({ query: forwardQuerySchema }, async (input, _req, res) => {
      res.json(await forwardTrace(data(), input.query));
    }),
  );
  router.get(
    '/trace/backward/graph',
    requireAction('trace.read'),
    ...validated({ query: backwardQuerySchema }, async (input, _req, res) => {
      res.json(await backwardGraph(data(), input.query));
    }),
  );
  router.get(
    '/trace/forward/graph',
    requireAction('trace.read'),
    ...validated({ query: forwardQuerySchema }, async (input, _req, res) => {
      res.json(await forwardGraph(data(), input.query));
    }),
  );
  return router;
}
