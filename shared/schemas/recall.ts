import { z } from 'zod';
import type { SnapshotDiff } from '../domain/recall/snapshot-diff';
import type { DrillAssessment } from '../domain/recall/drill-report';
import { forwardQuerySchema, type ForwardTrace, type TracedLot } from './trace';

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

export interface RecallSummary {
  id: number;
  recallNumber: string;
  mode: RecallMode;
  status: 'open' | 'closed';
  triggerLabel: string;
  reason: string;
  openedBy: string;
  openedAt: string;
  closedAt: string | null;
  affectedLots: number;
  activeHolds: number;
}

/** What was known and when: the affected set as traced at that moment, with who asked. */
export interface RecallSnapshotContent {
  recallNumber: string;
  mode: RecallMode;
  trigger: z.infer<typeof forwardQuerySchema>;
  takenAt: string;
  takenBy: string;
  /** How long computing the trace took (snapshots from before this was recorded lack it). */
  tracedInMs?: number;
  trace: ForwardTrace;
}

export interface RecallSnapshotMeta {
  id: number;
  kind: 'opening' | 'rerun';
  takenAt: string;
  takenBy: string;
  sha256: string;
}

export interface LotHoldView {
  id: number;
  lotId: number;
  lotNumber: string;
  lotStatus: string;
  recallId: number | null;
  reason: string;
  placedBy: string;
  placedAt: string;
  liftedAt: string | null;
  liftedBy: string | null;
}

export interface RecallDetail extends RecallSummary {
  trigger: z.infer<typeof forwardQuerySchema>;
  opening: RecallSnapshotMeta & { content: RecallSnapshotContent };
  reruns: RecallSnapshotMeta[];
  /** The latest re-run against the opening snapshot, if the trace was re-run. */
  latest: { snapshot: RecallSnapshotMeta; diff: SnapshotDiff } | null;
  holds: LotHoldView[];
}

export interface RecallRerun {
  snapshot: RecallSnapshotMeta;
  diff: SnapshotDiff;
  heldNow: string[];
}

/** A drill's report: its timing, the scope it last traced, and whether that scope can be trusted. */
export interface DrillReport {
  drill: {
    id: number;
    recallNumber: string;
    status: 'open' | 'closed';
    trigger: string;
    reason: string;
    openedBy: string;
    openedAt: string;
    closedAt: string | null;
  };
  scope: { snapshot: RecallSnapshotMeta; lotsAddedSinceOpening: string[]; lotsRemovedSinceOpening: string[] };
  assessment: DrillAssessment;
  lots: Array<TracedLot & { heats: string[] }>;
  consignees: ForwardTrace['consignees'];
  madeAt: string;
}
