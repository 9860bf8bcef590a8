import { z } from 'zod';
import type { MaterialReconciliation } from '../domain/manufacturing/material-reconciliation';
import type { UnitChain } from '../domain/manufacturing/unit-chain';
import type { WindowCheck } from '../domain/manufacturing/run-window';
import { lotSummarySchema, partSchema } from './manufacturing';

// What the lot page shows: the whole device history record of one lot, and the records around it.

export const materialMovementRecordSchema = z.object({
  id: z.number(),
  kind: z.enum(['issue', 'return']),
  tag: z.string(),
  barPieceId: z.number(),
  heat: z.object({
    id: z.number(),
    heatNumber: z.string(),
    status: z.string(),
    supplier: z.string(),
    specId: z.string(),
  }),
  lengthMm: z.string(),
  recordedAt: z.string(),
  recordedBy: z.string(),
});
export type MaterialMovement = z.infer<typeof materialMovementRecordSchema>;

export const operationRecordSchema = z.object({
  id: z.number(),
  stepNo: z.number(),
  stepName: z.string(),
  kind: z.string(),
  operatorName: z.string(),
  workCentre: z.string(),
  programRevision: z.string().nullable(),
  startedAt: z.string(),
  endedAt: z.string(),
  qtyIn: z.number(),
  qtyGood: z.number(),
  qtyScrap: z.number(),
  scrapReasons: z.array(z.object({ reason: z.string(), qty: z.number() })),
  sampleSize: z.number().nullable(),
  defectsFound: z.number().nullable(),
  verdict: z.enum(['accept', 'reject']).nullable(),
  processRun: z.object({ id: z.number(), runNumber: z.string(), inWindow: z.boolean() }).nullable(),
  notes: z.string().nullable(),
  files: z.array(z.object({ documentId: z.number(), name: z.string(), sha256: z.string() })),
  recordedBy: z.string(),
  recordedAt: z.string(),
});
export type OperationRecord = z.infer<typeof operationRecordSchema>;

export const nonconformanceSummarySchema = z.object({
  id: z.number(),
  ncNumber: z.string(),
  subjectType: z.enum(['heat', 'bar-piece', 'lot', 'process-run']),
  subjectId: z.number(),
  subjectLabel: z.string(),
  lotNumber: z.string().nullable(),
  runNumber: z.string().nullable(),
  source: z.enum(['raised', 'run-window']),
  description: z.string(),
  containment: z.string(),
  status: z.enum(['open', 'dispositioned', 'closed']),
  disposition: z.enum(['use-as-is', 'rework', 'scrap', 'return-to-supplier']).nullable(),
  dispositionNote: z.string().nullable(),
  raisedBy: z.string(),
  raisedAt: z.string(),
});
export type NonconformanceSummary = z.infer<typeof nonconformanceSummarySchema>;

const lotLinkSchema = z.object({
  lotId: z.number(),
  lotNumber: z.string(),
  kind: z.enum(['split', 'merge']),
  qty: z.number(),
  afterStep: z.number(),
});
export type LotLink = z.infer<typeof lotLinkSchema>;

const shipmentRecordSchema = z.object({
  id: z.number(),
  consignee: z.object({ id: z.number(), name: z.string(), kind: z.string(), country: z.string() }),
  qty: z.number(),
  shippedOn: z.string(),
  documentNumber: z.string(),
  recordedBy: z.string(),
});
export type ShipmentRecord = z.infer<typeof shipmentRecordSchema>;

const timelineEntrySchema = z.object({
  at: z.string(),
  kind: z.enum(['opened', 'material', 'operation', 'run', 'nonconformance', 'split', 'merge', 'shipment', 'signature']),
  title: z.string(),
  detail: z.string(),
  by: z.string(),
  link: z.string().nullable(),
});
export type TimelineEntry = z.infer<typeof timelineEntrySchema>;

const unitChainSchema = z.object({
  consistent: z.boolean(),
  started: z.number().nullable(),
  scrapped: z.number(),
  movedOut: z.number(),
  onHand: z.number(),
  items: z.array(
    z.object({
      stepNo: z.number(),
      name: z.string(),
      expectedIn: z.number().nullable(),
      qtyIn: z.number(),
      verdict: z.enum(['consistent', 'discrepancy']),
      why: z.string().nullable(),
    }),
  ),
}) satisfies z.ZodType<UnitChain>;

const materialReconciliationSchema = z.object({
  verdict: z.enum(['reconciled', 'discrepancy', 'not-started']),
  consumedMm: z.string(),
  expectedMm: z.string(),
  differenceMm: z.string(),
  differencePct: z.string().nullable(),
  why: z.string(),
}) satisfies z.ZodType<MaterialReconciliation>;

export const lotDetailSchema = lotSummarySchema.extend({
  partRecord: partSchema,
  startQty: z.number().nullable(),
  resumesAfterStep: z.number(),
  releasedQty: z.number(),
  material: z.array(materialMovementRecordSchema),
  operations: z.array(operationRecordSchema),
  nextRoutingStep: z.object({ stepNo: z.number(), name: z.string(), kind: z.string() }).nullable(),
  parents: z.array(lotLinkSchema),
  children: z.array(lotLinkSchema),
  nonconformances: z.array(nonconformanceSummarySchema),
  shipments: z.array(shipmentRecordSchema),
  unitChain: unitChainSchema,
  materialReconciliation: materialReconciliationSchema.nullable(),
  timeline: z.array(timelineEntrySchema),
  /** Holds not yet lifted: the lot can be neither released, shipped, split nor merged. */
  holds: z.array(z.object({ id: z.number(), lotId: z.number(), lotNumber: z.string(), reference: z.string() })),
});
export type LotDetail = z.infer<typeof lotDetailSchema>;

export const processRunSummarySchema = z.object({
  id: z.number(),
  runNumber: z.string(),
  kind: z.enum(['passivation', 'cleaning']),
  methodId: z.string(),
  methodTitle: z.string(),
  equipment: z.string(),
  operatorName: z.string(),
  runAt: z.string(),
  inWindow: z.boolean(),
  lots: z.number(),
  recordedBy: z.string(),
});
export type ProcessRunSummary = z.infer<typeof processRunSummarySchema>;

const windowCheckSchema = z.object({
  inWindow: z.boolean(),
  items: z.array(
    z.object({
      key: z.string(),
      label: z.string(),
      value: z.string(),
      window: z.string(),
      verdict: z.enum(['in-window', 'out-of-window', 'recorded']),
      why: z.string().nullable(),
    }),
  ),
  missing: z.array(z.string()),
  pairing: z.string().nullable().optional(),
}) satisfies z.ZodType<WindowCheck>;

export const processRunDetailSchema = processRunSummarySchema.extend({
  parameters: z.record(z.string(), z.string()),
  windowCheck: windowCheckSchema,
  lotsInRun: z.array(z.object({ lotId: z.number(), lotNumber: z.string(), partNumber: z.string(), qty: z.number() })),
  nonconformances: z.array(nonconformanceSummarySchema),
});
export type ProcessRunDetail = z.infer<typeof processRunDetailSchema>;
