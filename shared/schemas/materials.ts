import { z } from 'zod';
import { pageOf } from './page';
import { heatScreeningSchema } from './screening';
import { heatCheckAnalysisSchema } from './check-analysis';
import { checkedString } from './checked-string';
import { productConditions, productForms } from '../domain/materials/specification';
import { evaluationSchema, overallVerdicts } from './evaluation';
import { decimalPattern } from '../domain/materials/e29-rounding';

export const supplierApprovals = ['approved', 'conditional', 'disqualified'] as const;
export const supplierApprovalLabels: Record<(typeof supplierApprovals)[number], string> = {
  approved: 'Approved',
  conditional: 'Conditionally approved',
  disqualified: 'Disqualified',
};
export const supplierSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  country: z.string(),
  approval: z.enum(supplierApprovals),
  heats: z.number().int(),
});
export type Supplier = z.infer<typeof supplierSchema>;

export const supplierCreateSchema = z.object({
  name: z.string().trim().min(2, 'Give the supplier’s name').max(200),
  country: z.string().trim().min(2, 'Give the country').max(100),
  approval: z.enum(supplierApprovals),
  reason: z.string().trim().min(3, 'Give a reason of at least 3 characters').max(1000),
});
export const supplierApprovalSchema = z.object({
  approval: z.enum(supplierApprovals),
  reason: z.string().trim().min(3, 'Give a reason of at least 3 characters').max(1000),
});

const positiveDecimal = z
  .union([z.string(), z.number()])
  .transform((value) => String(value).trim())
  .refine(
    (value) => decimalPattern.test(value) && Number(value) > 0,
    'Expected a positive decimal number such as 25.4',
  );

export const heatStatuses = ['received', 'accepted', 'rejected', 'quarantined'] as const;

/** Why a YYYY-MM-DD day cannot be a receipt date, or null when it can. */
function receiptDayProblem(day: string): string | null {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(day)) return 'A date as YYYY-MM-DD';
  const time = Date.parse(`${day}T00:00:00Z`);
  if (Number.isNaN(time) || new Date(time).toISOString().slice(0, 10) !== day) return 'Not a calendar date';
  if (day < '2000-01-01') return 'A date from 2000 on';
  if (time > Date.now()) return 'Not in the future';
  return null;
}

const calendarDay = checkedString(z.string(), receiptDayProblem);

export const heatCreateSchema = z.object({
  heatNumber: z
    .string()
    .trim()
    .min(1, 'Give the heat number as marked on the certificate')
    .max(60)
    .regex(/^[A-Za-z0-9][A-Za-z0-9 ./-]*$/, 'Letters, digits, space, dot, slash and hyphen only'),
  supplierId: z.number().int().positive('Choose a supplier'),
  specId: z.string().trim().min(1, 'Choose a specification'),
  grade: z.string().trim().max(20).nullable().default(null),
  meltRoute: z.string().trim().min(2, 'Give the melt route, e.g. VAR ×2').max(100),
  productForm: z.enum(productForms),
  sizeMm: positiveDecimal,
  condition: z.enum(productConditions, 'Choose the condition stated on the certificate'),
  /** The day the heat arrived, when it is recorded later than that (YYYY-MM-DD, not in the future). */
  receivedOn: calendarDay.optional(),
});
export type HeatCreate = z.input<typeof heatCreateSchema>;

export const heatSummarySchema = z.object({
  id: z.number().int(),
  heatNumber: z.string(),
  supplier: z.object({ id: z.number().int(), name: z.string(), approval: z.enum(supplierApprovals) }),
  spec: z.object({ id: z.string(), revision: z.string(), grade: z.string().nullable() }),
  meltRoute: z.string(),
  productForm: z.string(),
  sizeMm: z.string(),
  condition: z.string(),
  status: z.enum(heatStatuses),
  verdict: z.enum(overallVerdicts).nullable(),
  receivedAt: z.string(),
  receivedBy: z.string(),
});
export type HeatSummary = z.infer<typeof heatSummarySchema>;

export const heatListQuerySchema = z.object({
  search: z.string().trim().max(60).optional(),
  status: z.enum(heatStatuses).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type HeatListQuery = z.infer<typeof heatListQuerySchema>;
export const heatPageSchema = pageOf(heatSummarySchema);

const reported = z.union([z.string().trim().min(1).max(40), z.number().finite()]);
export const heatResultsSchema = z.object({
  chemistry: z.record(z.string().regex(/^[A-Z][a-z]?$/, 'Element symbols such as O or Fe'), reported).default({}),
  mechanical: z
    .object({
      utsMPa: reported.optional(),
      ysMPa: reported.optional(),
      elongationPct: reported.optional(),
      reductionOfAreaPct: reported.optional(),
    })
    .strict()
    .default({}),
  reason: z.string().trim().max(1000).optional(),
});
export type HeatResults = z.input<typeof heatResultsSchema>;

export const certificateDocumentSchema = z.object({
  id: z.number().int(),
  sha256: z.string(),
  mediaType: z.string(),
  sizeBytes: z.number().int(),
  originalName: z.string(),
  uploadedAt: z.string(),
});
export type CertificateDocument = z.infer<typeof certificateDocumentSchema>;

export const heatDetailSchema = heatSummarySchema.extend({
  results: z.object({ chemistry: z.record(z.string(), z.string()), mechanical: z.record(z.string(), z.string()) }),
  evaluation: evaluationSchema.nullable(),
  /** A QA approver's signed justification covering the current evaluation, when some items cannot be evaluated. */
  justification: z.object({ signatureId: z.number().int(), manifestation: z.string(), reason: z.string() }).nullable(),
  certificates: z.array(certificateDocumentSchema),
  /** Cross-certificate checks: other heats with exactly the same results or the very same document. */
  crossChecks: z.object({ identicalResultsOn: z.array(z.string()), sameDocumentOn: z.array(z.string()) }),
  /** Screening of all certificates of the heat's supplier and specification (findings involving this heat). */
  screening: heatScreeningSchema,
  checkAnalysis: heatCheckAnalysisSchema,
});
export type HeatDetail = z.infer<typeof heatDetailSchema>;

export const supplierIdParamsSchema = z.object({ supplierId: z.coerce.number().int().positive() });
export const heatIdParamsSchema = z.object({ heatId: z.coerce.number().int().positive() });
export const documentParamsSchema = heatIdParamsSchema.extend({ documentId: z.coerce.number().int().positive() });

const tagSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{2,39}$/, 'A tag is 3–40 letters, digits and hyphens, e.g. NV-1107-01');

export const barPieceSchema = z.object({
  id: z.number().int(),
  tag: z.string(),
  heat: z.object({
    id: z.number().int(),
    heatNumber: z.string(),
    status: z.enum(heatStatuses),
    specId: z.string(),
    grade: z.string().nullable(),
  }),
  /**
   * The heat number read off the bar at receipt and matched to the certificate (null before receipts were confirmed).
   */
  markedHeatNumber: z.string().nullable(),
  parentTag: z.string().nullable(),
  childTags: z.array(z.string()),
  diameterMm: z.string(),
  lengthMm: z.string(),
  remainingMm: z.string(),
  massKg: z.string().nullable(),
  location: z.string(),
  status: z.enum(['in-stock', 'cut']),
  createdAt: z.string(),
  createdBy: z.string(),
});
export type BarPiece = z.infer<typeof barPieceSchema>;

export const barReceiptSchema = z.object({
  heatId: z.number().int().positive('Choose the heat'),
  markedHeatNumber: z.string().trim().min(1, 'Type or scan the heat number marked on the bar').max(60),
  tag: tagSchema,
  diameterMm: positiveDecimal,
  lengthMm: positiveDecimal,
  massKg: positiveDecimal.nullable().default(null),
  location: z.string().trim().min(1, 'Where is the bar stored?').max(100),
});
export type BarReceipt = z.input<typeof barReceiptSchema>;

export const barCutSchema = z.object({
  pieces: z
    .array(z.object({ lengthMm: positiveDecimal, location: z.string().trim().max(100).optional() }))
    .min(2, 'A cut makes at least two pieces')
    .max(50),
});
export type BarCut = z.input<typeof barCutSchema>;

export const barListQuerySchema = z.object({
  heatId: z.coerce.number().int().positive().optional(),
  search: z.string().trim().max(40).optional(),
  inStockOnly: z.enum(['true', 'false']).default('false'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type BarListQuery = z.infer<typeof barListQuerySchema>;
export const barPageSchema = pageOf(barPieceSchema);
export const barPieceParamsSchema = z.object({ pieceId: z.coerce.number().int().positive() });

export const trendQuerySchema = z.object({
  supplierId: z.coerce.number().int().positive('Choose a supplier'),
  specId: z.string().trim().min(1, 'Choose a specification'),
  grade: z.string().trim().max(20).optional(),
  element: z.string().regex(/^[A-Z][a-z]?$/, 'Choose an element'),
});
export type TrendQuery = z.infer<typeof trendQuerySchema>;

const capabilityIndexSchema = z.object({
  value: z.string().nullable(),
  sigma: z.string().nullable(),
  formula: z.string(),
  interval: z.object({ low: z.string(), high: z.string() }).nullable(),
});

export const trendSchema = z.object({
  element: z.string(),
  limit: z.object({ min: z.string().optional(), max: z.string().optional(), text: z.string() }),
  points: z.array(
    z.object({ heatId: z.number().int(), heatNumber: z.string(), receivedAt: z.string(), value: z.string() }),
  ),
  capability: z.object({
    n: z.number().int(),
    mean: z.string().nullable(),
    sigma: z.string().nullable(),
    ppk: capabilityIndexSchema,
    cpk: capabilityIndexSchema,
    minimumForClaim: z.number().int(),
    indicativeOnly: z.boolean(),
    formula: z.string(),
    runRule: z.object({ triggered: z.boolean(), fromIndex: z.number().int().nullable(), rule: z.string() }),
  }),
});
export type Trend = z.infer<typeof trendSchema>;

export const resultsImportSchema = z.object({
  csv: z.string().min(1, 'The file is empty').max(900_000, 'Import at most about 900 kB of CSV at a time'),
  /** check: report only; all: write only if every row is valid; valid-only: write the valid rows. */
  mode: z.enum(['check', 'all', 'valid-only']),
});
export type ResultsImport = z.infer<typeof resultsImportSchema>;

export const resultsImportReportSchema = z.object({
  rows: z.number().int(),
  valid: z.number().int(),
  imported: z.number().int(),
  errors: z.array(z.object({ line: z.number().int(), field: z.string(), message: z.string() })),
  verdicts: z.array(z.object({ line: z.number().int(), heatNumber: z.string(), verdict: z.string() })),
});
export type ResultsImportReport = z.infer<typeof resultsImportReportSchema>;

const limitValue = z
  .string()
  .trim()
  .regex(/^\d+(\.\d+)?$/, 'A limit is a decimal number written as in the standard, e.g. 0.13')
  .optional();

/** A proposed revision: changes to the chemistry limits of the current revision, with their source. */
export const specificationDraftSchema = z.object({
  specId: z.string().trim().min(1),
  revision: z
    .string()
    .trim()
    .regex(/^[A-Za-z0-9][A-Za-z0-9.-]{0,19}$/, 'A short label such as L2'),
  edition: z.string().trim().min(3, 'Name the edition of the standard, e.g. F136-13').max(200),
  note: z.string().trim().min(3, 'Say why the revision is needed').max(1000),
  limits: z
    .array(
      z.object({
        grade: z.string().nullable(),
        element: z.string().regex(/^[A-Z][a-z]?$/),
        min: limitValue,
        max: limitValue,
        reference: z.string().trim().min(3, 'Name the source of the value').max(300),
        /** How sure the drafter is: published (with its citation), the firm's own value, or unverified. */
        confidence: z.enum(
          ['published', 'firm', 'unconfirmed'],
          'Say how sure the value is: published, the firm’s own, or unverified',
        ),
        /**
         * The product (check) analysis tolerance; re-entered whenever the limit changes, as it may depend on the limit.
         */
        tolerance: z.object({ under: limitValue, over: limitValue }).optional(),
      }),
    )
    .min(1, 'Change at least one limit')
    .max(200),
});
export type SpecificationDraftInput = z.infer<typeof specificationDraftSchema>;

export const specificationDraftViewSchema = z.object({
  id: z.number().int(),
  specId: z.string(),
  baseRevision: z.string(),
  revision: z.string(),
  note: z.string(),
  status: z.enum(['draft', 'approved', 'rejected']),
  createdBy: z.string(),
  createdAt: z.string(),
  changes: z.array(
    z.object({
      grade: z.string().nullable(),
      element: z.string(),
      from: z.string(),
      to: z.string(),
      reference: z.string(),
    }),
  ),
});
export type SpecificationDraftView = z.infer<typeof specificationDraftViewSchema>;

/** The saw kerf allowed per cut (the organisation's setting), for checking a cut while it is typed. */
export const barCutAllowanceSchema = z.object({ kerfAllowancePerCutMm: z.string() });
export type BarCutAllowance = z.infer<typeof barCutAllowanceSchema>;
