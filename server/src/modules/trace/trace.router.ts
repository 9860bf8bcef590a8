import { Router } from 'express';
import { backwardQuerySchema, forwardQuerySchema, traceStartQuerySchema } from '@shared/schemas/trace';
import { findTraceStarts } from './trace-starts.repository';
import type { AppContext } from '../../app-context';
import { requireAction } from '../../middleware/access';
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
