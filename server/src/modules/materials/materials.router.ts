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
  type SpecificationDraftInput,
  type ResultsImport,
  type TrendQuery,
  type HeatCreate,
  type HeatListQuery,
  type HeatResults,
} from '@shared/schemas/materials';
import { screeningAcknowledgementSchema, type ScreeningAcknowledgementInput } from '@shared/schemas/screening';
import type { AppContext } from '../../app-context';
import { AppError } from '../../errors';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { singleFileUpload } from '../../middleware/single-file-upload';
import { CERTIFICATE_MAX_BYTES } from './certificate-files';
import { currentSpecifications } from './specification-library.repository';
import { attachCertificate, certificateFile, heatDetail, listHeats, receiveHeat, recordResults } from './heats.service';
import { changeSupplierApproval, createSupplier, listSuppliers } from './suppliers.service';
import { elementTrend } from './trends.service';
import { importResults } from './results-import.service';
import { draftRevision, listDrafts } from './specification-drafts.service';
import { acknowledgeFinding, screeningOfSupplier } from './certificate-screening.service';
import {
  checkAnalysisInputSchema,
  checkRuleInputSchema,
  type CheckAnalysisInput,
  type CheckRuleInput,
} from '@shared/schemas/check-analysis';
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
    validate({ body: specificationDraftSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await draftRevision(
            dataSource(),
            res.locals.valid.body as SpecificationDraftInput,
            currentPerson(req)!,
            actorOf(req, 'specifications.draft'),
            originOf(req),
          ),
        );
    },
  );

  router.get('/suppliers', requireAction('materials.read'), async (_req, res) => {
    res.json(await listSuppliers(dataSource()));
  });
  router.post(
    '/suppliers',
    requireAction('suppliers.manage'),
    validate({ body: supplierCreateSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await createSupplier(dataSource(), res.locals.valid.body, actorOf(req, 'suppliers.manage'), originOf(req)),
        );
    },
  );
  router.put(
    '/suppliers/:supplierId/approval',
    requireAction('suppliers.manage'),
    validate({ params: supplierIdParamsSchema, body: supplierApprovalSchema }),
    async (req, res) => {
      const { supplierId } = res.locals.valid.params as { supplierId: number };
      res.json(
        await changeSupplierApproval(
          dataSource(),
          supplierId,
          res.locals.valid.body,
          actorOf(req, 'suppliers.manage'),
          originOf(req),
        ),
      );
    },
  );

  router.get('/trends', requireAction('materials.read'), validate({ query: trendQuerySchema }), async (_req, res) => {
    res.json(await elementTrend(dataSource(), res.locals.valid.query as TrendQuery));
  });

  router.get('/heats', requireAction('materials.read'), validate({ query: heatListQuerySchema }), async (_req, res) => {
    res.json(await listHeats(dataSource(), res.locals.valid.query as HeatListQuery));
  });
  router.post('/heats', requireAction('materials.write'), validate({ body: heatCreateSchema }), async (req, res) => {
    res
      .status(201)
      .json(
        await receiveHeat(
          dataSource(),
          res.locals.valid.body as HeatCreate,
          currentPerson(req)!,
          actorOf(req, 'materials.write'),
          originOf(req),
        ),
      );
  });
  router.post(
    '/heat-results/imports',
    requireAction('materials.write'),
    validate({ body: resultsImportSchema }),
    async (req, res) => {
      res.json(
        await importResults(
          dataSource(),
          res.locals.valid.body as ResultsImport,
          currentPerson(req)!,
          actorOf(req, 'materials.write'),
          originOf(req),
        ),
      );
    },
  );
  router.get(
    '/heats/:heatId',
    requireAction('materials.read'),
    validate({ params: heatIdParamsSchema }),
    async (_req, res) => {
      res.json(await heatDetail(dataSource(), (res.locals.valid.params as { heatId: number }).heatId));
    },
  );
  router.get(
    '/suppliers/:supplierId/screening',
    requireAction('materials.read'),
    validate({ params: supplierIdParamsSchema }),
    async (_req, res) => {
      res.json(
        await screeningOfSupplier(dataSource().manager, (res.locals.valid.params as { supplierId: number }).supplierId),
      );
    },
  );
  router.post(
    '/heats/:heatId/screening-acknowledgements',
    requireAction('materials.disposition'),
    validate({ params: heatIdParamsSchema, body: screeningAcknowledgementSchema }),
    async (req, res) => {
      const { heatId } = res.locals.valid.params as { heatId: number };
      const body = res.locals.valid.body as ScreeningAcknowledgementInput;
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
    },
  );
  router.get('/check-analysis-rules', requireAction('materials.read'), async (_req, res) => {
    res.json({ rules: await currentRules(dataSource().manager) });
  });
  router.post(
    '/check-analysis-rules',
    requireAction('suppliers.manage'),
    validate({ body: checkRuleInputSchema }),
    async (req, res) => {
      const rules = await setCheckRule(
        dataSource(),
        res.locals.valid.body as CheckRuleInput,
        currentPerson(req)!,
        actorOf(req, 'suppliers.manage'),
        originOf(req),
      );
      res.status(201).json({ rules });
    },
  );
  router.get('/check-analyses/due', requireAction('materials.read'), async (_req, res) => {
    res.json({ heats: await heatsAwaitingCheck(dataSource().manager) });
  });
  router.post(
    '/heats/:heatId/check-analyses',
    requireAction('materials.write'),
    validate({ params: heatIdParamsSchema, body: checkAnalysisInputSchema }),
    async (req, res) => {
      const { heatId } = res.locals.valid.params as { heatId: number };
      res
        .status(201)
        .json(
          await recordCheckAnalysis(
            dataSource(),
            heatId,
            res.locals.valid.body as CheckAnalysisInput,
            currentPerson(req)!,
            actorOf(req, 'materials.write'),
            originOf(req),
          ),
        );
    },
  );
  router.put(
    '/heats/:heatId/results',
    requireAction('materials.write'),
    validate({ params: heatIdParamsSchema, body: heatResultsSchema }),
    async (req, res) => {
      const { heatId } = res.locals.valid.params as { heatId: number };
      res.json(
        await recordResults(
          dataSource(),
          heatId,
          res.locals.valid.body as HeatResults,
          currentPerson(req)!,
          actorOf(req, 'materials.write'),
          originOf(req),
        ),
      );
    },
  );
  router.post(
    '/heats/:heatId/certificates',
    requireAction('materials.write'),
    validate({ params: heatIdParamsSchema }),
    certificateUpload,
    async (req, res) => {
      const { heatId } = res.locals.valid.params as { heatId: number };
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
    },
  );
  router.get(
    '/heats/:heatId/certificates/:documentId',
    requireAction('materials.read'),
    validate({ params: documentParamsSchema }),
    async (_req, res) => {
      const { heatId, documentId } = res.locals.valid.params as { heatId: number; documentId: number };
      const document = await certificateFile(dataSource(), heatId, documentId);
      res
        .type(document.mediaType)
        .set('X-Content-Type-Options', 'nosniff')
        .set('Content-Security-Policy', "default-src 'none'; sandbox")
        .set('Digest', `sha-256=${Buffer.from(document.sha256, 'hex').toString('base64')}`)
        .attachment(document.originalName)
        .send(document.content);
    },
  );

  return router;
}
