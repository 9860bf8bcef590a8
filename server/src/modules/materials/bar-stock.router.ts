import { Router } from 'express';
import { barCutSchema, barListQuerySchema, barPieceParamsSchema, barReceiptSchema } from '@shared/schemas/materials';
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { barPiece, cutBar, listBarPieces, receiveBar } from './bar-stock.service';
import type { BarCutAllowance } from '@shared/schemas/materials';

export function barStockRouter(context: AppContext): Router {
  const router = Router();
  const dataSource = () => context.database.dataSource;

  router.get(
    '/bar-pieces',
    requireAction('materials.read'),
    ...validated({ query: barListQuerySchema }, async (input, _req, res) => {
      res.json(await listBarPieces(dataSource(), input.query));
    }),
  );
  // The saw kerf allowed per cut, so that a cut can be checked as it is typed (the server checks it again).
  router.get('/bar-cut-allowance', requireAction('materials.read'), (_req, res) => {
    res.json({ kerfAllowancePerCutMm: context.config.BAR_KERF_ALLOWANCE_MM } satisfies BarCutAllowance);
  });
  router.get(
    '/bar-pieces/:pieceId',
    requireAction('materials.read'),
    ...validated({ params: barPieceParamsSchema }, async (input, _req, res) => {
      res.json(await barPiece(dataSource(), input.params.pieceId));
    }),
  );
  router.post(
    '/bar-pieces',
    requireAction('materials.write'),
    ...validated({ body: barReceiptSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await receiveBar(
            dataSource(),
            input.body,
            currentPerson(req)!,
            actorOf(req, 'materials.write'),
            originOf(req),
          ),
        );
    }),
  );
  router.post(
    '/bar-pieces/:pieceId/cuts',
    requireAction('materials.write'),
    ...validated({ params: barPieceParamsSchema, body: barCutSchema }, async (input, req, res) => {
      const { pieceId } = input.params;
      res
        .status(201)
        .json(
          await cutBar(
            dataSource(),
            pieceId,
            input.body,
            context.config.BAR_KERF_ALLOWANCE_MM,
            currentPerson(req)!,
            actorOf(req, 'materials.write'),
            originOf(req),
          ),
        );
    }),
  );
  return router;
}
