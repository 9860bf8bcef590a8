import { Router } from 'express';
import {
  backwardQuerySchema,
  forwardQuerySchema,
  traceStartQuerySchema,
  type BackwardQuery,
  type ForwardStart,
} from '@shared/schemas/trace';
import { findTraceStarts } from './trace-starts.repository';
import type { AppContext } from '../../app-context';
import { requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { backwardTrace, forwardTrace } from './trace.service';
import { backwardGraph, forwardGraph } from './genealogy-graph.service';

/** Genealogy both ways: back from a unit, lot or bar to its heats; forward from a heat, bar, run or supplier to lots and consignees. */
export function traceRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;
  router.get(
    '/trace/backward',
    requireAction('trace.read'),
    validate({ query: backwardQuerySchema }),
    async (_req, res) => {
      res.json(await backwardTrace(data(), (res.locals.valid as { query: BackwardQuery }).query));
    },
  );
  router.get(
    '/trace/starts',
    requireAction('trace.read'),
    validate({ query: traceStartQuerySchema }),
    async (_req, res) => {
      res.json(await findTraceStarts(data().manager, (res.locals.valid as { query: { q: string } }).query.q));
    },
  );
  router.get(
    '/trace/forward',
    requireAction('trace.read'),
    validate({ query: forwardQuerySchema }),
    async (_req, res) => {
      res.json(await forwardTrace(data(), (res.locals.valid as { query: ForwardStart }).query));
    },
  );
  router.get(
    '/trace/backward/graph',
    requireAction('trace.read'),
    validate({ query: backwardQuerySchema }),
    async (_req, res) => {
      res.json(await backwardGraph(data(), (res.locals.valid as { query: BackwardQuery }).query));
    },
  );
  router.get(
    '/trace/forward/graph',
    requireAction('trace.read'),
    validate({ query: forwardQuerySchema }),
    async (_req, res) => {
      res.json(await forwardGraph(data(), (res.locals.valid as { query: ForwardStart }).query));
    },
  );
  return router;
}
