import { Router } from 'express';
import { z } from 'zod';
import { methodValidationInputSchema } from '@shared/schemas/process-methods';
import {
  consigneeInputSchema,
  dispositionInputSchema,
  idParams,
  lotListQuerySchema,
  lotOpenSchema,
  materialMovementSchema,
  mergeInputSchema,
  nonconformanceInputSchema,
  nonconformanceListQuerySchema,
  operationInputSchema,
  partCreateSchema,
  processRunInputSchema,
  processRunListQuerySchema,
  shipmentInputSchema,
  splitInputSchema,
} from '@shared/schemas/manufacturing';
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { singleFileUpload } from '../../middleware/single-file-upload';
import { createPart, loadParts, partById } from './parts.service';
import { issueMaterial, listLots, openLot, returnMaterial } from './lots.service';
import { lotDetail } from './lot-detail.service';
import { recordOperation } from './operations.service';
import { mergeLots, splitLot } from './lot-links.service';
import { listProcessRuns, processRunDetail, recordProcessRun } from './process-runs.service';
import { listProcessMethods, recordMethodValidation } from './process-methods.service';
import {
  listNonconformances,
  nonconformanceDetail,
  proposeDisposition,
  raiseNonconformance,
} from './nonconformances.service';
import { createConsignee, listConsignees, shipLot } from './shipments.service';
import { attachOperationFile, MEASUREMENT_FILE_MAX_BYTES, operationFile } from './operation-files';
import { AppError } from '../../errors';

const fileUpload = singleFileUpload('file', MEASUREMENT_FILE_MAX_BYTES, 'file');

const id = z.coerce.number().int().positive().max(4_294_967_295);
const operationParams = z.object({ lotId: id, operationId: id });
const operationFileParams = z.object({ lotId: id, operationId: id, documentId: id });

/** Parts, lots and their record, process runs, nonconformances, consignees and shipments. */
export function manufacturingRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;
  const valid = <T>(res: { locals: Record<string, unknown> }, part: 'body' | 'query' | 'params') =>
    (res.locals.valid as Record<string, unknown>)[part] as T;
  const lotParams = idParams('lotId');

  router.get('/parts', requireAction('lots.read'), async (_req, res) => {
    res.json(await loadParts(data().manager));
  });
  router.get(
    '/parts/:partId',
    requireAction('lots.read'),
    validate({ params: idParams('partId') }),
    async (_req, res) => {
      res.json(await partById(data(), valid<{ partId: number }>(res, 'params').partId));
    },
  );
  router.post('/parts', requireAction('parts.manage'), validate({ body: partCreateSchema }), async (req, res) => {
    res
      .status(201)
      .json(await createPart(data(), req.body, currentPerson(req)!, actorOf(req, 'parts.manage'), originOf(req)));
  });
  router.get('/process-methods', requireAction('lots.read'), async (_req, res) => {
    res.json(await listProcessMethods(data().manager));
  });
  router.post(
    '/process-methods/:methodId/validations',
    requireAction('methods.validate'),
    validate({ params: z.object({ methodId: z.string().trim().min(1).max(40) }), body: methodValidationInputSchema }),
    async (req, res) => {
      const methodId = valid<{ methodId: string }>(res, 'params').methodId;
      res
        .status(201)
        .json(
          await recordMethodValidation(
            data(),
            methodId,
            req.body,
            currentPerson(req)!,
            actorOf(req, 'methods.validate'),
            originOf(req),
          ),
        );
    },
  );

  router.get('/lots', requireAction('lots.read'), validate({ query: lotListQuerySchema }), async (_req, res) => {
    res.json(await listLots(data(), valid(res, 'query')));
  });
  router.post('/lots', requireAction('lots.write'), validate({ body: lotOpenSchema }), async (req, res) => {
    res
      .status(201)
      .json(await openLot(data(), req.body, currentPerson(req)!, actorOf(req, 'lots.write'), originOf(req)));
  });
  router.post('/lots/merges', requireAction('lots.write'), validate({ body: mergeInputSchema }), async (req, res) => {
    res
      .status(201)
      .json(await mergeLots(data(), req.body, currentPerson(req)!, actorOf(req, 'lots.write'), originOf(req)));
  });
  router.get('/lots/:lotId', requireAction('lots.read'), validate({ params: lotParams }), async (_req, res) => {
    res.json(await lotDetail(data(), valid<{ lotId: number }>(res, 'params').lotId));
  });
  router.post(
    '/lots/:lotId/material-issues',
    requireAction('lots.write'),
    validate({ params: lotParams, body: materialMovementSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await issueMaterial(
            data(),
            valid<{ lotId: number }>(res, 'params').lotId,
            req.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    },
  );
  router.post(
    '/lots/:lotId/material-returns',
    requireAction('lots.write'),
    validate({ params: lotParams, body: materialMovementSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await returnMaterial(
            data(),
            valid<{ lotId: number }>(res, 'params').lotId,
            req.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    },
  );
  router.post(
    '/lots/:lotId/operations',
    requireAction('lots.write'),
    validate({ params: lotParams, body: operationInputSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await recordOperation(
            data(),
            valid<{ lotId: number }>(res, 'params').lotId,
            req.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    },
  );
  router.post(
    '/lots/:lotId/operations/:operationId/files',
    requireAction('lots.write'),
    validate({ params: operationParams }),
    fileUpload,
    async (req, res) => {
      const { lotId, operationId } = valid<{ lotId: number; operationId: number }>(res, 'params');
      if (!req.file) throw new AppError('VALIDATION_FAILED', 'Choose a file to attach', { file: 'No file' });
      res
        .status(201)
        .json(
          await attachOperationFile(
            data(),
            lotId,
            operationId,
            { bytes: req.file.buffer, originalName: req.file.originalname },
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    },
  );
  router.get(
    '/lots/:lotId/operations/:operationId/files/:documentId',
    requireAction('lots.read'),
    validate({ params: operationFileParams }),
    async (_req, res) => {
      const { lotId, operationId, documentId } = valid<{ lotId: number; operationId: number; documentId: number }>(
        res,
        'params',
      );
      const file = await operationFile(data(), lotId, operationId, documentId);
      res
        .type(file.mediaType)
        .set('X-Content-Type-Options', 'nosniff')
        .set('Content-Security-Policy', "default-src 'none'; sandbox")
        .set('Digest', `sha-256=${Buffer.from(file.sha256, 'hex').toString('base64')}`)
        .attachment(file.name)
        .send(file.content);
    },
  );
  router.post(
    '/lots/:lotId/splits',
    requireAction('lots.write'),
    validate({ params: lotParams, body: splitInputSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await splitLot(
            data(),
            valid<{ lotId: number }>(res, 'params').lotId,
            req.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    },
  );
  router.post(
    '/lots/:lotId/shipments',
    requireAction('shipments.write'),
    validate({ params: lotParams, body: shipmentInputSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await shipLot(
            data(),
            valid<{ lotId: number }>(res, 'params').lotId,
            req.body,
            currentPerson(req)!,
            actorOf(req, 'shipments.write'),
            originOf(req),
          ),
        );
    },
  );

  router.get(
    '/process-runs',
    requireAction('lots.read'),
    validate({ query: processRunListQuerySchema }),
    async (_req, res) => {
      res.json(await listProcessRuns(data(), valid(res, 'query')));
    },
  );
  router.get(
    '/process-runs/:runId',
    requireAction('lots.read'),
    validate({ params: idParams('runId') }),
    async (_req, res) => {
      res.json(await processRunDetail(data(), valid<{ runId: number }>(res, 'params').runId));
    },
  );
  router.post(
    '/process-runs',
    requireAction('lots.write'),
    validate({ body: processRunInputSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(await recordProcessRun(data(), req.body, currentPerson(req)!, actorOf(req, 'lots.write'), originOf(req)));
    },
  );

  router.get(
    '/nonconformances',
    requireAction('lots.read'),
    validate({ query: nonconformanceListQuerySchema }),
    async (_req, res) => {
      res.json(await listNonconformances(data(), valid(res, 'query')));
    },
  );
  router.get(
    '/nonconformances/:ncId',
    requireAction('lots.read'),
    validate({ params: idParams('ncId') }),
    async (_req, res) => {
      res.json(await nonconformanceDetail(data(), valid<{ ncId: number }>(res, 'params').ncId));
    },
  );
  router.post(
    '/nonconformances',
    requireAction('nonconformances.raise'),
    validate({ body: nonconformanceInputSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await raiseNonconformance(
            data(),
            req.body,
            currentPerson(req)!,
            actorOf(req, 'nonconformances.raise'),
            originOf(req),
          ),
        );
    },
  );
  router.put(
    '/nonconformances/:ncId/disposition',
    requireAction('nonconformances.disposition'),
    validate({ params: idParams('ncId'), body: dispositionInputSchema }),
    async (req, res) => {
      res.json(
        await proposeDisposition(
          data(),
          valid<{ ncId: number }>(res, 'params').ncId,
          req.body,
          actorOf(req, 'nonconformances.disposition'),
          originOf(req),
        ),
      );
    },
  );

  router.get('/consignees', requireAction('lots.read'), async (_req, res) => {
    res.json(await listConsignees(data()));
  });
  router.post(
    '/consignees',
    requireAction('shipments.write'),
    validate({ body: consigneeInputSchema }),
    async (req, res) => {
      res.status(201).json(await createConsignee(data(), req.body, actorOf(req, 'shipments.write'), originOf(req)));
    },
  );
  return router;
}
