import express, { Router, type Response } from 'express';
import { z } from 'zod';
import { bulkTrace } from './bulk-trace.service';
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
  // A list of up to 100,000 UDIs or lot numbers, one a line, sent as the text it is (a pasted list or a file).
  router.post(
    '/trace/bulk',
    requireAction('trace.read'),
    express.text({ type: ['text/plain', 'text/csv'], limit: '8mb' }),
    ...validated(
      { body: z.string({ error: 'Send the list as text, one UDI or lot number a line' }) },
      async (input, req, res) => {
        res.json(await bulkTrace(data(), input.body, actorOf(req, 'trace.read'), originOf(req)));
      },
    ),
  );
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
