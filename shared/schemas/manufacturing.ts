import { z } from 'zod';
import { pageOf } from './page';
import { gtinProblem } from '../domain/gs1/gtin';
import { checkedString } from './checked-string';
import { lotPatternProblem } from '../domain/manufacturing/lot-number';
import { samplingPlanProblem } from '../domain/manufacturing/inspection';
import { contactCategories } from '../domain/manufacturing/contact-categories';

const decimalPattern = /^\d+(\.\d+)?$/;
const decimal = (message: string, positive = true) =>
  z
    .union([z.string(), z.number()])
    .transform((value) => String(value).trim())
    .refine((value) => decimalPattern.test(value) && (!positive || Number(value) > 0), message);
const count = (label: string) =>
  z
    .number({ error: `${label} is a whole number` })
    .int(`${label} is a whole number`)
    .min(0, `${label} cannot be negative`)
    .max(10_000_000);
const text = (min: number, max: number, message: string) => z.string().trim().min(min, message).max(max);
const page = {
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
};
const instant = z.iso.datetime({ offset: true, error: 'A date and time such as 2026-03-14T09:30:00Z' });

export const routingKinds = ['machining', 'passivation', 'cleaning', 'inspection', 'packaging'] as const;
export const lotStatuses = ['open', 'consumed', 'submitted', 'reviewed', 'released', 'rejected'] as const;
export const nonconformanceSubjects = ['heat', 'bar-piece', 'lot', 'process-run'] as const;
export const dispositions = ['use-as-is', 'rework', 'scrap', 'return-to-supplier'] as const;
export const consigneeKinds = ['customer', 'distributor', 'hospital'] as const;

export const routingStepInputSchema = z
  .object({
    kind: z.enum(routingKinds),
    name: text(2, 100, 'Name the step'),
    processMethod: z.string().trim().max(40).nullable().default(null),
    sampleSize: z.number().int().nullable().default(null),
    acceptNumber: z.number().int().nullable().default(null),
    rejectNumber: z.number().int().nullable().default(null),
  })
  .superRefine((step, context) => {
    if (step.kind === 'inspection') {
      const problem =
        step.sampleSize === null || step.acceptNumber === null || step.rejectNumber === null
          ? 'An inspection step needs its sampling plan (sample size, Ac, Re)'
          : samplingPlanProblem({
              sampleSize: step.sampleSize,
              acceptNumber: step.acceptNumber,
              rejectNumber: step.rejectNumber,
            });
      if (problem) context.addIssue({ code: 'custom', message: problem, path: ['sampleSize'] });
    }
    if ((step.kind === 'passivation' || step.kind === 'cleaning') && !step.processMethod) {
      context.addIssue({
        code: 'custom',
        message: 'Name the process method this step must use',
        path: ['processMethod'],
      });
    }
  });

export const partCreateSchema = z
  .object({
    partNumber: z
      .string()
      .trim()
      .regex(/^[A-Za-z0-9][A-Za-z0-9-]{1,39}$/, 'Letters, digits and hyphens, 2–40 characters'),
    revision: z
      .string()
      .trim()
      .regex(/^[A-Za-z0-9]{1,10}$/, 'Letters and digits, up to 10'),
    description: text(3, 200, 'Describe the part'),
    gtin: checkedString(z.string().trim(), gtinProblem),
    unitLengthMm: decimal('The finished length in mm, e.g. 42.5'),
    cutoffAllowanceMm: decimal('The cut-off allowance per unit in mm, e.g. 3.2', false),
    unitMassG: decimal('The unit mass in g').nullable().default(null),
    reconciliationTolerancePct: decimal('A percentage such as 2', false).default('2'),
    lotPattern: z.string().trim().min(5).max(60).default('{PART}-{YY}{SEQ:4}'),
    contactCategory: z.enum(contactCategories, { error: 'Choose where the finished device touches the body' }),
    specifications: z
      .array(z.object({ specId: z.string().trim().min(1), grade: z.string().trim().max(20).nullable().default(null) }))
      .min(1, 'Allow at least one material specification'),
    routing: z.array(routingStepInputSchema).min(1, 'A routing has at least one step').max(40),
  })
  .superRefine((part, context) => {
    const problem = lotPatternProblem(part.lotPattern, part.partNumber);
    if (problem) context.addIssue({ code: 'custom', message: problem, path: ['lotPattern'] });
  });
export type PartCreate = z.input<typeof partCreateSchema>;

export const routingStepSchema = z.object({
  id: z.number().int(),
  stepNo: z.number().int(),
  kind: z.enum(routingKinds),
  name: z.string(),
  processMethod: z.string().nullable(),
  sampleSize: z.number().int().nullable(),
  acceptNumber: z.number().int().nullable(),
  rejectNumber: z.number().int().nullable(),
});
export type RoutingStep = z.infer<typeof routingStepSchema>;

export const partSchema = z.object({
  id: z.number().int(),
  partNumber: z.string(),
  revision: z.string(),
  description: z.string(),
  gtin: z.string(),
  unitLengthMm: z.string(),
  cutoffAllowanceMm: z.string(),
  unitMassG: z.string().nullable(),
  reconciliationTolerancePct: z.string(),
  lotPattern: z.string(),
  contactCategory: z.enum(contactCategories),
  specifications: z.array(z.object({ specId: z.string(), grade: z.string().nullable() })),
  routing: z.array(routingStepSchema),
  lots: z.number().int(),
});
export type Part = z.infer<typeof partSchema>;

/** Path parameters that are record ids, named as the route names them. */
export const idParams = <Name extends string>(...names: Name[]) =>
  z.object(
    Object.fromEntries(names.map((name) => [name, z.coerce.number().int().positive().max(4_294_967_295)])) as Record<
      Name,
      z.ZodCoercedNumber<unknown>
    >,
  );

export const lotOpenSchema = z.object({
  partId: z.number().int().positive('Choose the part'),
  plannedQty: z
    .number({ error: 'The planned quantity is a whole number' })
    .int('The planned quantity is a whole number')
    .min(1, 'Plan at least one unit')
    .max(1_000_000),
  openedOn: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD')
    .optional(),
});
export type LotOpen = z.input<typeof lotOpenSchema>;

export const lotListQuerySchema = z.object({
  search: z.string().trim().max(40).optional(),
  status: z.enum(lotStatuses).optional(),
  partId: z.coerce.number().int().positive().optional(),
  /** Only open lots whose next routing step is of this kind (e.g. due for passivation). */
  dueFor: z.enum(routingKinds).optional(),
  sort: z.enum(['lotNumber', 'openedAt', 'status']).default('openedAt'),
  order: z.enum(['asc', 'desc']).default('desc'),
  ...page,
});
export type LotListQuery = z.infer<typeof lotListQuerySchema>;

export const lotSummarySchema = z.object({
  id: z.number().int(),
  lotNumber: z.string(),
  part: z.object({ id: z.number().int(), partNumber: z.string(), revision: z.string(), description: z.string() }),
  plannedQty: z.number().int(),
  status: z.enum(lotStatuses),
  origin: z.enum(['bar', 'split', 'merge']),
  onHand: z.number().int().nullable(),
  heats: z.array(z.string()),
  /** The next routing step to record, or null when the routing is complete. */
  nextStep: z.string().nullable(),
  openNonconformances: z.number().int(),
  openedAt: z.string(),
  openedBy: z.string(),
});
export type LotSummary = z.infer<typeof lotSummarySchema>;
export const lotPageSchema = pageOf(lotSummarySchema);

export const materialMovementSchema = z.object({
  tag: z.string().trim().toUpperCase().min(3, 'Scan or type the bar tag').max(40),
  lengthMm: decimal('A length in mm, e.g. 1200'),
});
export type MaterialMovementInput = z.input<typeof materialMovementSchema>;

export const operationInputSchema = z
  .object({
    stepNo: z.number().int().min(1),
    operatorName: text(2, 200, 'Who did the work?'),
    workCentre: text(1, 60, 'Name the work centre'),
    programRevision: z.string().trim().max(60).nullable().default(null),
    startedAt: instant,
    endedAt: instant,
    qtyIn: count('Quantity in'),
    qtyGood: count('Good quantity'),
    qtyScrap: count('Scrap quantity'),
    scrapReasons: z
      .array(z.object({ reason: text(2, 200, 'Say why the units were scrapped'), qty: z.number().int().min(1) }))
      .max(20)
      .default([]),
    inspected: z.number().int().min(0).nullable().default(null),
    defectsFound: z.number().int().min(0).nullable().default(null),
    notes: z.string().trim().max(4000).nullable().default(null),
  })
  .superRefine((operation, context) => {
    if (Date.parse(operation.endedAt) < Date.parse(operation.startedAt))
      context.addIssue({ code: 'custom', message: 'The end is before the start', path: ['endedAt'] });
    if (operation.qtyIn !== operation.qtyGood + operation.qtyScrap)
      context.addIssue({
        code: 'custom',
        message: `Good + scrap must equal the ${operation.qtyIn} units in`,
        path: ['qtyGood'],
      });
    const reasoned = operation.scrapReasons.reduce((sum, reason) => sum + reason.qty, 0);
    if (reasoned !== operation.qtyScrap)
      context.addIssue({
        code: 'custom',
        message: `Give reasons for all ${operation.qtyScrap} scrapped units (${reasoned} explained)`,
        path: ['scrapReasons'],
      });
  });
export type OperationInput = z.input<typeof operationInputSchema>;

export const splitInputSchema = z.object({
  quantities: z.array(z.number().int().min(1, 'Each new lot gets at least one unit')).min(1).max(20),
  reason: text(3, 1000, 'Say why the lot is split'),
});
export type SplitInput = z.input<typeof splitInputSchema>;
export const mergeInputSchema = z.object({
  lotIds: z.array(z.number().int().positive()).min(2, 'Choose at least two lots').max(20),
  reason: text(3, 1000, 'Say why the lots are merged'),
});
export type MergeInput = z.input<typeof mergeInputSchema>;

export const processRunInputSchema = z.object({
  kind: z.enum(['passivation', 'cleaning']),
  methodId: z.string().trim().min(1, 'Choose the method'),
  equipment: text(1, 60, 'Name the line or tank'),
  operatorName: text(2, 200, 'Who ran it?'),
  runAt: instant,
  parameters: z.record(
    z.string().max(40),
    z.union([z.string(), z.number()]).transform((value) => String(value).trim()),
  ),
  lotIds: z.array(z.number().int().positive()).min(1, 'A run holds at least one lot').max(200),
});
export type ProcessRunInput = z.input<typeof processRunInputSchema>;
export const processRunListQuerySchema = z.object({
  kind: z.enum(['passivation', 'cleaning']).optional(),
  inWindow: z.enum(['true', 'false']).optional(),
  search: z.string().trim().max(30).optional(),
  ...page,
});
export type ProcessRunListQuery = z.infer<typeof processRunListQuerySchema>;

export const nonconformanceInputSchema = z.object({
  subjectType: z.enum(nonconformanceSubjects),
  subjectId: z.number().int().positive('Choose what the nonconformance is about'),
  description: text(5, 4000, 'Describe what is wrong (at least 5 characters)'),
  containment: text(3, 4000, 'Say what was done to contain it'),
});
export type NonconformanceInput = z.input<typeof nonconformanceInputSchema>;
export const dispositionInputSchema = z.object({
  disposition: z.enum(dispositions),
  note: text(3, 4000, 'Explain the disposition'),
});
export type DispositionInput = z.input<typeof dispositionInputSchema>;
export const nonconformanceListQuerySchema = z.object({
  status: z.enum(['open', 'dispositioned', 'closed']).optional(),
  subjectType: z.enum(nonconformanceSubjects).optional(),
  lotId: z.coerce.number().int().positive().optional(),
  ...page,
});
export type NonconformanceListQuery = z.infer<typeof nonconformanceListQuerySchema>;

export const consigneeInputSchema = z.object({
  name: text(2, 200, 'Name the consignee'),
  kind: z.enum(consigneeKinds),
  country: text(2, 80, 'Give the country'),
  contactEmail: z.email('An e-mail address').nullable().default(null),
});
export type ConsigneeInput = z.input<typeof consigneeInputSchema>;
/** Where a consignee's recall notices go; null when none is on record. */
export const consigneeContactInputSchema = z.object({
  contactEmail: z.email('An e-mail address').nullable(),
});
export type ConsigneeContactInput = z.input<typeof consigneeContactInputSchema>;
export const shipmentInputSchema = z.object({
  consigneeId: z.number().int().positive('Choose the consignee'),
  qty: z.number().int().min(1, 'Ship at least one unit'),
  shippedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD'),
  documentNumber: text(2, 40, 'Give the shipping document number'),
});
export type ShipmentInput = z.input<typeof shipmentInputSchema>;
