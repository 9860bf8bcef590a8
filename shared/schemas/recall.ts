import { z } from 'zod';
import type { SnapshotDiff } from '../domain/recall/snapshot-diff';
import type { DrillAssessment } from '../domain/recall/drill-report';
import { pageOf } from './page';
import { effectivenessSchema } from './field-action';
import { forwardQuerySchema, forwardTraceSchema, traceConsigneeSchema, tracedLotSchema } from './trace';

export const recallModes = ['recall', 'drill'] as const;
export type RecallMode = (typeof recallModes)[number];

export const openRecallInputSchema = z.object({
  trigger: forwardQuerySchema,
  mode: z.enum(recallModes, { error: 'Choose a recall or a drill' }),
  reason: z.string().trim().min(10, 'Say in a sentence why the investigation is opened').max(2000),
});
export type OpenRecallInput = z.infer<typeof openRecallInputSchema>;

export const recallListQuerySchema = z.object({
  status: z.enum(['open', 'closed']).optional(),
  mode: z.enum(recallModes).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
export type RecallListQuery = z.infer<typeof recallListQuerySchema>;

export const drillReportFormatSchema = z.object({
  format: z.enum(['json', 'csv', 'pdf'], { error: 'Ask for json, csv or pdf' }).default('json'),
});

export const exportFormatSchema = z.object({
  format: z.enum(['csv', 'pdf'], { error: 'Export as csv or pdf' }),
  snapshot: z.coerce.number().int().positive().max(4_294_967_295).optional(),
});

export const recallSummarySchema = z.object({
  id: z.number(),
  recallNumber: z.string(),
  mode: z.enum(recallModes),
  status: z.enum(['open', 'closed']),
  triggerLabel: z.string(),
  reason: z.string(),
  openedBy: z.string(),
  openedAt: z.string(),
  closedAt: z.string().nullable(),
  affectedLots: z.number(),
  activeHolds: z.number(),
});
export type RecallSummary = z.infer<typeof recallSummarySchema>;
export const recallPageSchema = pageOf(recallSummarySchema);

/** What was known and when: the affected set as traced at that moment, with who asked. */
export const recallSnapshotContentSchema = z.object({
  recallNumber: z.string(),
  mode: z.enum(recallModes),
  trigger: forwardQuerySchema,
  takenAt: z.string(),
  takenBy: z.string(),
  /** How long computing the trace took (snapshots from before this was recorded lack it). */
  tracedInMs: z.number().optional(),
  trace: forwardTraceSchema,
});
export type RecallSnapshotContent = z.infer<typeof recallSnapshotContentSchema>;

export const recallSnapshotMetaSchema = z.object({
  id: z.number(),
  kind: z.enum(['opening', 'rerun']),
  takenAt: z.string(),
  takenBy: z.string(),
  sha256: z.string(),
});
export type RecallSnapshotMeta = z.infer<typeof recallSnapshotMetaSchema>;

export const lotHoldViewSchema = z.object({
  id: z.number(),
  lotId: z.number(),
  lotNumber: z.string(),
  lotStatus: z.string(),
  recallId: z.number().nullable(),
  reason: z.string(),
  placedBy: z.string(),
  placedAt: z.string(),
  liftedAt: z.string().nullable(),
  liftedBy: z.string().nullable(),
});
export type LotHoldView = z.infer<typeof lotHoldViewSchema>;

const snapshotLotSchema = z.object({
  id: z.number(),
  lotNumber: z.string(),
  status: z.string(),
  made: z.number().nullable(),
  released: z.number(),
  shipped: z.number(),
  onHand: z.number(),
});
const snapshotConsigneeSchema = z.object({ id: z.number(), name: z.string(), units: z.number(), lots: z.number() });
const fieldChangeSchema = z.object({
  field: z.enum(['status', 'made', 'released', 'shipped', 'onHand', 'units', 'lots']),
  before: z.union([z.string(), z.number()]).nullable(),
  after: z.union([z.string(), z.number()]).nullable(),
});
const snapshotDiffSchema = z.object({
  unchanged: z.boolean(),
  lotsAdded: z.array(snapshotLotSchema),
  lotsRemoved: z.array(snapshotLotSchema),
  lotsChanged: z.array(z.object({ lot: snapshotLotSchema, changes: z.array(fieldChangeSchema) })),
  consigneesAdded: z.array(snapshotConsigneeSchema),
  consigneesRemoved: z.array(snapshotConsigneeSchema),
  consigneesChanged: z.array(z.object({ consignee: snapshotConsigneeSchema, changes: z.array(fieldChangeSchema) })),
}) satisfies z.ZodType<SnapshotDiff>;

export const recallDetailSchema = recallSummarySchema.extend({
  trigger: forwardQuerySchema,
  opening: recallSnapshotMetaSchema.extend({ content: recallSnapshotContentSchema }),
  reruns: z.array(recallSnapshotMetaSchema),
  /** The latest re-run against the opening snapshot, if the trace was re-run. */
  latest: z.object({ snapshot: recallSnapshotMetaSchema, diff: snapshotDiffSchema }).nullable(),
  holds: z.array(lotHoldViewSchema),
});
export type RecallDetail = z.infer<typeof recallDetailSchema>;

export const recallRerunSchema = z.object({
  snapshot: recallSnapshotMetaSchema,
  diff: snapshotDiffSchema,
  heldNow: z.array(z.string()),
});
export type RecallRerun = z.infer<typeof recallRerunSchema>;

const drillAssessmentSchema = z.object({
  timing: z.object({
    toFirstScopeMs: z.number(),
    tracedInMs: z.number().nullable(),
    toConfirmedScopeMs: z.number().nullable(),
    elapsedMs: z.number(),
    reruns: z.number(),
    scopeChanged: z.boolean(),
  }),
  totals: z.object({
    lots: z.number(),
    made: z.number(),
    released: z.number(),
    shipped: z.number(),
    onHand: z.number(),
    consignees: z.number(),
  }),
  checks: z.array(
    z.object({
      id: z.enum(['shipped-units', 'unit-balance', 'genealogy', 'scope-closed', 'scope-current']),
      label: z.string(),
      passed: z.boolean(),
      detail: z.string(),
      offenders: z.array(z.string()),
    }),
  ),
  complete: z.boolean(),
}) satisfies z.ZodType<DrillAssessment>;

/** A drill's report: its timing, the scope it last traced, and whether that scope can be trusted. */
export const drillReportSchema = z.object({
  drill: z.object({
    id: z.number(),
    recallNumber: z.string(),
    status: z.enum(['open', 'closed']),
    trigger: z.string(),
    reason: z.string(),
    openedBy: z.string(),
    openedAt: z.string(),
    closedAt: z.string().nullable(),
  }),
  scope: z.object({
    snapshot: recallSnapshotMetaSchema,
    lotsAddedSinceOpening: z.array(z.string()),
    lotsRemovedSinceOpening: z.array(z.string()),
  }),
  assessment: drillAssessmentSchema,
  /** The field action's figures, when the drill exercises consignee notices. */
  effectiveness: effectivenessSchema.nullable(),
  lots: z.array(tracedLotSchema.extend({ heats: z.array(z.string()) })),
  consignees: z.array(traceConsigneeSchema),
  madeAt: z.string(),
});
export type DrillReport = z.infer<typeof drillReportSchema>;
