import { z } from 'zod';

export const labelMovementSchema = z
  .object({
    kind: z.enum(['print', 'void']),
    qty: z
      .number({ error: 'A whole number of labels' })
      .int('A whole number of labels')
      .min(1, 'At least one label')
      .max(100_000),
    reason: z.string().trim().max(500).optional(),
  })
  .superRefine((movement, context) => {
    if (movement.kind === 'void' && (!movement.reason || movement.reason.length < 3))
      context.addIssue({ code: 'custom', message: 'Say why the labels are voided', path: ['reason'] });
  });
export type LabelMovement = z.input<typeof labelMovementSchema>;

export const releaseQueues = ['review', 'approval', 'released', 'returned'] as const;
export const releaseQueueQuerySchema = z.object({
  queue: z.enum(releaseQueues),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type ReleaseQueueQuery = z.infer<typeof releaseQueueQuerySchema>;

export const releaseQueueItemSchema = z.object({
  lotId: z.number(),
  lotNumber: z.string(),
  part: z.string(),
  releasedQty: z.number(),
  submittedAt: z.string().nullable(),
  submittedBy: z.string().nullable(),
  /** The latest "reviewed" signature on the lot's release: who reviewed it, and when. */
  reviewedBy: z.string().nullable(),
  reviewedAt: z.string().nullable(),
});
export type ReleaseQueueItem = z.infer<typeof releaseQueueItemSchema>;
export const releaseQueuePageSchema = z.object({
  items: z.array(releaseQueueItemSchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
  /** How many lots wait in each queue, for the tabs. */
  counts: z.object({ review: z.number(), approval: z.number(), returned: z.number(), released: z.number() }),
});
export type ReleaseQueuePage = z.infer<typeof releaseQueuePageSchema>;

export const labelSheetQuerySchema = z.object({
  count: z.coerce.number().int().min(1, 'At least one label').max(2_000, 'At most 2,000 labels at once'),
  widthMm: z.coerce.number().min(30, 'At least 30 mm wide').max(210).default(100),
  heightMm: z.coerce.number().min(20, 'At least 20 mm high').max(297).default(50),
});
export type LabelSheetQuery = z.infer<typeof labelSheetQuerySchema>;

/** A ledger event on a lot (or a lot its units came through), as the release review shows it. */
export interface TrailEvent {
  seq: number;
  occurredAt: string;
  actor: string;
  action: string;
  lot: string;
  reason: string | null;
}

/** A lot's audit trail since it was opened, and how far the latest release review covered it. */
export interface AuditTrail {
  events: TrailEvent[];
  /** The last event the latest review covered, or null before any review. */
  reviewedThroughSeq: number | null;
  /** Events after that review (which void it). */
  afterReview: TrailEvent[];
}
