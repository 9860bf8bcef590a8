import { Router } from 'express';
import { z } from 'zod';
import { methodValidationInputSchema } from '@shared/schemas/process-methods';
import {
  consigneeContactInputSchema,
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
import { validated } from '../../middleware/validate';
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
import { changeConsigneeContact, createConsignee, listConsignees, shipLot } from './shipments.service';
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
  const lotParams = idParams('lotId');

  router.get('/parts', requireAction('lots.read'), async (_req, res) => {
    res.json(await loadParts(data().manager));
  });
  router.get(
    '/parts/:partId',
    requireAction('lots.read'),
    ...validated({ params: idParams('partId') }, async (input, _req, res) => {
      res.json(await partById(data(), input.params.partId));
    }),
  );
  router.post(
    '/parts',
    requireAction('parts.manage'),
    ...validated({ body: partCreateSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(await createPart(data(), input.body, currentPerson(req)!, actorOf(req, 'parts.manage'), originOf(req)));
    }),
  );
  router.get('/process-methods', requireAction('lots.read'), async (_req, res) => {
    res.json(await listProcessMethods(data().manager));
  });
  router.post(
    '/process-methods/:methodId/validations',
    requireAction('methods.validate'),
    ...validated(
      { params: z.object({ methodId: z.string().trim().min(1).max(40) }), body: methodValidationInputSchema },
      async (input, req, res) => {
        const methodId = input.params.methodId;
        res
          .status(201)
          .json(
            await recordMethodValidation(
              data(),
              methodId,
              input.body,
              currentPerson(req)!,
              actorOf(req, 'methods.validate'),
              originOf(req),
            ),
          );
      },
    ),
  );

  router.get(
    '/lots',
    requireAction('lots.read'),
    ...validated({ query: lotListQuerySchema }, async (input, _req, res) => {
      res.json(await listLots(data(), input.query));
    }),
  );
  router.post(
    '/lots',
    requireAction('lots.write'),
    ...validated({ body: lotOpenSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(await openLot(data(), input.body, currentPerson(req)!, actorOf(req, 'lots.write'), originOf(req)));
    }),
  );
  router.post(
    '/lots/merges',
    requireAction('lots.write'),
    ...validated({ body: mergeInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(await mergeLots(data(), input.body, currentPerson(req)!, actorOf(req, 'lots.write'), originOf(req)));
    }),
  );
  router.get(
    '/lots/:lotId',
    requireAction('lots.read'),
    ...validated({ params: lotParams }, async (input, _req, res) => {
      res.json(await lotDetail(data(), input.params.lotId));
    }),
  );
  router.post(
    '/lots/:lotId/material-issues',
    requireAction('lots.write'),
    ...validated({ params: lotParams, body: materialMovementSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await issueMaterial(
            data(),
            input.params.lotId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    }),
  );
  router.post(
    '/lots/:lotId/material-returns',
    requireAction('lots.write'),
    ...validated({ params: lotParams, body: materialMovementSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await returnMaterial(
            data(),
            input.params.lotId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    }),
  );
  router.post(
    '/lots/:lotId/operations',
    requireAction('lots.write'),
    ...validated({ params: lotParams, body: operationInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await recordOperation(
            data(),
            input.params.lotId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    }),
  );
  router.post(
    '/lots/:lotId/operations/:operationId/files',
    requireAction('lots.write'),
    fileUpload,
    ...validated({ params: operationParams }, async (input, req, res) => {
      const { lotId, operationId } = input.params;
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
    }),
  );
  router.get(
    '/lots/:lotId/operations/:operationId/files/:documentId',
    requireAction('lots.read'),
    ...validated({ params: operationFileParams }, async (input, _req, res) => {
      const { lotId, operationId, documentId } = input.params;
      const file = await operationFile(data(), lotId, operationId, documentId);
      res
        .type(file.mediaType)
        .set('X-Content-Type-Options', 'nosniff')
        .set('Content-Security-Policy', "default-src 'none'; sandbox")
        .set('Digest', `sha-256=${Buffer.from(file.sha256, 'hex').toString('base64')}`)
        .attachment(file.name)
        .send(file.content);
    }),
  );
  router.post(
    '/lots/:lotId/splits',
    requireAction('lots.write'),
    ...validated({ params: lotParams, body: splitInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await splitLot(
            data(),
            input.params.lotId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'lots.write'),
            originOf(req),
          ),
        );
    }),
  );
  router.post(
    '/lots/:lotId/shipments',
    requireAction('shipments.write'),
    ...validated({ params: lotParams, body: shipmentInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await shipLot(
            data(),
            input.params.lotId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'shipments.write'),
            originOf(req),
          ),
        );
    }),
  );

  router.get(
    '/process-runs',
    requireAction('lots.read'),
    ...validated({ query: processRunListQuerySchema }, async (input, _req, res) => {
      res.json(await listProcessRuns(data(), input.query));
    }),
  );
  router.get(
    '/process-runs/:runId',
    requireAction('lots.read'),
    ...validated({ params: idParams('runId') }, async (input, _req, res) => {
      res.json(await processRunDetail(data(), input.params.runId));
    }),
  );
  router.post(
    '/process-runs',
    requireAction('lots.write'),
    ...validated({ body: processRunInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await recordProcessRun(data(), input.body, currentPerson(req)!, actorOf(req, 'lots.write'), originOf(req)),
        );
    }),
  );

  router.get(
    '/nonconformances',
    requireAction('lots.read'),
    ...validated({ query: nonconformanceListQuerySchema }, async (input, _req, res) => {
      res.json(await listNonconformances(data(), input.query));
    }),
  );
  router.get(
    '/nonconformances/:ncId',
    requireAction('lots.read'),
    ...validated({ params: idParams('ncId') }, async (input, _req, res) => {
      res.json(await nonconformanceDetail(data(), input.params.ncId));
    }),
  );
  router.post(
    '/nonconformances',
    requireAction('nonconformances.raise'),
    ...validated({ body: nonconformanceInputSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await raiseNonconformance(
            data(),
            input.body,
            currentPerson(req)!,
            actorOf(req, 'nonconformances.raise'),
            originOf(req),
          ),
        );
    }),
  );
  router.put(
    '/nonconformances/:ncId/disposition',
    requireAction('nonconformances.disposition'),
    ...validated({ params: idParams('ncId'), body: dispositionInputSchema }, async (input, req, res) => {
      res.json(
        await proposeDisposition(
          data(),
          input.params.ncId,
          input.body,
          actorOf(req, 'nonconformances.disposition'),
          originOf(req),
        ),
      );
    }),
  );

  router.get('/consignees', requireAction('lots.read'), async (_req, res) => {
    res.json(await listConsignees(data()));
  });
  router.post(
    '/consignees',
    requireAction('shipments.write'),
    ...validated({ body: consigneeInputSchema }, async (input, req, res) => {
      res.status(201).json(await createConsignee(data(), input.body, actorOf(req, 'shipments.write'), originOf(req)));
    }),
  );
  router.put(
    '/consignees/:consigneeId/contact',
    requireAction('shipments.write'),
    ...validated({ params: idParams('consigneeId'), body: consigneeContactInputSchema }, async (input, req, res) => {
      res.json(
        await changeConsigneeContact(
          data(),
          input.params.consigneeId,
          input.body,
          actorOf(req, 'shipments.write'),
          originOf(req),
        ),
      );
    }),
  );
  return router;
}
