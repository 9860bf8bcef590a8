import { Router } from 'express';
import {
  barCutSchema,
  barListQuerySchema,
  barPieceParamsSchema,
  barReceiptSchema,
  type BarCut,
  type BarListQuery,
  type BarReceipt,
} from '@shared/schemas/materials';
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { barPiece, cutBar, listBarPieces, receiveBar } from './bar-stock.service';
import type { BarCutAllowance } from '@shared/schemas/materials';

export function barStockRouter(context: AppContext): Router {
  const router = Router();
  const dataSource = () => context.database.dataSource;

  router.get(
    '/bar-pieces',
    requireAction('materials.read'),
    validate({ query: barListQuerySchema }),
    async (_req, res) => {
      res.json(await listBarPieces(dataSource(), res.locals.valid.query as BarListQuery));
    },
  );
  // The saw kerf allowed per cut, so that a cut can be checked as it is typed (the server checks it again).
  router.get('/bar-cut-allowance', requireAction('materials.read'), (_req, res) => {
    res.json({ kerfAllowancePerCutMm: context.config.BAR_KERF_ALLOWANCE_MM } satisfies BarCutAllowance);
  });
  router.get(
    '/bar-pieces/:pieceId',
    requireAction('materials.read'),
    validate({ params: barPieceParamsSchema }),
    async (_req, res) => {
      res.json(await barPiece(dataSource(), (res.locals.valid.params as { pieceId: number }).pieceId));
    },
  );
  router.post(
    '/bar-pieces',
    requireAction('materials.write'),
    validate({ body: barReceiptSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await receiveBar(
            dataSource(),
            res.locals.valid.body as BarReceipt,
            currentPerson(req)!,
            actorOf(req, 'materials.write'),
            originOf(req),
          ),
        );
    },
  );
  router.post(
    '/bar-pieces/:pieceId/cuts',
    requireAction('materials.write'),
    validate({ params: barPieceParamsSchema, body: barCutSchema }),
    async (req, res) => {
      const { pieceId } = res.locals.valid.params as { pieceId: number };
      res
        .status(201)
        .json(
          await cutBar(
            dataSource(),
            pieceId,
            res.locals.valid.body as BarCut,
            context.config.BAR_KERF_ALLOWANCE_MM,
            currentPerson(req)!,
            actorOf(req, 'materials.write'),
            originOf(req),
          ),
        );
    },
  );
  return router;
}
