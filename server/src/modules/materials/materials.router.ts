import { Router } from 'express';
import { specificationLibrary } from '@shared/domain/materials/library';
import { limitCaution } from '@shared/domain/materials/specification';
import {
  documentParamsSchema,
  heatCreateSchema,
  heatIdParamsSchema,
  heatListQuerySchema,
  heatResultsSchema,
  supplierApprovalSchema,
  supplierCreateSchema,
  supplierIdParamsSchema,
  trendQuerySchema,
  resultsImportSchema,
  specificationDraftSchema,
} from '@shared/schemas/materials';
import { screeningAcknowledgementSchema } from '@shared/schemas/screening';
import type { AppContext } from '../../app-context';
import { AppError } from '../../errors';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { singleFileUpload } from '../../middleware/single-file-upload';
import { CERTIFICATE_MAX_BYTES } from './certificate-files';
import { currentSpecifications } from './specification-library.repository';
import { attachCertificate, certificateFile, heatDetail, listHeats, receiveHeat, recordResults } from './heats.service';
import { changeSupplierApproval, createSupplier, listSuppliers } from './suppliers.service';
import { elementTrend } from './trends.service';
import { importResults } from './results-import.service';
import { draftRevision, listDrafts } from './specification-drafts.service';
import { acknowledgeFinding, screeningOfSupplier } from './certificate-screening.service';
import { checkAnalysisInputSchema, checkRuleInputSchema } from '@shared/schemas/check-analysis';
import { currentRules, heatsAwaitingCheck, recordCheckAnalysis, setCheckRule } from './check-analysis.service';

const certificateUpload = singleFileUpload('certificate', CERTIFICATE_MAX_BYTES, 'certificate');

export function materialsRouter(context: AppContext): Router {
  const router = Router();
  const dataSource = () => context.database.dataSource;

  router.get('/specifications', requireAction('materials.read'), async (_req, res) => {
    const stored = await currentSpecifications(dataSource().manager);
    res.json({ caution: limitCaution, specifications: stored.length ? stored : specificationLibrary });
  });

  router.get('/specification-drafts', requireAction('materials.read'), async (_req, res) => {
    res.json(await listDrafts(dataSource()));
  });
  router.post(
    '/specification-drafts',
    requireAction('specifications.draft'),
    ...validated({ body: specificationDraftSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await draftRevision(
            dataSource(),
            input.body,
            currentPerson(req)!,
            actorOf(req, 'specifications.draft'),
            originOf(req),
          ),
        );
    }),
  );

  router.get('/suppliers', requireAction('materials.read'), async (_req, res) => {
    res.json(await listSuppliers(dataSource()));
  });
  router.post(
    '/suppliers',
    requireAction('suppliers.manage'),
    ...validated({ body: supplierCreateSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(await createSupplier(dataSource(), input.body, actorOf(req, 'suppliers.manage'), originOf(req)));
    }),
  );
  router.put(
    '/suppliers/:supplierId/approval',
    requireAction('suppliers.manage'),
    ...validated({ params: supplierIdParamsSchema, body: supplierApprovalSchema }, async (input, req, res) => {
      const { supplierId } = input.params;
      res.json(
        await changeSupplierApproval(
          dataSource(),
          supplierId,
          input.body,
          actorOf(req, 'suppliers.manage'),
          originOf(req),
        ),
      );
    }),
  );

  router.get(
    '/trends',
    requireAction('materials.read'),
    ...validated({ query: trendQuerySchema }, async (input, _req, res) => {
      res.json(await elementTrend(dataSource(), input.query));
    }),
  );

  router.get(
    '/heats',
    requireAction('materials.read'),
    ...validated({ query: heatListQuerySchema }, async (input, _req, res) => {
      res.json(await listHeats(dataSource(), input.query));
    }),
  );
  router.post(
    '/heats',
    requireAction('materials.write'),
    ...validated({ body: heatCreateSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await receiveHeat(
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
    '/heat-results/imports',
    requireAction('materials.write'),
    ...validated({ body: resultsImportSchema }, async (input, req, res) => {
      res.json(
        await importResults(
          dataSource(),
          input.body,
          currentPerson(req)!,
          actorOf(req, 'materials.write'),
          originOf(req),
        ),
      );
    }),
  );
  router.get(
    '/heats/:heatId',
    requireAction('materials.read'),
    ...validated({ params: heatIdParamsSchema }, async (input, _req, res) => {
      res.json(await heatDetail(dataSource(), input.params.heatId));
    }),
  );
  router.get(
    '/suppliers/:supplierId/screening',
    requireAction('materials.read'),
    ...validated({ params: supplierIdParamsSchema }, async (input, _req, res) => {
      res.json(await screeningOfSupplier(dataSource().manager, input.params.supplierId));
    }),
  );
  router.post(
    '/heats/:heatId/screening-acknowledgements',
    requireAction('materials.disposition'),
    ...validated({ params: heatIdParamsSchema, body: screeningAcknowledgementSchema }, async (input, req, res) => {
      const { heatId } = input.params;
      const body = input.body;
      res
        .status(201)
        .json(
          await acknowledgeFinding(
            dataSource(),
            heatId,
            body,
            currentPerson(req)!,
            actorOf(req, 'materials.disposition'),
            originOf(req),
          ),
        );
    }),
  );
  router.get('/check-analysis-rules', requireAction('materials.read'), async (_req, res) => {
    res.json({ rules: await currentRules(dataSource().manager) });
  });
  router.post(
    '/check-analysis-rules',
    requireAction('suppliers.manage'),
    ...validated({ body: checkRuleInputSchema }, async (input, req, res) => {
      const rules = await setCheckRule(
        dataSource(),
        input.body,
        currentPerson(req)!,
        actorOf(req, 'suppliers.manage'),
        originOf(req),
      );
      res.status(201).json({ rules });
    }),
  );
  router.get('/check-analyses/due', requireAction('materials.read'), async (_req, res) => {
    res.json({ heats: await heatsAwaitingCheck(dataSource().manager) });
  });
  router.post(
    '/heats/:heatId/check-analyses',
    requireAction('materials.write'),
    ...validated({ params: heatIdParamsSchema, body: checkAnalysisInputSchema }, async (input, req, res) => {
      const { heatId } = input.params;
      res
        .status(201)
        .json(
          await recordCheckAnalysis(
            dataSource(),
            heatId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'materials.write'),
            originOf(req),
          ),
        );
    }),
  );
  router.put(
    '/heats/:heatId/results',
    requireAction('materials.write'),
    ...validated({ params: heatIdParamsSchema, body: heatResultsSchema }, async (input, req, res) => {
      const { heatId } = input.params;
      res.json(
        await recordResults(
          dataSource(),
          heatId,
          input.body,
          currentPerson(req)!,
          actorOf(req, 'materials.write'),
          originOf(req),
        ),
      );
    }),
  );
  router.post(
    '/heats/:heatId/certificates',
    requireAction('materials.write'),
    certificateUpload,
    ...validated({ params: heatIdParamsSchema }, async (input, req, res) => {
      const { heatId } = input.params;
      if (!req.file)
        throw new AppError('VALIDATION_FAILED', 'Choose a certificate file to upload', { certificate: 'No file' });
      const originalName = Buffer.from(req.file.originalname, 'latin1').toString('utf8');
      res
        .status(201)
        .json(
          await attachCertificate(
            dataSource(),
            heatId,
            { bytes: req.file.buffer, originalName },
            currentPerson(req)!,
            actorOf(req, 'materials.write'),
            originOf(req),
          ),
        );
    }),
  );
  router.get(
    '/heats/:heatId/certificates/:documentId',
    requireAction('materials.read'),
    ...validated({ params: documentParamsSchema }, async (input, _req, res) => {
      const { heatId, documentId } = input.params;
      const document = await certificateFile(dataSource(), heatId, documentId);
      res
        .type(document.mediaType)
        .set('X-Content-Type-Options', 'nosniff')
        .set('Content-Security-Policy', "default-src 'none'; sandbox")
        .set('Digest', `sha-256=${Buffer.from(document.sha256, 'hex').toString('base64')}`)
        .attachment(document.originalName)
        .send(document.content);
    }),
  );

  return router;
}
